/**
 * What differs between two note lists (two revisions, or mine and theirs in a conflict).
 * Revisions come without the editor's ids, so notes are matched by content: first the notes
 * that are exactly alike (to 0.1 ms and 0.1 cent), then, among the rest, a note of the same
 * voice that overlaps in time (or starts within `nearSec`) counts as the same note changed —
 * moved, stretched, transposed or re-voiced in velocity or cents. Whatever is left was removed
 * (only in `a`) or added (only in `b`).
 */
import type { NoteEvent } from "../music/note";
export type DiffNote = NoteEvent;

export type NoteDiff = {
  /** Indices into `b` of notes only in `b`. */
  added: number[];
  /** Indices into `a` of notes only in `a`. */
  removed: number[];
  /** Pairs of indices (into `a`, into `b`) of the same note, changed. */
  changed: { a: number; b: number }[];
  unchanged: number;
};

/** How far apart (s) two onsets may be for two notes that do not overlap to count as one note moved. */
export const DIFF_NEAR_SEC = 0.25;

function key(n: DiffNote): string {
  return `${Math.round(n.onsetSec * 1e4)}|${Math.round(n.offsetSec * 1e4)}|${n.pitch}|${n.voice}|${n.velocity}|${Math.round(n.cents * 10)}`;
}

export function diffNotes(a: readonly DiffNote[], b: readonly DiffNote[], nearSec = DIFF_NEAR_SEC): NoteDiff {
  const byKey = new Map<string, number[]>();
  a.forEach((n, i) => {
    const k = key(n);
    const list = byKey.get(k);
    if (list) list.push(i);
    else byKey.set(k, [i]);
  });
  let unchanged = 0;
  const restB: number[] = [];
  b.forEach((n, j) => {
    const list = byKey.get(key(n));
    if (list && list.length) {
      list.pop();
      unchanged++;
    } else restB.push(j);
  });
  const restA: number[] = [];
  for (const list of byKey.values()) restA.push(...list);
  restA.sort((i, j) => a[i]!.onsetSec - a[j]!.onsetSec || i - j);
  const onsetsA = restA.map((i) => a[i]!.onsetSec);
  const maxLenA = restA.reduce((m, i) => Math.max(m, a[i]!.offsetSec - a[i]!.onsetSec), 0);
  const usedA = new Uint8Array(restA.length);

  const changed: { a: number; b: number }[] = [];
  const added: number[] = [];
  restB.sort((i, j) => b[i]!.onsetSec - b[j]!.onsetSec || i - j);
  for (const j of restB) {
    const nb = b[j]!;
    // candidates: onsets from (nb.onset − longest note − near) to (nb.offset + near)
    let k = lowerBound(onsetsA, nb.onsetSec - maxLenA - nearSec);
    let best = -1;
    let bestScore = -Infinity;
    for (; k < restA.length && onsetsA[k]! <= nb.offsetSec + nearSec; k++) {
      if (usedA[k]) continue;
      const na = a[restA[k]!]!;
      if (na.voice !== nb.voice) continue;
      const overlap = Math.min(na.offsetSec, nb.offsetSec) - Math.max(na.onsetSec, nb.onsetSec);
      const onsetGap = Math.abs(na.onsetSec - nb.onsetSec);
      if (overlap <= 0 && onsetGap > nearSec) continue;
      // prefer the same pitch, then the nearest onset, then the largest overlap
      const score = -Math.abs(na.pitch - nb.pitch) * 10 - onsetGap + Math.max(0, overlap) * 0.1;
      if (score > bestScore) {
        bestScore = score;
        best = k;
      }
    }
    if (best >= 0) {
      usedA[best] = 1;
      changed.push({ a: restA[best]!, b: j });
    } else added.push(j);
  }
  const removed = restA.filter((_, k) => !usedA[k]).sort((x, y) => x - y);
  added.sort((x, y) => x - y);
  changed.sort((x, y) => x.b - y.b);
  return { added, removed, changed, unchanged };
}

/** True when the two lists hold the same notes (in any order). */
export function sameNotes(a: readonly DiffNote[], b: readonly DiffNote[]): boolean {
  if (a.length !== b.length) return false;
  const d = diffNotes(a, b);
  return d.added.length === 0 && d.removed.length === 0 && d.changed.length === 0;
}

/** First index whose value is ≥ x in an ascending array. */
export function lowerBound(sorted: ArrayLike<number>, x: number): number {
  let lo = 0;
  let hi = sorted.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (sorted[mid]! < x) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** First index whose value is > x in an ascending array. */
export function upperBound(sorted: ArrayLike<number>, x: number): number {
  let lo = 0;
  let hi = sorted.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (sorted[mid]! <= x) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}
