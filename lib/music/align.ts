/**
 * Alignment of a take's notes to an assignment's expected notes (pure), tolerant to a
 * different tempo and a different starting point, and the per-note results
 * `matched`, `missed`, `extra`, `off-pitch` with a score.
 *
 * Method (docs/intonation.md):
 *  1. Features: both note lists become frames of `hopSec` (50 ms) with a 24-dimensional
 *     feature — a 12-d chroma of the sounding notes plus a 12-d chroma of note onsets (weight
 *     1.5 in the onset's frame, 0.75 in the next), so that a repeated chord is not one long
 *     chord. Chroma features from a symbolic score follow Müller, "Fundamentals of Music
 *     Processing" (2nd ed. 2021), ch. 3.1; the onset half is a simplified form of the
 *     onset-chroma features of Ewert, Müller & Grosche (ICASSP 2009).
 *  2. Local cost: cosine distance 1 − ⟨x, y⟩ / (‖x‖‖y‖) (0 between two silent frames, 1 between
 *     a silent and a sounding one).
 *  3. Subsequence dynamic time warping (Müller 2021 ch. 3.2 for DTW, ch. 7.2.3 for subsequence
 *     DTW): the assignment (trimmed to its first onset … last offset) is the query and must be
 *     warped whole; it may start and end anywhere in the take, so silence, talking or a
 *     warm-up before or after the exercise costs nothing. Steps (1,0), (0,1), (1,1) with the
 *     symmetric weights 1, 1, 2 of Sakoe & Chiba (IEEE TASSP 26(1), 1978); the end is the one
 *     with the least accumulated cost per unit of path weight (query length + take span).
 *  4. Notes: each played onset is mapped into assignment time through the warping path; a
 *     played and an expected note of the same pitch within `onsetToleranceSec` (0.15 s) are
 *     `matched` (one-to-one, closest pairs first); a remaining played note and a remaining
 *     expected note within the tolerance are an `off-pitch` pair; expected notes left over are
 *     `missed`, played notes left over `extra`.
 *  5. Refinement: the matches of a first pass (tolerance max(2 × tolerance, 3 hops)), reduced
 *     to a strictly increasing set (longest increasing subsequence), become the anchors of a
 *     piecewise-linear time map, and step 4 is run again with it. The returned time map is
 *     the anchors (or the DTW path when fewer than two notes matched).
 * Score: matched / expected (recall); also precision = matched / played and the F-measure
 * 2PR / (P + R), as in note-level transcription scoring (REFERENCES.md §5).
 */

export interface AlignNote {
  onsetSec: number;
  offsetSec: number;
  /** MIDI note number. */
  pitch: number;
  voice?: number;
}

export type NoteResult = "matched" | "missed" | "extra" | "off-pitch";

export interface ExpectedNoteResult {
  index: number;
  onsetSec: number;
  offsetSec: number;
  pitch: number;
  voice: number | null;
  result: "matched" | "missed" | "off-pitch";
  /** The played note it was paired with (matched or off-pitch). */
  playedIndex: number | null;
}

export interface PlayedNoteResult {
  index: number;
  onsetSec: number;
  offsetSec: number;
  pitch: number;
  voice: number | null;
  result: "matched" | "extra" | "off-pitch";
  expectedIndex: number | null;
  /** The onset mapped into assignment time. */
  assignmentOnsetSec: number;
}

/** Monotone piecewise-linear map between take time and assignment time (pairs of points). */
export interface TimeMap {
  playedSec: number[];
  assignmentSec: number[];
}

export interface Alignment {
  method: "subsequence-dtw-chroma";
  expected: ExpectedNoteResult[];
  played: PlayedNoteResult[];
  counts: { expected: number; played: number; matched: number; missed: number; extra: number; offPitch: number };
  /** matched / expected (0 … 1); null without expected notes. */
  score: number | null;
  precision: number | null;
  recall: number | null;
  fMeasure: number | null;
  timeMap: TimeMap;
  /** Least-squares slope of played onset over assignment onset of the matched notes: 1.1 = played 10 % slower. */
  tempoRatio: number | null;
  /** Intercept of that fit: played ≈ tempoRatio · assignment + offsetSec. */
  offsetSec: number | null;
  /** Frame hop the DTW used (larger than asked for very long inputs). */
  hopSec: number;
}

