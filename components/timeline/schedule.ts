/**
 * The note scheduler's pure part: which notes to hand to the synthesiser for a stretch of the
 * recording's time, and which are already sounding where playback starts. All times are
 * positions in the recording (s); the player turns them into AudioContext times.
 */
import type { NoteEvent } from "@/lib/music/note";
import type { LoopRegion } from "./time-view";

export type PlayNote = NoteEvent;

/** A note to start at `startSec` (recording time) for `durationSec`. */
export type NoteStart = { note: PlayNote; startSec: number; durationSec: number };

/** Shorter remainders than this (s) are not started after a seek: they would only click. */
export const MIN_REMAINDER_SEC = 0.03;

/** A copy sorted by onset (stable for equal onsets). */
export function sortByOnset<N extends PlayNote>(notes: readonly N[]): N[] {
  return notes.map((n, i) => [n, i] as const).sort((a, b) => a[0].onsetSec - b[0].onsetSec || a[1] - b[1]).map(([n]) => n);
}

/** Index of the first note (sorted by onset) whose onset is at or after `sec`. */
export function firstOnsetAtOrAfter(sorted: readonly PlayNote[], sec: number): number {
  let lo = 0;
  let hi = sorted.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (sorted[mid]!.onsetSec < sec) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/**
 * The notes whose onset lies in [fromSec, toSec): the lookahead window of one scheduler tick.
 * Each ends at its offset or at `cutSec` (the loop's end), whichever comes first.
 */
export function notesStartingIn(sorted: readonly PlayNote[], fromSec: number, toSec: number, cutSec = Infinity): NoteStart[] {
  const out: NoteStart[] = [];
  for (let i = firstOnsetAtOrAfter(sorted, fromSec); i < sorted.length; i++) {
    const note = sorted[i]!;
    if (note.onsetSec >= toSec) break;
    const end = Math.min(note.offsetSec, cutSec);
    if (end - note.onsetSec <= 0) continue;
    out.push({ note, startSec: note.onsetSec, durationSec: end - note.onsetSec });
  }
  return out;
}

/**
 * The notes sounding at `sec` (onset ≤ sec < offset), started at `sec` for the rest of their
 * length: what playback from the middle of a chord (a seek, a loop's start) has to start at once.
 * Notes with their onset exactly at `sec` are included; `notesStartingIn(…, sec + ε, …)` then
 * leaves them out.
 */
export function notesSoundingAt(sorted: readonly PlayNote[], sec: number, cutSec = Infinity): NoteStart[] {
  const out: NoteStart[] = [];
  for (const note of sorted) {
    if (note.onsetSec > sec) break; // sorted by onset: none further on has started
    const stop = Math.min(note.offsetSec, cutSec);
    if (stop - sec < MIN_REMAINDER_SEC) continue;
    out.push({ note, startSec: sec, durationSec: stop - sec });
  }
  return out;
}

/**
 * Following a loop: playback is inside it once its position lies between the loop's ends; it
 * stays inside past the end (a tick's overshoot) and must then wrap to the start; a position
 * before the start (a seek) leaves it, and one that never was inside plays on past it.
 */
export function followLoop(wasInside: boolean, positionSec: number, loop: LoopRegion | null): { inside: boolean; wrap: boolean } {
  if (!loop) return { inside: false, wrap: false };
  if (positionSec >= loop.startSec && positionSec < loop.endSec) return { inside: true, wrap: false };
  if (positionSec < loop.startSec) return { inside: false, wrap: false };
  return { inside: wasInside, wrap: wasInside };
}
