/**
 * The inspector's view of the selection: one value when every selected note agrees, else the
 * range (lowest … highest). Pure, so the inspector and its tests share it.
 */
import type { Selection } from "./selection";
import type { EditorNote, NoteList } from "./types";

export type Range = { min: number; max: number };
export type SelectionSummary = {
  count: number;
  pitch: Range;
  onsetSec: Range;
  lengthSec: Range;
  velocity: Range;
  cents: Range;
  voices: number[];
};

const grow = (r: Range, x: number) => {
  if (x < r.min) r.min = x;
  if (x > r.max) r.max = x;
};
const empty = (): Range => ({ min: Infinity, max: -Infinity });

/** Summary of the selected notes; null when none is selected. */
export function summarise(notes: NoteList, selection: Selection): SelectionSummary | null {
  if (selection.size === 0) return null;
  const s = { count: 0, pitch: empty(), onsetSec: empty(), lengthSec: empty(), velocity: empty(), cents: empty() };
  const voices = new Set<number>();
  for (const n of notes) {
    if (!selection.has(n.id)) continue;
    s.count++;
    grow(s.pitch, n.pitch);
    grow(s.onsetSec, n.onsetSec);
    grow(s.lengthSec, n.offsetSec - n.onsetSec);
    grow(s.velocity, n.velocity);
    grow(s.cents, n.cents);
    voices.add(n.voice);
  }
  if (s.count === 0) return null;
  return { ...s, voices: [...voices].sort((a, b) => a - b) };
}

export function isSingle(r: Range, tolerance = 0): boolean {
  return r.max - r.min <= tolerance;
}

/** The selected notes themselves, in time order. */
export function selectedNotes(notes: NoteList, selection: Selection): EditorNote[] {
  return notes.filter((n) => selection.has(n.id)).sort((a, b) => a.onsetSec - b.onsetSec || a.pitch - b.pitch);
}
