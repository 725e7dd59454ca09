/**
 * Spectral peak picking with sub-bin frequency and taper-corrected amplitude.
 *
 * A peak is a bin k with P(k) > P(k±1) and P(k) ≥ P(k±2) (power spectrum), above an
 * adaptive noise floor (floorFactor × the mean power over ±floorHalfWidth bins) and within
 * `rangeDb` of the loudest bin in the range.
 *
 * Frequency and level by parabolic interpolation of the log power at k−1, k, k+1
 * (Smith & Serra 1987; bias study: Abe & Smith 2004):
 *   δ = ½ (a − c) / (a − 2b + c),  f = (k + δ) · fs / M,  ln P̂ = b − ¼ (a − c) δ.
 * Amplitude of the sinusoid, corrected for the taper's gain: A = 2 √P̂ / Σw.
 */
export interface PeakParams {
  /** First and last bin searched (inclusive / exclusive). */
  binLo: number;
  binHi: number;
  /** Hz per bin. */
  binHz: number;
  /** Σ w of the taper (amplitude correction). */
  taperSum: number;
  /** Peaks weaker than this many dB below the loudest bin in range are dropped. */
  rangeDb: number;
  /** Absolute floor on power (linear, same scale as P). */
  minPower: number;
  /** Noise-floor window half-width (bins) and factor. */
  floorHalfWidth: number;
  floorFactor: number;
}

/** Scratch for the running sums of the noise floor; reuse one per band. */
export class PeakScratch {
  readonly prefix: Float64Array;
  constructor(bins: number) {
    this.prefix = new Float64Array(bins + 1);
  }
}

/**
 * Append the peaks of `power` to outFreqHz / outAmp starting at index `offset`; returns the
 * new end index (at most `end`, default outFreqHz.length). Peaks come out in increasing frequency.
 */
export function findPeaks(
  power: Float32Array,
  p: PeakParams,
  scratch: PeakScratch,
  outFreqHz: Float32Array,
  outAmp: Float32Array,
  offset: number,
  end: number = outFreqHz.length,
): number {
  const lo = Math.max(2, p.binLo);
  const hi = Math.min(power.length - 2, p.binHi);
  if (hi <= lo) return offset;
  // one pass: running sums of the noise-floor window and the loudest bin in range
  const W = p.floorHalfWidth;
  const a0 = Math.max(0, lo - W);
  const a1 = Math.min(power.length, hi + W);
  const pre = scratch.prefix;
  pre[a0] = 0;
  let acc = 0;
  let maxP = 0;
  for (let k = a0; k < lo; k++) pre[k + 1] = acc += power[k];
  for (let k = lo; k < hi; k++) {
    const v = power[k];
    pre[k + 1] = acc += v;
    if (v > maxP) maxP = v;
  }
  for (let k = hi; k < a1; k++) pre[k + 1] = acc += power[k];
  if (maxP <= p.minPower) return offset;
  const thr = Math.max(p.minPower, maxP * Math.pow(10, -p.rangeDb / 10));
  let n = offset;
  const cap = Math.min(end, outFreqHz.length);
  for (let k = lo; k < hi && n < cap; k++) {
    const b = power[k];
    if (b < thr || b <= power[k - 1] || b <= power[k + 1] || b < power[k - 2] || b < power[k + 2]) continue;
    const l = Math.max(a0, k - W);
    const r = Math.min(a1, k + W + 1);
    const mean = (pre[r] - pre[l]) / (r - l);
    if (b < p.floorFactor * mean) continue;
    const la = Math.log(power[k - 1] + 1e-30);
    const lb = Math.log(b + 1e-30);
    const lc = Math.log(power[k + 1] + 1e-30);
    const den = la - 2 * lb + lc;
    const d = den < 0 ? (0.5 * (la - lc)) / den : 0;
    const lp = lb - 0.25 * (la - lc) * d;
    outFreqHz[n] = (k + d) * p.binHz;
    outAmp[n] = (2 * Math.exp(0.5 * lp)) / p.taperSum;
    n++;
  }
  return n;
}

/**
 * The short-frame (high-register) peaks of every frame, kept for the note stage: a note's own
 * harmonic level at 10 ms resolution locates its attack and its re-articulations, however many
 * other voices start nearby.
 */
export class PeakStore {
  readonly frames: number;
  readonly cap: number;
  readonly freqHz: Float32Array;
  readonly amp: Float32Array;
  readonly count: Uint8Array;
  constructor(frames: number, cap: number, readonly minHz: number, readonly maxHz: number) {
    this.frames = frames;
    this.cap = Math.min(255, cap);
    this.freqHz = new Float32Array(frames * this.cap);
    this.amp = new Float32Array(frames * this.cap);
    this.count = new Uint8Array(frames);
  }

  /** Keep peaks [from, to) of a frame's (sorted) peak list whose frequency is in [minHz, maxHz). */
  put(t: number, freqHz: Float32Array, amp: Float32Array, from: number, to: number): void {
    let n = 0;
    const base = t * this.cap;
    for (let i = from; i < to && n < this.cap; i++) {
      const f = freqHz[i];
      if (f < this.minHz || f >= this.maxHz) continue;
      this.freqHz[base + n] = f;
      this.amp[base + n] = amp[i];
      n++;
    }
    this.count[t] = n;
  }

  /**
   * Level (dB) of the partials of f0Hz in frame t: 20·log10 Σ_h a_h, a_h the strongest peak
   * within ±40 cents of h·f0 (h ≤ 24, inside the stored band); −200 when none.
   */
  harmonicLevelDb(t: number, f0Hz: number): number {
    if (t < 0 || t >= this.frames) return -200;
    const n = this.count[t];
    const base = t * this.cap;
    let sum = 0;
    let i = 0;
    const r = 1.0234; // 40 cents
    for (let h = Math.max(1, Math.ceil(this.minHz / (f0Hz * r))); h <= 24; h++) {
      const c = h * f0Hz;
      if (c > this.maxHz) break;
      const lo = c / r;
      const hi = c * r;
      while (i < n && this.freqHz[base + i] < lo) i++;
      let best = 0;
      for (let j = i; j < n && this.freqHz[base + j] <= hi; j++) if (this.amp[base + j] > best) best = this.amp[base + j];
      sum += best;
    }
    return sum > 0 ? 20 * Math.log10(sum) : -200;
  }
}

/** Index of the first element ≥ x of an ascending array (its length if none). */
export function firstAtOrAfter(xs: ArrayLike<number>, x: number): number {
  let l = 0;
  let r = xs.length;
  while (l < r) {
    const m = (l + r) >> 1;
    if (xs[m] < x) l = m + 1;
    else r = m;
  }
  return l;
}
