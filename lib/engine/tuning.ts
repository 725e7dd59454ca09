import { hzToMidi } from "../music/pitch";
import { median } from "./notes";

/**
 * Time skipped after an onset before a note's pitch is measured: a sustained note takes up to
 * ~0.3 s to settle (bow, breath and sample attacks start off pitch), a short one a quarter
 * of its length (at most 80 ms).
 */
export function attackSkipSec(durSec: number): number {
  return durSec >= 0.7 ? 0.3 : Math.min(0.08, 0.25 * durSec);
}

/**
 * Tuning of a note: the median of its frame fundamentals over the steady part (after the
 * attack, before the release), so vibrato and the attack transient do not bias it.
 * The frame fundamental is the fundamental's peak, or the lowest strong partial divided by
 * its number when the fundamental is weak (see multipitch.ts).
 */
export function steadyPitchHz(timesSec: ArrayLike<number>, f0Hz: ArrayLike<number>, onsetSec: number, offsetSec: number): number {
  const dur = offsetSec - onsetSec;
  const a = onsetSec + attackSkipSec(dur);
  const b = offsetSec - Math.min(0.05, 0.15 * dur);
  const sel: number[] = [];
  for (let i = 0; i < f0Hz.length; i++) if (timesSec[i] >= a && timesSec[i] <= b) sel.push(f0Hz[i]);
  return median(sel.length >= 3 ? sel : Array.from(f0Hz));
}

/**
 * Reference pitch of a take from its notes' deviations from 12-TET at 440 Hz, robust to the
 * few notes measured wrong (an octave shadow or a fragment on an attack):
 *  1. d₀ = the weighted circular mean of the cents (period 100 c);
 *  2. residuals r_i = c_i − d wrapped to ±50 c, scale s = max(1 c, 1.4826 · weighted MAD)
 *     (median absolute deviation, Hampel 1974);
 *  3. Tukey's biweight M-estimate of location (Beaton & Tukey 1974; Hoaglin, Mosteller & Tukey,
 *     "Understanding Robust and Exploratory Data Analysis", 1983), iterated from d₀:
 *     u_i = r_i / (4.685 s), ψ-weights v_i = w_i (1 − u_i²)² for |u_i| < 1 (else 0),
 *     d ← d + Σ v_i r_i / Σ v_i.
 * A4 = 440 · 2^(d/1200). A semitone-shifted tuning (A4 = 415 ≈ 440 − 101 c) cannot be told
 * from a transposition, so the estimate lies within ±50 cents of 440 Hz.
 */
export function estimateReferenceHz(cents: ArrayLike<number>, weights: ArrayLike<number>): number {
  let sx = 0;
  let sy = 0;
  for (let i = 0; i < cents.length; i++) {
    const a = (2 * Math.PI * cents[i]) / 100;
    sx += weights[i] * Math.cos(a);
    sy += weights[i] * Math.sin(a);
  }
  if (sx === 0 && sy === 0) return 440;
  let d = (Math.atan2(sy, sx) * 100) / (2 * Math.PI);
  const wrap = (x: number) => x - 100 * Math.round(x / 100);
  const n = cents.length;
  const r = new Float64Array(n);
  for (let iter = 0; iter < 10; iter++) {
    for (let i = 0; i < n; i++) r[i] = wrap(cents[i] - d);
    const dev = Array.from(r, (x) => Math.abs(x));
    const s = Math.max(1, 1.4826 * weightedMedian(dev, weights));
    let num = 0;
    let den = 0;
    for (let i = 0; i < n; i++) {
      const u = r[i] / (4.685 * s);
      if (Math.abs(u) >= 1) continue;
      const v = weights[i] * (1 - u * u) * (1 - u * u);
      num += v * r[i];
      den += v;
    }
    if (!(den > 0)) break;
    const step = num / den;
    d = wrap(d + step);
    if (Math.abs(step) < 1e-4) break;
  }
  return 440 * Math.pow(2, d / 1200);
}

/** Weighted median: the smallest x_i at which the cumulative weight reaches half the total. */
function weightedMedian(xs: ArrayLike<number>, ws: ArrayLike<number>): number {
  const idx = Array.from({ length: xs.length }, (_, i) => i).sort((a, b) => xs[a] - xs[b] || a - b);
  let total = 0;
  for (let i = 0; i < xs.length; i++) total += ws[i];
  let acc = 0;
  for (const i of idx) {
    acc += ws[i];
    if (acc >= total / 2) return xs[i];
  }
  return 0;
}

/** Nearest MIDI note at A4 = 440 Hz and deviation (cents) of a frequency. */
export function pitchAndCents(freqHz: number): { pitch: number; cents: number } {
  const m = hzToMidi(freqHz, 440);
  const pitch = Math.floor(m + 0.5);
  return { pitch, cents: (m - pitch) * 100 };
}
