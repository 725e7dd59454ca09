import FFT from "fft.js";
import { fillTaper, type TaperName, type TaperParams } from "./tapers";
import { EngineError } from "./errors";

/**
 * One short-time spectrum plan: a taper of `frameLength` samples, zero-padded to
 * `fftSize` (a power of two ≥ frameLength), transformed with fft.js' real transform.
 * The plan owns its buffers; `analyse` reuses them and allocates nothing.
 *
 * X_t(k) = Σ_{n=0}^{N−1} w[n] · x[c_t − N/2 + n] · e^{−2πi k n / M},  k = 0 … M/2,
 * with c_t the centre sample of frame t, N the frame length, M the FFT size; samples
 * outside the signal count as zero.
 */
export class SpectrumPlan {
  readonly frameLength: number;
  readonly fftSize: number;
  readonly sampleRateHz: number;
  /** Number of non-negative-frequency bins, fftSize/2 + 1. */
  readonly bins: number;
  /** Σ w[n]; a sinusoid of amplitude A gives a peak |X| = A·Σw/2. */
  readonly taperSum: number;
  readonly taper: Float64Array;
  /** Power |X(k)|² of the last analysed frame, k = 0 … fftSize/2. */
  readonly power: Float32Array;
  private readonly fft: FFT;
  private readonly input: Float64Array;
  private readonly out: number[];

  constructor(frameLength: number, fftSize: number, sampleRateHz: number, taper: TaperName, params: TaperParams = {}) {
    if (!Number.isInteger(frameLength) || frameLength < 4) throw new EngineError("bad_argument", "frame length must be an integer ≥ 4");
    if (fftSize < frameLength || (fftSize & (fftSize - 1)) !== 0)
      throw new EngineError("bad_argument", "FFT size must be a power of two ≥ the frame length");
    if (!(sampleRateHz > 0)) throw new EngineError("bad_argument", "sample rate must be positive");
    this.frameLength = frameLength;
    this.fftSize = fftSize;
    this.sampleRateHz = sampleRateHz;
    this.bins = fftSize / 2 + 1;
    this.taper = new Float64Array(frameLength);
    fillTaper(taper, this.taper, params);
    let s = 0;
    for (let i = 0; i < frameLength; i++) s += this.taper[i];
    this.taperSum = s;
    this.fft = new FFT(fftSize);
    this.input = new Float64Array(fftSize);
    this.out = this.fft.createComplexArray() as number[];
    this.power = new Float32Array(this.bins);
  }

  /** Bin spacing of the (padded) spectrum in Hz: fs / M. */
  get binHz(): number {
    return this.sampleRateHz / this.fftSize;
  }

  /**
   * Analyse the frame centred on sample `centre` of `signal`; fills `this.power` for bins
   * binLo … binHi − 1 (default all; others keep old values) and `complexOut` when given
   * (interleaved re/im for k = 0 … M/2).
   */
  analyse(signal: Float32Array, centre: number, complexOut?: Float64Array, binLo = 0, binHi = this.bins): Float32Array {
    const N = this.frameLength;
    const start = centre - (N >> 1);
    const inp = this.input;
    const w = this.taper;
    const len = signal.length;
    if (start >= 0 && start + N <= len) {
      for (let n = 0; n < N; n++) inp[n] = w[n] * signal[start + n];
    } else {
      for (let n = 0; n < N; n++) {
        const j = start + n;
        inp[n] = j >= 0 && j < len ? w[n] * signal[j] : 0;
      }
    }
    // inp[N … M−1] stay zero (never written)
    const out = this.out;
    this.fft.realTransform(out, inp);
    const p = this.power;
    const B = Math.min(this.bins, binHi);
    for (let k = Math.max(0, binLo); k < B; k++) {
      const re = out[2 * k];
      const im = out[2 * k + 1];
      p[k] = re * re + im * im;
    }
    if (complexOut) for (let i = 0; i < 2 * this.bins; i++) complexOut[i] = out[i];
    return p;
  }
}
