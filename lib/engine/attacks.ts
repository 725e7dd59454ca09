/**
 * Attack spectra: which pitches start at an onset, from the energy that is new there.
 *
 * At each peak of the spectral-flux detection function (Bello et al., "A tutorial on onset
 * detection in music signals", IEEE TSAP 13(5), 2005), the merged multi-resolution peaks of a
 * frame just after the onset are compared with those of a frame just before it, per register
 * (a register's frames are placed half a frame length either side, so the frame before does not
 * yet see the attack and the frame after does). Each later peak keeps only the part of its
 * energy that is new — a² − b², b the strongest earlier peak within ±40 cents, and only where
 * the peak rose by at least 3 dB — and the concurrent-pitch estimator (multipitch.ts,
 * Klapuri 2006) is run on that "attack spectrum". A note held through the onset contributes
 * nothing; a note that starts there, or is played again, shows its whole series, even where its
 * partials coincide with a held note's (a melody note on a bass note's 6th partial) or where
 * other voices start with it. The note stage takes each note's onset from these per-pitch
 * attacks instead of from its partials' level alone.
 *
 * The analysis runs online, a fixed number of frames behind the frame loop, on a ring of the
 * last frames' peaks, so the take's peaks are never all held.
 */
import { MultiPitchEstimator, type MultiPitchConfig } from "./multipitch";
import { firstAtOrAfter } from "./peaks";
import { framesFor, PEAK_HALF_WIDTH_SEC, MEAN_HALF_WIDTH_SEC } from "./onsets";

/** One attack: the onset frame, its detection-function value and the pitches that start there. */
export interface Attack {
  frame: number;
  odf: number;
  f0Hz: Float32Array;
  /** Level (linear amplitude) of each pitch's new energy. */
  level: Float32Array;
  /** Share of each pitch's energy just after the onset that is new (0 … 1). */
  newShare: Float32Array;
  /** Share of the energy at each pitch's fundamental (±40 cents) just after the onset that is new. */
  f0Share: Float32Array;
  /** Partials (of the first 10) of each pitch present in the attack spectrum. */
  parts: Uint8Array;
  /** The attack spectrum: frequencies (sorted) and amplitudes of the new energy. */
  riseHz: Float32Array;
  riseAmp: Float32Array;
  /** The merged peaks (sorted) of the frames just after and just before the onset, register by register. */
  afterHz: Float32Array;
  afterAmp: Float32Array;
  beforeHz: Float32Array;
  beforeAmp: Float32Array;
}

/** Strongest amplitude within ±cents of fHz in a peak list sorted by frequency (0 if none). */
export function strongestNear(hz: Float32Array, amp: Float32Array, fHz: number, ratio = 1.0234): number {
  const lo = fHz / ratio;
  const hi = fHz * ratio;
  let best = 0;
  for (let i = firstAtOrAfter(hz, lo); i < hz.length && hz[i] <= hi; i++) if (amp[i] > best) best = amp[i];
  return best;
}

/** New energy (amplitude) of an attack within ±40 cents of fHz (0 if none). */
export function riseNear(a: Attack, fHz: number): number {
  return strongestNear(a.riseHz, a.riseAmp, fHz);
}

export interface AttackRegister {
  /** Upper edge (Hz) of the register's peaks. */
  hiHz: number;
  /** Frame length of the register (s). */
  frameSec: number;
}

export class AttackAnalyser {
  readonly attacks: Attack[] = [];
  private readonly R: number;
  private readonly cap: number;
  private readonly ringF: Float32Array;
  private readonly ringA: Float32Array;
  private readonly ringN: Int32Array;
  private readonly odf: Float32Array;
  /** Frames before / after the onset at which each register is compared. */
  private readonly before: Int32Array;
  private readonly after: Int32Array;
  private readonly hiHz: Float32Array;
  /** Frames the analysis lags behind the frame loop. */
  readonly delay: number;
  /** Half-widths (frames) of the local-maximum test and of the local mean. */
  private readonly halfWidth: number;
  private readonly meanHalfWidth: number;
  private readonly est: MultiPitchEstimator;
  private readonly rf: Float32Array;
  private readonly ra: Float32Array;
  private readonly outF: Float32Array;
  private readonly outL: Float32Array;
  private readonly outS: Float32Array;
  private readonly voices: number;
  private readonly af: Float32Array;
  private readonly aa: Float32Array;
  private readonly bf: Float32Array;
  private readonly ba: Float32Array;

