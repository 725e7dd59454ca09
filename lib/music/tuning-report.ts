/**
 * Tuning report of a take (pure): per-note deviation against equal temperament at the take's
 * reference pitch and against just intervals above the chord root, with summaries per voice
 * and for the whole take, and a note's vibrato.
 *
 * Conventions (docs/intonation.md):
 *  - input `cents` is the engine's: deviation from 12-TET at A4 = 440 Hz of MIDI `pitch`;
 *  - centsEqual = cents − 1200·log2(referenceHz / 440) (REFERENCES.md §4: 442 Hz is +7.85 c),
 *    so a note played in tune at A4 = 442 has centsEqual 0;
 *  - centsJust: the note's interval to the chord root's *sounding* pitch, minus the just size
 *    of that interval (lib/music/intervals.ts) in the segment's chord quality. The root
 *    reference is the lowest note of the root's pitch class in the segment; its own centsJust
 *    is 0 by definition (its error against the reference pitch is in centsEqual), other notes
 *    of the root's pitch class are measured against it as octaves (2:1). Two pitch classes
 *    without a chord name (a dyad) are measured above the lower one with the default just
 *    table; three or more unnamed pitch classes, or a note in no segment, give null;
 *  - a note belongs to the chord segment it overlaps longest among those with a root.
 */
import { chordSegments, type ChordQuality, type ChordSegment } from "./chords";
import { justCentsAbove } from "./intervals";
import { A4_STANDARD_HZ } from "./pitch";

export interface PitchCurve {
  timeSec: number[];
  /** Cents from the note's `pitch` (12-TET at 440 Hz), one per time. */
  cents: number[];
}

/** A note as the engine writes it (lib/engine/transcribe.ts `Note`). */
export interface ReportInputNote {
  onsetSec: number;
  offsetSec: number;
  /** MIDI note number. */
  pitch: number;
  /** Deviation from 12-TET at A4 = 440 Hz. */
  cents: number;
  velocity?: number;
  voice: number;
  pitchCurve?: PitchCurve;
}

export interface Vibrato {
  rateHz: number;
  /** Half the peak-to-peak excursion (amplitude), estimated as √2 · RMS of the detrended curve. */
  extentCents: number;
}

export interface ReportNote {
  onsetSec: number;
  offsetSec: number;
  pitch: number;
  voice: number;
  /** Deviation from 12-TET at the take's reference pitch. */
  centsEqual: number;
  /** Deviation from the just interval above the chord root; null without a root. */
  centsJust: number | null;
  /** Chord symbol of the note's segment, null when unnamed. */
  chord: string | null;
  /** Vibrato of the note's pitch curve; null without a curve or without vibrato. */
  vibrato: Vibrato | null;
}

export interface WorstNote {
  /** Index into `notes`. */
  noteIndex: number;
  onsetSec: number;
  offsetSec: number;
  pitch: number;
  voice: number;
  centsEqual: number;
}

export interface TuningSummary {
  noteCount: number;
  /** Shares 0 … 1 of notes with |centsEqual| ≤ 5, 10, 20 cents; null without notes. */
  within5: number | null;
  within10: number | null;
  within20: number | null;
  /** Mean |centsEqual|. */
  meanAbsCents: number | null;
  /** Mean signed centsEqual: > 0 sharp, < 0 flat. */
  tendencyCents: number | null;
  /** Least-squares slope of centsEqual over onsetSec, × 60. Null with fewer than two distinct onsets. */
  driftCentsPerMin: number | null;
  /** Mean |centsJust| over the notes that have one. */
  meanAbsCentsJust: number | null;
  /** Up to ten notes with the largest |centsEqual|, largest first. */
  worst: WorstNote[];
}

export interface VoiceSummary extends TuningSummary {
  voice: number;
}

export interface ReportChord {
  startSec: number;
  endSec: number;
  symbol: string | null;
  rootPc: number | null;
  quality: ChordQuality | null;
}

export interface TuningReport {
  referenceHz: number;
  /** 1200·log2(referenceHz / 440): what centsEqual subtracts from the engine's cents. */
  referenceOffsetCents: number;
  notes: ReportNote[];
  voices: VoiceSummary[];
  summary: TuningSummary;
  chords: ReportChord[];
}