export interface AlignOptions {
  /** Feature frame hop. Default 0.05 s. */
  hopSec?: number;
  /** Largest DTW matrix (frames × frames); the hop grows to stay below it. Default 2e7 cells (≈ 20 MB). */
  maxCells?: number;
  /** Largest onset difference, in assignment time, for a pair. Default 0.15 s. */
  onsetToleranceSec?: number;
}

const pcOf = (midi: number) => ((Math.round(midi) % 12) + 12) % 12;
const FEATURE_DIM = 24;
const ONSET_WEIGHT = 1.5;

/**
 * Feature frames of a note list: frame k covers [startSec + k·hopSec, startSec + (k+1)·hopSec);
 * dims 0–11 add 1 per note sounding at the frame centre, dims 12–23 add 1.5 in the frame of a
 * note's onset and 0.75 in the next. Each frame is scaled to unit length (zero stays zero).
 * Shape: frameCount × 24, row-major.
 */
export function noteFeatureFrames(notes: readonly AlignNote[], startSec: number, hopSec: number, frameCount: number): Float32Array {
  const f = new Float32Array(frameCount * FEATURE_DIM);
  for (const n of notes) {
    const pc = pcOf(n.pitch);
    const first = Math.max(0, Math.ceil((n.onsetSec - startSec) / hopSec - 0.5));
    const last = Math.min(frameCount - 1, Math.ceil((n.offsetSec - startSec) / hopSec - 0.5) - 1);
    for (let k = first; k <= last; k++) f[k * FEATURE_DIM + pc] += 1;
    const onsetFrame = Math.floor((n.onsetSec - startSec) / hopSec);
    if (onsetFrame >= 0 && onsetFrame < frameCount) f[onsetFrame * FEATURE_DIM + 12 + pc] += ONSET_WEIGHT;
    if (onsetFrame + 1 >= 0 && onsetFrame + 1 < frameCount) f[(onsetFrame + 1) * FEATURE_DIM + 12 + pc] += ONSET_WEIGHT / 2;
  }
  for (let k = 0; k < frameCount; k++) {
    let s = 0;
    for (let d = 0; d < FEATURE_DIM; d++) s += f[k * FEATURE_DIM + d] ** 2;
    if (s > 0) {
      const inv = 1 / Math.sqrt(s);
      for (let d = 0; d < FEATURE_DIM; d++) f[k * FEATURE_DIM + d] *= inv;
    }
  }
  return f;
}

/**
 * Subsequence DTW of query frames (rows, all used) against database frames (columns, any
 * contiguous span), cosine cost, steps (1,0), (0,1), (1,1) with weights 1, 1, 2.
 * Returns the warping path as [queryFrame, databaseFrame] pairs, start to end.
 */
