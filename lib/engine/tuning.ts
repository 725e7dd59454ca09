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
 * Reference pitch of a take from its notes' deviations from 12-TET at 440 Hz:
 * the duration-weighted circular mean of the cents (period 100 cents), d, gives
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
  const d = (Math.atan2(sy, sx) * 100) / (2 * Math.PI);
  return 440 * Math.pow(2, d / 1200);
}

/** Nearest MIDI note at A4 = 440 Hz and deviation (cents) of a frequency. */
export function pitchAndCents(freqHz: number): { pitch: number; cents: number } {
  const m = hzToMidi(freqHz, 440);
  const pitch = Math.floor(m + 0.5);
  return { pitch, cents: (m - pitch) * 100 };
}