const round = (x: number, digits = 2) => {
  const f = 10 ** digits;
  return Math.round(x * f) / f;
};
const pcOf = (midi: number) => ((Math.round(midi) % 12) + 12) % 12;

/** Cents of a reference pitch against A4 = 440 Hz: 1200·log2(referenceHz / 440). */
export function referenceOffsetCents(referenceHz: number): number {
  return 1200 * Math.log2(referenceHz / A4_STANDARD_HZ);
}

/** The segment's root for the just comparison: the chord's, or the lower pitch class of an unnamed dyad. */
function segmentRoot(seg: ChordSegment): { rootPc: number; quality: ChordQuality | null } | null {
  if (seg.chord) return { rootPc: seg.chord.rootPc, quality: seg.chord.quality };
  if (seg.pitchClasses.length === 2) return { rootPc: pcOf(seg.bassPitch), quality: null };
  return null;
}

const overlapSec = (n: { onsetSec: number; offsetSec: number }, seg: ChordSegment) =>
  Math.min(n.offsetSec, seg.endSec) - Math.max(n.onsetSec, seg.startSec);

/**
 * Tuning report of a note list at a reference pitch (A4, Hz). See the module comment for the
 * definitions; `minNoteSec` is passed to the chord segmentation (default 0.08 s).
 */
export function tuningReport(
  notes: readonly ReportInputNote[],
  referenceHz: number,
  options: { minNoteSec?: number } = {},
): TuningReport {
  if (!(referenceHz > 0)) throw new RangeError(`referenceHz must be positive, got ${referenceHz}`);
  const offset = referenceOffsetCents(referenceHz);
  const segments = chordSegments(notes, { minNoteSec: options.minNoteSec });

  const out: ReportNote[] = notes.map((n, i) => {
    let best: ChordSegment | null = null;
    let bestOverlap = 0;
    // segments are in time order and do not overlap: start at the first one ending after the onset
    let lo = 0;
    let hi = segments.length;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (segments[mid].endSec <= n.onsetSec) lo = mid + 1;
      else hi = mid;
    }
    for (let k = lo; k < segments.length && segments[k].startSec < n.offsetSec; k++) {
      const seg = segments[k];
      const o = overlapSec(n, seg);
      if (o > bestOverlap && segmentRoot(seg)) {
        best = seg;
        bestOverlap = o;
      }
    }
    let centsJust: number | null = null;
    if (best) {
      const { rootPc, quality } = segmentRoot(best)!;
      const rootIndex = best.noteIndices
        .filter((j) => pcOf(notes[j].pitch) === rootPc)
        .sort((a, b) => notes[a].pitch - notes[b].pitch || overlapSec(notes[b], best!) - overlapSec(notes[a], best!))[0];
      if (rootIndex === i) centsJust = 0;
      else if (rootIndex !== undefined) {
        const root = notes[rootIndex];
        const playedCents = n.pitch * 100 + n.cents - (root.pitch * 100 + root.cents);
        centsJust = playedCents - justCentsAbove(n.pitch - root.pitch, quality);
      }
    }
    return {
      onsetSec: n.onsetSec,
      offsetSec: n.offsetSec,
      pitch: n.pitch,
      voice: n.voice,
      centsEqual: round(n.cents - offset),
      centsJust: centsJust === null ? null : round(centsJust),
      chord: best?.chord?.symbol ?? null,
      vibrato: n.pitchCurve ? vibrato(n.pitchCurve) : null,
    };
  });

  const voiceIds = [...new Set(out.map((n) => n.voice))].sort((a, b) => a - b);
  return {
    referenceHz,
    referenceOffsetCents: round(offset, 3),
    notes: out,
    voices: voiceIds.map((voice) => ({
      voice,
      ...summarise(out, out.map((n, i) => (n.voice === voice ? i : -1)).filter((i) => i >= 0)),
    })),
    summary: summarise(out, out.map((_, i) => i)),
    chords: segments.map((s) => ({
      startSec: s.startSec,
      endSec: s.endSec,
      symbol: s.chord?.symbol ?? null,
      rootPc: s.chord?.rootPc ?? null,
      quality: s.chord?.quality ?? null,
    })),
  };
}