export function subsequenceDtw(query: Float32Array, database: Float32Array, dim: number = FEATURE_DIM): [number, number][] {
  const n = query.length / dim;
  const m = database.length / dim;
  if (n === 0 || m === 0) return [];
  const qZero = new Uint8Array(n);
  const dZero = new Uint8Array(m);
  for (let i = 0; i < n; i++) qZero[i] = norm0(query, i, dim) ? 1 : 0;
  for (let j = 0; j < m; j++) dZero[j] = norm0(database, j, dim) ? 1 : 0;
  const cost = (i: number, j: number) => {
    if (qZero[i] && dZero[j]) return 0;
    if (qZero[i] || dZero[j]) return 1;
    let dot = 0;
    const qi = i * dim;
    const dj = j * dim;
    for (let d = 0; d < dim; d++) dot += query[qi + d] * database[dj + d];
    return Math.max(0, 1 - dot);
  };
  // 0 = start, 1 = from (i−1, j), 2 = from (i, j−1), 3 = from (i−1, j−1)
  const step = new Uint8Array(n * m);
  let prev = new Float64Array(m);
  let cur = new Float64Array(m);
  let prevStart = new Int32Array(m);
  let curStart = new Int32Array(m);
  for (let j = 0; j < m; j++) {
    prev[j] = cost(0, j);
    prevStart[j] = j;
  }
  for (let i = 1; i < n; i++) {
    for (let j = 0; j < m; j++) {
      const c = cost(i, j);
      let best = prev[j] + c;
      let s = 1;
      let start = prevStart[j];
      if (j > 0) {
        const h = cur[j - 1] + c;
        if (h < best) {
          best = h;
          s = 2;
          start = curStart[j - 1];
        }
        const d = prev[j - 1] + 2 * c;
        if (d <= best) {
          best = d;
          s = 3;
          start = prevStart[j - 1];
        }
      }
      cur[j] = best;
      curStart[j] = start;
      step[i * m + j] = s;
    }
    [prev, cur] = [cur, prev];
    [prevStart, curStart] = [curStart, prevStart];
  }
  // prev now holds the last row
  let endJ = 0;
  let bestNorm = Infinity;
  for (let j = 0; j < m; j++) {
    const norm = prev[j] / (n + (j - prevStart[j] + 1));
    if (norm < bestNorm) {
      bestNorm = norm;
      endJ = j;
    }
  }
  const path: [number, number][] = [];
  let i = n - 1;
  let j = endJ;
  for (;;) {
    path.push([i, j]);
    if (i === 0) break;
    const s = step[i * m + j];
    if (s === 1) i--;
    else if (s === 2) j--;
    else {
      i--;
      j--;
    }
  }
  return path.reverse();
}

function norm0(f: Float32Array, k: number, dim: number): boolean {
  for (let d = 0; d < dim; d++) if (f[k * dim + d] !== 0) return false;
  return true;
}

/** Take time → assignment time through a time map (linear between points, the overall slope beyond them). */
export function mapPlayedToAssignment(map: TimeMap, playedSec: number): number {
  return interpolate(map.playedSec, map.assignmentSec, playedSec);
}

/** Assignment time → take time (the inverse map). */
export function mapAssignmentToPlayed(map: TimeMap, assignmentSec: number): number {
  return interpolate(map.assignmentSec, map.playedSec, assignmentSec);
}

function interpolate(xs: number[], ys: number[], x: number): number {
  const n = xs.length;
  if (n === 0) return x;
  if (n === 1) return ys[0] + (x - xs[0]);
  const slope = xs[n - 1] > xs[0] ? (ys[n - 1] - ys[0]) / (xs[n - 1] - xs[0]) : 1;
  if (x <= xs[0]) return ys[0] + (x - xs[0]) * slope;
  if (x >= xs[n - 1]) return ys[n - 1] + (x - xs[n - 1]) * slope;
  let lo = 0;
  let hi = n - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (xs[mid] <= x) lo = mid;
    else hi = mid;
  }
  const span = xs[hi] - xs[lo];
  return span > 0 ? ys[lo] + ((x - xs[lo]) / span) * (ys[hi] - ys[lo]) : ys[lo];
}

/** Warping path → strictly increasing time map (frame centres; assignment frames averaged per take frame). */
function pathToTimeMap(path: [number, number][], hopSec: number, assignmentStartSec: number): TimeMap {
  const playedSec: number[] = [];
  const assignmentSec: number[] = [];
  let k = 0;
  while (k < path.length) {
    const j = path[k][1];
    let sum = 0;
    let count = 0;
    while (k < path.length && path[k][1] === j) {
      sum += path[k][0];
      count++;
      k++;
    }
    const a = assignmentStartSec + (sum / count + 0.5) * hopSec;
    if (assignmentSec.length && a <= assignmentSec[assignmentSec.length - 1]) continue;
    playedSec.push((j + 0.5) * hopSec);
    assignmentSec.push(a);
  }
  return { playedSec, assignmentSec };
}

interface Pairing {
  expectedResult: ("matched" | "missed" | "off-pitch")[];
  expectedPartner: (number | null)[];
  playedResult: ("matched" | "extra" | "off-pitch")[];
  playedPartner: (number | null)[];
  assignmentOnsetSec: number[];
}