  constructor(
    frames: number,
    maxPeaks: number,
    hopSec: number,
    registers: readonly AttackRegister[],
    cfg: MultiPitchConfig,
    /** Half-width (s) of the local-maximum test and of the local mean (as the onset picking's). */
    halfWidthSec = PEAK_HALF_WIDTH_SEC,
    meanHalfWidthSec = MEAN_HALF_WIDTH_SEC,
  ) {
    this.halfWidth = framesFor(halfWidthSec, hopSec);
    this.meanHalfWidth = framesFor(meanHalfWidthSec, hopSec);
    this.odf = new Float32Array(frames);
    this.before = Int32Array.from(registers, (r) => Math.ceil((0.5 * r.frameSec) / hopSec) + 1);
    this.after = Int32Array.from(registers, (r) => Math.ceil((0.5 * r.frameSec) / hopSec));
    this.hiHz = Float32Array.from(registers, (r) => r.hiHz);
    let maxOff = this.meanHalfWidth;
    for (const a of this.after) maxOff = Math.max(maxOff, a);
    let maxBack = 0;
    for (const b of this.before) maxBack = Math.max(maxBack, b + 1);
    this.delay = maxOff;
    this.R = maxOff + maxBack + 2;
    this.cap = maxPeaks;
    this.ringF = new Float32Array(this.R * maxPeaks);
    this.ringA = new Float32Array(this.R * maxPeaks);
    this.ringN = new Int32Array(this.R);
    this.voices = cfg.voiceLimit;
    this.est = new MultiPitchEstimator({ continuityBonus: 1, ...cfg }, maxPeaks);
    this.rf = new Float32Array(maxPeaks);
    this.ra = new Float32Array(maxPeaks);
    this.af = new Float32Array(maxPeaks);
    this.aa = new Float32Array(maxPeaks);
    this.bf = new Float32Array(maxPeaks);
    this.ba = new Float32Array(maxPeaks);
    this.outF = new Float32Array(cfg.voiceLimit);
    this.outL = new Float32Array(cfg.voiceLimit);
    this.outS = new Float32Array(cfg.voiceLimit);
  }

  /** Feed frame t's merged peaks (sorted by frequency) and detection-function value. */
  push(t: number, freqHz: Float32Array, amp: Float32Array, n: number, odf: number): void {
    const slot = t % this.R;
    const m = Math.min(n, this.cap);
    this.ringF.set(freqHz.subarray(0, m), slot * this.cap);
    this.ringA.set(amp.subarray(0, m), slot * this.cap);
    this.ringN[slot] = m;
    this.odf[t] = odf;
    const c = t - this.delay;
    if (c >= 0) this.consider(c, t);
  }

  /** Analyse the frames still pending after the last frame (t = frames − 1). */
  finish(lastFrame: number): void {
    for (let c = Math.max(0, lastFrame - this.delay + 1); c <= lastFrame; c++) this.consider(c, lastFrame);
  }

