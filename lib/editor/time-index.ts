/**
 * Which notes fall inside a time window, without looking at every note: the notes' indices
 * sorted by onset, and the longest note's length, so that a binary search finds the first
 * note that can still be sounding at the window's start. The piano roll builds one per note
 * list (not per frame) and walks only the visible slice when it paints.
 */
import { lowerBound, upperBound } from "./diff";

type Timed = { onsetSec: number; offsetSec: number };

export type TimeIndex = {
  /** Indices into the list, by onset (ties keep list order). */
  readonly order: Int32Array;
  /** `onsets[k]` = onset of `list[order[k]]`. */
  readonly onsets: Float64Array;
  readonly maxLengthSec: number;
};

export function buildTimeIndex(notes: readonly Timed[]): TimeIndex {
  const order = new Int32Array(notes.length);
  for (let i = 0; i < notes.length; i++) order[i] = i;
  order.sort((i, j) => notes[i]!.onsetSec - notes[j]!.onsetSec || i - j);
  const onsets = new Float64Array(notes.length);
  let maxLengthSec = 0;
  for (let k = 0; k < order.length; k++) {
    const n = notes[order[k]!]!;
    onsets[k] = n.onsetSec;
    maxLengthSec = Math.max(maxLengthSec, n.offsetSec - n.onsetSec);
  }
  return { order, onsets, maxLengthSec };
}

/**
 * The slice [from, to) of `index.order` whose notes may overlap t0Sec…t1Sec: every note that
 * overlaps is inside it; a note inside it that ends before t0Sec is skipped by the caller
 * (one comparison).
 */
export function visibleSlice(index: TimeIndex, t0Sec: number, t1Sec: number): { from: number; to: number } {
  const from = lowerBound(index.onsets, t0Sec - index.maxLengthSec);
  const to = upperBound(index.onsets, t1Sec);
  return { from, to: Math.max(from, to) };
}

/** Indices (into the list) of the notes overlapping t0Sec…t1Sec, in onset order. */
export function visibleNotes(notes: readonly Timed[], index: TimeIndex, t0Sec: number, t1Sec: number): number[] {
  const { from, to } = visibleSlice(index, t0Sec, t1Sec);
  const out: number[] = [];
  for (let k = from; k < to; k++) {
    const i = index.order[k]!;
    if (notes[i]!.offsetSec >= t0Sec) out.push(i);
  }
  return out;
}

/**
 * Notes sounding at `atSec` (the tuning report's jump links): onset at most `leadSec` after it
 * (a link may point just before the attack) and offset after it.
 */
export function soundingAt<T extends Timed>(notes: readonly T[], atSec: number, leadSec = 0.05): T[] {
  return notes.filter((n) => n.onsetSec - leadSec <= atSec && atSec < n.offsetSec);
}