/** Step 4: one-to-one pairing, same pitch first (closest first), then off-pitch pairs. */
function pairNotes(expected: readonly AlignNote[], played: readonly AlignNote[], map: TimeMap, tolSec: number): Pairing {
  const aOn = played.map((p) => mapPlayedToAssignment(map, p.onsetSec));
  const order = expected.map((_, i) => i).sort((a, b) => expected[a].onsetSec - expected[b].onsetSec);
  const sortedOn = order.map((i) => expected[i].onsetSec);
  const candidates: { e: number; p: number; d: number; dp: number }[] = [];
  played.forEach((p, pi) => {
    // expected notes with onset in [aOn − tol, aOn + tol]
    let lo = 0;
    let hi = sortedOn.length;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (sortedOn[mid] < aOn[pi] - tolSec) lo = mid + 1;
      else hi = mid;
    }
    for (let k = lo; k < sortedOn.length && sortedOn[k] <= aOn[pi] + tolSec; k++) {
      const e = order[k];
      candidates.push({ e, p: pi, d: Math.abs(sortedOn[k] - aOn[pi]), dp: Math.abs(expected[e].pitch - p.pitch) });
    }
  });
  const expectedResult: Pairing["expectedResult"] = expected.map(() => "missed");
  const expectedPartner: (number | null)[] = expected.map(() => null);
  const playedResult: Pairing["playedResult"] = played.map(() => "extra");
  const playedPartner: (number | null)[] = played.map(() => null);
  const same = candidates.filter((c) => c.dp === 0).sort((a, b) => a.d - b.d || a.e - b.e || a.p - b.p);
  for (const c of same) {
    if (expectedPartner[c.e] !== null || playedPartner[c.p] !== null) continue;
    expectedPartner[c.e] = c.p;
    playedPartner[c.p] = c.e;
    expectedResult[c.e] = "matched";
    playedResult[c.p] = "matched";
  }
  const other = candidates.filter((c) => c.dp !== 0).sort((a, b) => a.d - b.d || a.dp - b.dp || a.e - b.e || a.p - b.p);
  for (const c of other) {
    if (expectedPartner[c.e] !== null || playedPartner[c.p] !== null) continue;
    expectedPartner[c.e] = c.p;
    playedPartner[c.p] = c.e;
    expectedResult[c.e] = "off-pitch";
    playedResult[c.p] = "off-pitch";
  }
  return { expectedResult, expectedPartner, playedResult, playedPartner, assignmentOnsetSec: aOn };
}

/** Anchors from matched pairs: one point per played onset, reduced to a strictly increasing chain (LIS). */
function anchorsFromMatches(expected: readonly AlignNote[], played: readonly AlignNote[], pairing: Pairing): TimeMap {
  const byPlayed = new Map<number, number[]>();
  pairing.playedPartner.forEach((e, p) => {
    if (e === null || pairing.playedResult[p] !== "matched") return;
    const key = Math.round(played[p].onsetSec * 1000);
    (byPlayed.get(key) ?? byPlayed.set(key, []).get(key)!).push(expected[e].onsetSec);
  });
  const points = [...byPlayed.entries()]
    .map(([key, as]) => ({ x: key / 1000, y: as.reduce((a, b) => a + b, 0) / as.length }))
    .sort((a, b) => a.x - b.x);
  // longest strictly increasing subsequence in y (patience sorting)
  const tails: number[] = [];
  const prevIdx = new Int32Array(points.length).fill(-1);
  points.forEach((pt, k) => {
    let lo = 0;
    let hi = tails.length;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (points[tails[mid]].y < pt.y) lo = mid + 1;
      else hi = mid;
    }
    if (lo > 0) prevIdx[k] = tails[lo - 1];
    tails[lo] = k;
  });
  const chain: number[] = [];
  for (let k = tails.length ? tails[tails.length - 1] : -1; k >= 0; k = prevIdx[k]) chain.push(k);
  chain.reverse();
  return { playedSec: chain.map((k) => points[k].x), assignmentSec: chain.map((k) => points[k].y) };
}

const ratio = (a: number, b: number) => (b > 0 ? a / b : null);

/**
 * Align the take's `played` notes to the assignment's `expected` notes and mark every note.
 * See the module comment for the method and its parameters.
 */