  private consider(c: number, last: number): void {
    const odf = this.odf;
    const v = odf[c];
    if (!(v > 0)) return;
    for (let j = Math.max(0, c - this.halfWidth); j <= Math.min(last, c + this.halfWidth); j++) {
      if (odf[j] > v || (odf[j] === v && j < c)) return;
    }
    let s = 0;
    let k = 0;
    for (let j = Math.max(0, c - this.meanHalfWidth); j <= Math.min(last, c + this.meanHalfWidth); j++) {
      s += odf[j];
      k++;
    }
    if (v <= s / k) return;
    // the attack spectrum, register by register
    let n = 0;
    let nA = 0;
    let nB = 0;
    let lo = 0;
    for (let r = 0; r < this.hiHz.length; r++) {
      const hi = this.hiHz[r];
      const ta = Math.min(last, c + this.after[r]);
      const tb = Math.max(0, c - this.before[r]);
      const sb = (tb % this.R) * this.cap;
      const nb = this.ringN[tb % this.R];
      for (let i = 0; i < nb && nB < this.cap; i++) {
        const f = this.ringF[sb + i];
        if (f < lo || f >= hi) continue;
        this.bf[nB] = f;
        this.ba[nB++] = this.ringA[sb + i];
      }
      const sa = (ta % this.R) * this.cap;
      const na = this.ringN[ta % this.R];
      for (let i = 0; i < na; i++) {
        const f = this.ringF[sa + i];
        if (f < lo || f >= hi) continue;
        const a = this.ringA[sa + i];
        if (nA < this.cap) {
          this.af[nA] = f;
          this.aa[nA++] = a;
        }
        let b = 0;
        for (let tt = Math.max(0, tb - 1); tt <= tb; tt++) b = Math.max(b, this.ampNear(tt, f));
        if (a < 1.41 * b) continue;
        if (n < this.cap) {
          this.rf[n] = f;
          this.ra[n] = Math.sqrt(a * a - b * b);
          n++;
        }
      }
      lo = hi;
    }
    if (n === 0) return;
    const count = this.est.estimate(this.rf, this.ra, n, this.outF, this.outL, this.outS, 0);
    if (count === 0) return;
    const newShare = new Float32Array(count);
    const f0Share = new Float32Array(count);
    const parts = new Uint8Array(count);
    for (let i = 0; i < count; i++) {
      // the pitch's energy just after the onset, on its first partials, against the new energy
      const f0 = this.outF[i];
      let e = 0;
      for (let h = 1; h <= 10; h++) {
        const f = h * f0;
        let r = 0;
        while (r < this.hiHz.length - 1 && f >= this.hiHz[r]) r++;
        if (f >= this.hiHz[this.hiHz.length - 1]) break;
        const a = this.ampNear(Math.min(last, c + this.after[r]), f);
        e += a * a;
        const x = this.riseIn(f, n);
        if (x > 0) parts[i]++;
        if (h === 1) f0Share[i] = a > 0 ? Math.min(1, (x * x) / (a * a)) : 0;
      }
      const l = this.outL[i];
      newShare[i] = e > 0 ? Math.min(1, (l * l) / e) : 0;
    }
    this.attacks.push({ frame: c, odf: v, f0Hz: this.outF.slice(0, count), level: this.outL.slice(0, count), newShare, f0Share, parts, riseHz: this.rf.slice(0, n), riseAmp: this.ra.slice(0, n),
      afterHz: this.af.slice(0, nA), afterAmp: this.aa.slice(0, nA), beforeHz: this.bf.slice(0, nB), beforeAmp: this.ba.slice(0, nB),
    });
  }

  /** Strongest new energy of the current attack spectrum within ±40 cents of f (0 if none). */
  private riseIn(f: number, n: number): number {
    let best = 0;
    for (let i = 0; i < n; i++) {
      const x = this.rf[i];
      if (x < f / 1.0234) continue;
      if (x > f * 1.0234) break;
      if (this.ra[i] > best) best = this.ra[i];
    }
    return best;
  }

  /** Strongest peak of frame t within ±40 cents of f (0 if none). */
  private ampNear(t: number, f: number): number {
    const s = (t % this.R) * this.cap;
    const n = this.ringN[t % this.R];
    const lo = f / 1.0234;
    const hi = f * 1.0234;
    // first peak ≥ lo (the peaks are sorted by frequency)
    let l = 0;
    let r = n;
    while (l < r) {
      const mid = (l + r) >> 1;
      if (this.ringF[s + mid] < lo) l = mid + 1;
      else r = mid;
    }
    let best = 0;
    for (let i = l; i < n; i++) {
      if (this.ringF[s + i] > hi) break;
      const a = this.ringA[s + i];
      if (a > best) best = a;
    }
    return best;
  }
}
