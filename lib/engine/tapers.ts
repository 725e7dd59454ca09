import FFT from "fft.js";
import { EngineError } from "./errors";

/**
 * Analysis tapers (windows). All are the **periodic** (DFT-even) form, as in Harris 1978:
 * sampled over n = 0 … N−1 of a window of period N, so w[N/2] is the centre and w[N] (not
 * stored) would equal w[0]. This is scipy's `get_window(name, N)` convention (fftbins=True).
 *
 * Source for every formula unless noted: F. J. Harris, "On the use of windows for harmonic
 * analysis with the discrete Fourier transform", Proc. IEEE 66(1), 1978, §V (eqs. 27–49).
 */
export const TAPER_NAMES = [
  "rectangular",
  "triangular",
  "sine",
  "welch",
  "hann",
  "hamming",
  "blackman",
  "blackman-harris",
  "gaussian",
  "parzen",
  "kaiser",
] as const;
export type TaperName = (typeof TAPER_NAMES)[number];

export interface TaperParams {
  /** Kaiser β (= π·α in Harris' notation); default 9.42 (α = 3). */
  kaiserBeta?: number;
  /** Gaussian α with σ = N/(2α); default 2.5. */
  gaussianAlpha?: number;
}

/** Zeroth-order modified Bessel function of the first kind, power series Σ ((x/2)^k / k!)². */
export function besselI0(x: number): number {
  let sum = 1;
  let term = 1;
  const q = (x * x) / 4;
  for (let k = 1; k < 200; k++) {
    term *= q / (k * k);
    sum += term;
    if (term < sum * 1e-17) break;
  }
  return sum;
}

/**
 * Fill `out` (length N) with the periodic taper. With c = N/2 and u = (n − c)/c ∈ [−1, 1):
 * - rectangular: w = 1
 * - triangular (Bartlett, zero ends): w = 1 − |u|                         (Harris eq. 27a)
 * - sine (cosine-α, α = 1): w = sin(π n / N)                               (Harris eq. 29)
 * - Welch (parabolic): w = 1 − u²                  (P. D. Welch, IEEE Trans. AU-15, 1967)
 * - Hann: w = 0.5 − 0.5 cos(2π n/N)                                        (Harris eq. 30)
 * - Hamming: w = 0.54 − 0.46 cos(2π n/N)                                   (Harris eq. 33)
 * - Blackman: w = 0.42 − 0.5 cos(2π n/N) + 0.08 cos(4π n/N)                (Harris eq. 35)
 * - Blackman–Harris, 4-term, −92 dB: w = a0 − a1 cos θ + a2 cos 2θ − a3 cos 3θ, θ = 2πn/N,
 *   a = 0.35875, 0.48829, 0.14128, 0.01168                                  (Harris Table 1)
 * - Gaussian: w = exp(−½ ((n − c)/σ)²), σ = N/(2α)                         (Harris eq. 41)
 * - Parzen (de la Vallée-Poussin): |u| ≤ ½: 1 − 6u² + 6|u|³; else 2(1 − |u|)³ (Harris eq. 37)
 * - Kaiser: w = I0(β √(1 − u²)) / I0(β)                                   (Harris eq. 46)
 */
export function fillTaper(name: TaperName, out: Float32Array | Float64Array, params: TaperParams = {}): void {
  const N = out.length;
  if (N < 1) throw new EngineError("bad_argument", "taper length must be at least 1");
  const c = N / 2;
  const beta = params.kaiserBeta ?? 9.42;
  const alpha = params.gaussianAlpha ?? 2.5;
  const i0b = name === "kaiser" ? besselI0(beta) : 1;
  const sigma = N / (2 * alpha);
  for (let n = 0; n < N; n++) {
    const th = (2 * Math.PI * n) / N;
    const u = (n - c) / c;
    let w: number;
    switch (name) {
      case "rectangular":
        w = 1;
        break;
      case "triangular":
        w = 1 - Math.abs(u);
        break;
      case "sine":
        w = Math.sin((Math.PI * n) / N);
        break;
      case "welch":
        w = 1 - u * u;
        break;
      case "hann":
        w = 0.5 - 0.5 * Math.cos(th);
        break;
      case "hamming":
        w = 0.54 - 0.46 * Math.cos(th);
        break;
      case "blackman":
        w = 0.42 - 0.5 * Math.cos(th) + 0.08 * Math.cos(2 * th);
        break;
      case "blackman-harris":
        w = 0.35875 - 0.48829 * Math.cos(th) + 0.14128 * Math.cos(2 * th) - 0.01168 * Math.cos(3 * th);
        break;
      case "gaussian": {
        const d = (n - c) / sigma;
        w = Math.exp(-0.5 * d * d);
        break;
      }
      case "parzen": {
        const a = Math.abs(u);
        w = a <= 0.5 ? 1 - 6 * a * a + 6 * a * a * a : 2 * Math.pow(1 - a, 3);
        break;
      }
      case "kaiser":
        w = besselI0(beta * Math.sqrt(Math.max(0, 1 - u * u))) / i0b;
        break;
      default:
        throw new EngineError("bad_argument", `unknown taper ${String(name)}`);
    }
    out[n] = w;
  }
}