export function alignToAssignment(
  played: readonly AlignNote[],
  expected: readonly AlignNote[],
  options: AlignOptions = {},
): Alignment {
  const tolSec = options.onsetToleranceSec ?? 0.15;
  const maxCells = options.maxCells ?? 2e7;
  let hopSec = options.hopSec ?? 0.05;

  let timeMap: TimeMap = { playedSec: [], assignmentSec: [] };
  if (played.length > 0 && expected.length > 0) {
    const aStart = Math.min(...expected.map((n) => n.onsetSec));
    const aEnd = Math.max(...expected.map((n) => n.offsetSec));
    const pEnd = Math.max(...played.map((n) => n.offsetSec));
    const cells = ((aEnd - aStart) / hopSec) * (pEnd / hopSec);
    if (cells > maxCells) hopSec *= Math.sqrt(cells / maxCells);
    const aStartFrame = Math.floor(aStart / hopSec) * hopSec;
    const nA = Math.max(1, Math.ceil((aEnd - aStartFrame) / hopSec));
    const nP = Math.max(1, Math.ceil(pEnd / hopSec));
    const query = noteFeatureFrames(expected, aStartFrame, hopSec, nA);
    const database = noteFeatureFrames(played, 0, hopSec, nP);
    timeMap = pathToTimeMap(subsequenceDtw(query, database), hopSec, aStartFrame);

    const first = pairNotes(expected, played, timeMap, Math.max(2 * tolSec, 3 * hopSec));
    const anchors = anchorsFromMatches(expected, played, first);
    if (anchors.playedSec.length >= 2) timeMap = anchors;
  }

  const pairing = pairNotes(expected, played, timeMap, tolSec);
  const expectedOut: ExpectedNoteResult[] = expected.map((n, i) => ({
    index: i,
    onsetSec: n.onsetSec,
    offsetSec: n.offsetSec,
    pitch: n.pitch,
    voice: n.voice ?? null,
    result: pairing.expectedResult[i],
    playedIndex: pairing.expectedPartner[i],
  }));
  const playedOut: PlayedNoteResult[] = played.map((n, i) => ({
    index: i,
    onsetSec: n.onsetSec,
    offsetSec: n.offsetSec,
    pitch: n.pitch,
    voice: n.voice ?? null,
    result: pairing.playedResult[i],
    expectedIndex: pairing.playedPartner[i],
    assignmentOnsetSec: Math.round(pairing.assignmentOnsetSec[i] * 1000) / 1000,
  }));
  const matched = expectedOut.filter((e) => e.result === "matched").length;
  const offPitch = expectedOut.filter((e) => e.result === "off-pitch").length;
  const precision = ratio(matched, played.length);
  const recall = ratio(matched, expected.length);
  const fMeasure = precision !== null && recall !== null ? (precision + recall > 0 ? (2 * precision * recall) / (precision + recall) : 0) : null;

  // tempo fit over matched pairs: played onset = tempoRatio · expected onset + offsetSec
  const xs: number[] = [];
  const ys: number[] = [];
  for (const e of expectedOut) {
    if (e.result === "matched") {
      xs.push(e.onsetSec);
      ys.push(played[e.playedIndex!].onsetSec);
    }
  }
  let tempoRatio: number | null = null;
  let offsetSec: number | null = null;
  if (xs.length >= 2) {
    const mx = xs.reduce((a, b) => a + b, 0) / xs.length;
    const my = ys.reduce((a, b) => a + b, 0) / ys.length;
    let sxy = 0;
    let sxx = 0;
    xs.forEach((x, k) => {
      sxy += (x - mx) * (ys[k] - my);
      sxx += (x - mx) ** 2;
    });
    if (sxx > 0) {
      tempoRatio = sxy / sxx;
      offsetSec = my - tempoRatio * mx;
    }
  }

  return {
    method: "subsequence-dtw-chroma",
    expected: expectedOut,
    played: playedOut,
    counts: {
      expected: expected.length,
      played: played.length,
      matched,
      missed: expectedOut.filter((e) => e.result === "missed").length,
      extra: playedOut.filter((p) => p.result === "extra").length,
      offPitch,
    },
    score: recall,
    precision,
    recall,
    fMeasure,
    timeMap,
    tempoRatio,
    offsetSec,
    hopSec,
  };
}