/** Summary of the notes `indices` of `notes` (see TuningSummary). */
export function summarise(notes: readonly ReportNote[], indices: readonly number[]): TuningSummary {
  const n = indices.length;
  const dev = indices.map((i) => notes[i].centsEqual);
  const share = (limit: number) => (n ? round(dev.filter((d) => Math.abs(d) <= limit).length / n, 4) : null);
  const mean = (xs: number[]) => (xs.length ? xs.reduce((a, b) => a + b, 0) / xs.length : null);
  const just = indices.map((i) => notes[i].centsJust).filter((c): c is number => c !== null);
  const slope = leastSquaresSlope(indices.map((i) => notes[i].onsetSec), dev);
  const meanAbs = mean(dev.map(Math.abs));
  const tendency = mean(dev);
  const meanAbsJust = mean(just.map(Math.abs));
  return {
    noteCount: n,
    within5: share(5),
    within10: share(10),
    within20: share(20),
    meanAbsCents: meanAbs === null ? null : round(meanAbs),
    tendencyCents: tendency === null ? null : round(tendency),
    driftCentsPerMin: slope === null ? null : round(slope * 60),
    meanAbsCentsJust: meanAbsJust === null ? null : round(meanAbsJust),
    worst: [...indices]
      .sort((a, b) => Math.abs(notes[b].centsEqual) - Math.abs(notes[a].centsEqual) || notes[a].onsetSec - notes[b].onsetSec)
      .slice(0, 10)
      .map((i) => ({
        noteIndex: i,
        onsetSec: notes[i].onsetSec,
        offsetSec: notes[i].offsetSec,
        pitch: notes[i].pitch,
        voice: notes[i].voice,
        centsEqual: notes[i].centsEqual,
      })),
  };
}

/**
 * Ordinary least-squares slope of y over x: Σ(x − x̄)(y − ȳ) / Σ(x − x̄)². Null when fewer than
 * two points or all x equal.
 */
export function leastSquaresSlope(x: readonly number[], y: readonly number[]): number | null {
  const n = x.length;
  if (n < 2) return null;
  const mx = x.reduce((a, b) => a + b, 0) / n;
  const my = y.reduce((a, b) => a + b, 0) / n;
  let sxy = 0;
  let sxx = 0;
  for (let i = 0; i < n; i++) {
    sxy += (x[i] - mx) * (y[i] - my);
    sxx += (x[i] - mx) ** 2;
  }
  return sxx > 1e-12 ? sxy / sxx : null;
}

export interface VibratoOptions {
  /** Search band of the vibrato rate. Default 3 … 9 Hz (the range of sung and bowed vibrato). */
  minRateHz?: number;
  maxRateHz?: number;
  /** Smallest normalised autocorrelation at the period that counts as periodic. Default 0.5. */
  minCorrelation?: number;
  /** Smallest extent that counts as vibrato rather than wobble. Default 3 cents. */
  minExtentCents?: number;
}

/**
 * Vibrato rate and extent of a pitch curve, or null when it has none.
 *
 * Method: the curve (finite points only) is resampled to its median time step by linear
 * interpolation and detrended by subtracting its least-squares line (removing a slow drift);
 * the rate is 1 / the lag of the first local maximum (within 10 % of the highest) of the unbiased normalised
 * autocorrelation r(k) = [Σ x[n]x[n+k] / (N − k)] / [Σ x[n]² / N] among lags of 1/maxRateHz …
 * 1/minRateHz, refined by parabolic interpolation (autocorrelation pitch estimation, Rabiner
 * 1977, IEEE TASSP 25(1), applied to the pitch curve). At least two periods must fit in the curve.
 * Extent is the amplitude (half the peak-to-peak excursion) of the vibrato, estimated as
 * √2 · RMS of the detrended curve, which is exact for a sinusoid and less sensitive to single
 * outlying frames than the peak-to-peak.
 */
