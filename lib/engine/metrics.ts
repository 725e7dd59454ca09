/**
 * Note-level transcription metrics by the MIREX definitions (as in mir_eval.transcription):
 * a reference and an estimated note match when the onsets differ by ≤ onsetTolSec, the
 * pitches by ≤ pitchTolCents and, when offsetRatio is given, the offsets by
 * ≤ max(offsetRatio × reference length, offsetMinTolSec). Matching is one-to-one, the maximum
 * bipartite matching (augmenting paths; Kuhn 1955 / Hopcroft–Karp). P = matched/est,
 * R = matched/ref, F1 = 2PR/(P+R).
 */
export interface ScoredNote {
  onsetSec: number;
  offsetSec: number;
  /** Sounding pitch in fractional MIDI numbers (pitch + cents/100). */
  midi: number;
}

export interface NoteMetricOptions {
  onsetTolSec?: number;
  pitchTolCents?: number;
  /** null: onsets only. */
  offsetRatio?: number | null;
  offsetMinTolSec?: number;
}

export interface NoteMetrics {
  precision: number;
  recall: number;
  f1: number;
  /** Matched pairs [refIndex, estIndex]. */
  matches: Array<[number, number]>;
}

export function noteMetrics(ref: ScoredNote[], est: ScoredNote[], opts: NoteMetricOptions = {}): NoteMetrics {
  const onTol = opts.onsetTolSec ?? 0.05;
  const pTol = opts.pitchTolCents ?? 50;
  const ratio = opts.offsetRatio ?? null;
  const offMin = opts.offsetMinTolSec ?? 0.05;
  const eps = 1e-9; // mir_eval compares rounded distances; allow the same float slack
  const adj: number[][] = ref.map((r) => {
    const list: number[] = [];
    est.forEach((e, j) => {
      if (Math.abs(e.onsetSec - r.onsetSec) > onTol + eps) return;
      if (Math.abs(e.midi - r.midi) * 100 > pTol + eps) return;
      if (ratio !== null) {
        const tol = Math.max(ratio * (r.offsetSec - r.onsetSec), offMin);
        if (Math.abs(e.offsetSec - r.offsetSec) > tol + eps) return;
      }
      list.push(j);
    });
    return list;
  });
  const estMatch = new Int32Array(est.length).fill(-1);
  const tryAugment = (i: number, seen: Uint8Array): boolean => {
    for (const j of adj[i]) {
      if (seen[j]) continue;
      seen[j] = 1;
      if (estMatch[j] < 0 || tryAugment(estMatch[j], seen)) {
        estMatch[j] = i;
        return true;
      }
    }
    return false;
  };
  for (let i = 0; i < ref.length; i++) tryAugment(i, new Uint8Array(est.length));
  const matches: Array<[number, number]> = [];
  estMatch.forEach((i, j) => {
    if (i >= 0) matches.push([i, j]);
  });
  matches.sort((a, b) => a[0] - b[0]);
  const precision = est.length ? matches.length / est.length : 0;
  const recall = ref.length ? matches.length / ref.length : 0;
  const f1 = precision + recall > 0 ? (2 * precision * recall) / (precision + recall) : 0;
  return { precision, recall, f1, matches };
}