/** A new Float32Array holding the periodic taper of length N. */
export function makeTaper(name: TaperName, N: number, params: TaperParams = {}): Float32Array {
  const w = new Float32Array(N);
  fillTaper(name, w, params);
  return w;
}

export interface TaperProperties {
  name: TaperName;
  /** Always "periodic" for Tapernote's tapers. */
  form: "periodic";
  /** Coherent gain: (1/N)·Σ w. */
  coherentGain: number;
  /** Equivalent noise bandwidth in bins: N·Σw² / (Σw)². */
  enbwBins: number;
  /** Highest sidelobe level (dB relative to the main-lobe peak). */
  highestSidelobeDb: number;
  /** Scalloping loss (dB): −20·log10 |W(½ bin)| / |W(0)|. */
  scallopLossDb: number;
  /** Worst-case processing loss (dB): scallop loss + 10·log10(ENBW). */
  worstCaseLossDb: number;
  /** Width of the main lobe between its first nulls (bins); null when the lobe has no null. */
  nullToNullBins: number | null;
  /** Bandwidth where the main lobe is 3 dB / 6 dB down (bins). */
  bw3dBBins: number;
  bw6dBBins: number;
}

/**
 * Properties of a taper computed from its samples (N = 256, transform zero-padded 64×):
 * coherent gain and ENBW as defined by Harris 1978 §IV (eqs. 11, 13); the highest
 * sidelobe is the largest local maximum of |W(f)| beyond the main lobe's first minimum.
 */
export function taperProperties(name: TaperName, params: TaperParams = {}, N = 256): TaperProperties {
  const w = new Float64Array(N);
  fillTaper(name, w, params);
  let s1 = 0;
  let s2 = 0;
  for (let n = 0; n < N; n++) {
    s1 += w[n];
    s2 += w[n] * w[n];
  }
  const pad = 64;
  const M = N * pad;
  const fft = new FFT(M);
  const input = new Float64Array(M);
  input.set(w);
  const spec = fft.createComplexArray() as number[];
  fft.realTransform(spec, input);
  const half = M / 2;
  const mag = new Float64Array(half);
  for (let k = 0; k < half; k++) mag[k] = Math.hypot(spec[2 * k], spec[2 * k + 1]);
  const peak = mag[0];
  // main lobe ends at the first local minimum
  let k = 1;
  while (k < half - 1 && !(mag[k] <= mag[k - 1] && mag[k] <= mag[k + 1])) k++;
  const lobeEnd = k;
  let side = 0;
  for (let j = lobeEnd; j < half - 1; j++) {
    if (mag[j] >= mag[j - 1] && mag[j] >= mag[j + 1] && mag[j] > side) side = mag[j];
  }
  const isNull = mag[lobeEnd] < peak * 1e-4;
  const widthAt = (ratio: number): number => {
    let j = 0;
    while (j < half - 1 && mag[j + 1] > peak * ratio) j++;
    // linear interpolation between j and j+1
    const a = mag[j];
    const b = mag[j + 1];
    const frac = a === b ? 0 : (a - peak * ratio) / (a - b);
    return (2 * (j + frac)) / pad;
  };
  const scallop = -20 * Math.log10(mag[pad / 2] / peak);
  const enbw = (N * s2) / (s1 * s1);
  return {
    name,
    form: "periodic",
    coherentGain: s1 / N,
    enbwBins: enbw,
    highestSidelobeDb: side > 0 ? 20 * Math.log10(side / peak) : -Infinity,
    scallopLossDb: scallop,
    worstCaseLossDb: scallop + 10 * Math.log10(enbw),
    nullToNullBins: isNull ? (2 * lobeEnd) / pad : null,
    bw3dBBins: widthAt(Math.SQRT1_2),
    bw6dBBins: widthAt(0.5),
  };
}
