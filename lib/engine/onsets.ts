/**
 * Onset detection function: spectral flux (half-wave rectified increase of compressed
 * magnitude between consecutive frames; Masri 1996, Bello et al., "A tutorial on onset
 * detection in music signals", IEEE TSAP 13(5), 2005, eq. 4):
 *   SF(t) = Σ_k H(|X_t(k)|^½ − |X_{t−1}(k)|^½),  H(x) = max(x, 0),
 * here on magnitude^½ (= power^¼) as the compression, over the bins lo … hi.
 */
export class SpectralFlux {
  private readonly prev: Float32Array;
  private primed = false;
  constructor(
    readonly binLo: number,
    readonly binHi: number,
  ) {
    this.prev = new Float32Array(Math.max(0, binHi - binLo));
  }

  /** Flux of this frame against the previous one (0 for the first frame). */
  next(power: Float32Array): number {
    const lo = this.binLo;
    const prev = this.prev;
    let sum = 0;
    for (let k = lo; k < this.binHi; k++) {
      const v = Math.sqrt(Math.sqrt(power[k]));
      const d = v - prev[k - lo];
      if (d > 0) sum += d;
      prev[k - lo] = v;
    }
    if (!this.primed) {
      this.primed = true;
      return 0;
    }
    return sum;
  }
}

/** Half-widths (s) of the peak picking: a maximum over ±30 ms, above the mean over ±100 ms (3 and 10 frames at a 10 ms hop). */
export const PEAK_HALF_WIDTH_SEC = 0.03;
export const MEAN_HALF_WIDTH_SEC = 0.1;

/** A span in seconds as a whole number of frames (at least one). */
export function framesFor(sec: number, hopSec: number): number {
  return Math.max(1, Math.round(sec / hopSec));
}

/**
 * Onset frames from a detection function at a hop of `hopSec`: local maxima over ±`halfWidthSec`
 * that exceed `delta` + the mean over ±`meanHalfWidthSec` (Bello et al. 2005, §V-B adaptive
 * threshold). `delta` is relative to the function's 99th-percentile value.
 */
export function pickOnsets(
  odf: Float32Array,
  hopSec: number,
  halfWidthSec = PEAK_HALF_WIDTH_SEC,
  meanHalfWidthSec = MEAN_HALF_WIDTH_SEC,
  delta = 0.06,
): Int32Array {
  const halfWidth = framesFor(halfWidthSec, hopSec);
  const meanHalfWidth = framesFor(meanHalfWidthSec, hopSec);
  const n = odf.length;
  if (n === 0) return new Int32Array(0);
  const sorted = Float32Array.from(odf).sort();
  const scale = sorted[Math.min(n - 1, Math.floor(0.99 * n))] || 1e-12;
  const out: number[] = [];
  for (let t = 0; t < n; t++) {
    const v = odf[t];
    let isMax = true;
    for (let j = Math.max(0, t - halfWidth); j <= Math.min(n - 1, t + halfWidth); j++) {
      if (odf[j] > v || (odf[j] === v && j < t)) {
        isMax = false;
        break;
      }
    }
    if (!isMax) continue;
    let s = 0;
    let c = 0;
    for (let j = Math.max(0, t - meanHalfWidth); j <= Math.min(n - 1, t + meanHalfWidth); j++) {
      s += odf[j];
      c++;
    }
    if (v > s / c + delta * scale) out.push(t);
  }
  return Int32Array.from(out);
}