export function vibrato(curve: PitchCurve, options: VibratoOptions = {}): Vibrato | null {
  const minRateHz = options.minRateHz ?? 3;
  const maxRateHz = options.maxRateHz ?? 9;
  const minCorrelation = options.minCorrelation ?? 0.5;
  const minExtentCents = options.minExtentCents ?? 3;

  const t: number[] = [];
  const c: number[] = [];
  const len = Math.min(curve.timeSec.length, curve.cents.length);
  for (let i = 0; i < len; i++) {
    if (Number.isFinite(curve.timeSec[i]) && Number.isFinite(curve.cents[i]) && (t.length === 0 || curve.timeSec[i] > t[t.length - 1])) {
      t.push(curve.timeSec[i]);
      c.push(curve.cents[i]);
    }
  }
  if (t.length < 8) return null;
  const steps = t.slice(1).map((x, i) => x - t[i]).sort((a, b) => a - b);
  const dt = steps[Math.floor(steps.length / 2)];
  const n = Math.floor((t[t.length - 1] - t[0]) / dt + 1e-9) + 1;
  if (n * dt < 2 / maxRateHz) return null;

  // uniform resampling
  const x = new Float64Array(n);
  let j = 0;
  for (let k = 0; k < n; k++) {
    const tk = t[0] + k * dt;
    while (j + 1 < t.length - 1 && t[j + 1] < tk) j++;
    const span = t[j + 1] - t[j];
    const a = span > 0 ? Math.min(1, Math.max(0, (tk - t[j]) / span)) : 0;
    x[k] = c[j] + a * (c[j + 1] - c[j]);
  }
  // linear detrend
  const idx = Array.from({ length: n }, (_, k) => k);
  const slope = leastSquaresSlope(idx, Array.from(x)) ?? 0;
  const meanX = x.reduce((a, b) => a + b, 0) / n;
  const meanK = (n - 1) / 2;
  for (let k = 0; k < n; k++) x[k] -= meanX + slope * (k - meanK);

  let energy = 0;
  for (let k = 0; k < n; k++) energy += x[k] * x[k];
  if (energy <= 0) return null;
  const r0 = energy / n;
  const minLag = Math.max(1, Math.floor(1 / (maxRateHz * dt)));
  const maxLag = Math.min(Math.ceil(1 / (minRateHz * dt)), Math.floor(n / 2));
  if (maxLag - minLag < 2) return null;
  const r = new Float64Array(maxLag + 2);
  for (let k = Math.max(1, minLag - 1); k <= Math.min(maxLag + 1, n - 1); k++) {
    let s = 0;
    for (let i = 0; i + k < n; i++) s += x[i] * x[i + k];
    r[k] = s / (n - k) / r0;
  }
  // local maxima; the shortest lag within 10 % of the highest one, so that a multiple of the
  // period (which a sampled sinusoid can make a hair higher) is not taken for the period
  const peaks: number[] = [];
  for (let k = Math.max(2, minLag); k <= Math.min(maxLag, n - 2); k++) {
    if (r[k] >= r[k - 1] && r[k] >= r[k + 1]) peaks.push(k);
  }
  if (peaks.length === 0) return null;
  const highest = Math.max(...peaks.map((k) => r[k]));
  const bestLag = peaks.find((k) => r[k] >= 0.9 * highest)!;
  if (r[bestLag] < minCorrelation) return null;
  const denom = r[bestLag - 1] - 2 * r[bestLag] + r[bestLag + 1];
  const delta = denom !== 0 ? (0.5 * (r[bestLag - 1] - r[bestLag + 1])) / denom : 0;
  const periodSec = (bestLag + delta) * dt;
  const rateHz = 1 / periodSec;
  if (!Number.isFinite(rateHz) || rateHz < minRateHz || rateHz > maxRateHz || n * dt < 2 * periodSec) return null;
  const extentCents = Math.SQRT2 * Math.sqrt(r0);
  if (!Number.isFinite(extentCents) || extentCents < minExtentCents) return null;
  return { rateHz: round(rateHz, 3), extentCents: round(extentCents, 2) };
}
