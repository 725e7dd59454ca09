/**
 * The spectrogram's columns: a short-time Fourier transform (the engine's SpectrumPlan, Hann
 * taper, periodic) of the take's mono mix, read into log-frequency bands (freq-axis.ts) and
 * stored as bytes, one column per hop:
 *
 *   level(b, t) = clamp((L_b,t − floorDb) / (ceilDb − floorDb), 0, 1) · 255,
 *   L_b,t = 10·log10(max over the band's bins of |X_t(k)|²) − 20·log10(Σw / 2)   (dB re full scale:
 *   a full-scale sinusoid reads 0 dB, Harris 1978, "On the use of windows…", the coherent gain).
 *
 * Bands narrower than a bin (low notes) read the magnitude linearly interpolated at the band's
 * centre. Pure: runs in the Web Worker and, if no worker can start, in chunks on the page.
 */
import { SpectrumPlan } from "@/lib/engine/stft";
import { bandPitch, hzToBin, makeBands, type Bands } from "./freq-axis";
import { midiToHz } from "@/lib/music/pitch";

export type SpectrogramSpec = {
  sampleRateHz: number;
  fftSize: number;
  hopSamples: number;
  lowPitch: number;
  highPitch: number;
  bandsPerSemitone: number;
  floorDb: number;
  ceilDb: number;
};

/** At the decode rate of 22 050 Hz: a 186 ms frame (5.4 Hz bins), a column every 11.6 ms, E1…C8. */
export function defaultSpec(sampleRateHz: number): SpectrogramSpec {
  return { sampleRateHz, fftSize: 4096, hopSamples: 256, lowPitch: 28, highPitch: 108, bandsPerSemitone: 3, floorDb: -84, ceilDb: -18 };
}

export function frameCount(sampleCount: number, hopSamples: number): number {
  return Math.floor(sampleCount / hopSamples) + 1;
}

export function specBands(spec: SpectrogramSpec): Bands {
  return makeBands(spec.lowPitch, spec.highPitch, spec.bandsPerSemitone, spec.fftSize, spec.sampleRateHz);
}

export class ColumnMaker {
  private readonly plan: SpectrumPlan;
  private readonly bands: Bands;
  private readonly centreBin: Float64Array;
  private readonly refDb: number;

  constructor(private readonly spec: SpectrogramSpec) {
    this.plan = new SpectrumPlan(spec.fftSize, spec.fftSize, spec.sampleRateHz, "hann");
    this.bands = specBands(spec);
    this.centreBin = new Float64Array(this.bands.count);
    for (let b = 0; b < this.bands.count; b++) this.centreBin[b] = hzToBin(midiToHz(bandPitch(this.bands, b)), spec.fftSize, spec.sampleRateHz);
    this.refDb = 20 * Math.log10(this.plan.taperSum / 2);
  }

  get bandCount(): number {
    return this.bands.count;
  }

  /** Columns [from, to) of `signal` into `out` (column-major: out[(t − from)·bands + b]). */
  columns(signal: Float32Array, from: number, to: number, out: Uint8Array): void {
    const { hopSamples, floorDb, ceilDb } = this.spec;
    const nb = this.bands.count;
    const { binLo, binHi } = this.bands;
    const scale = 255 / (ceilDb - floorDb);
    for (let t = from; t < to; t++) {
      const p = this.plan.analyse(signal, t * hopSamples);
      const base = (t - from) * nb;
      for (let b = 0; b < nb; b++) {
        let power: number;
        const lo = binLo[b]!;
        const hi = binHi[b]!;
        if (hi - lo < 1) {
          const c = this.centreBin[b]!;
          const k = Math.floor(c);
          const f = c - k;
          power = (1 - f) * (p[k] ?? 0) + f * (p[k + 1] ?? 0);
        } else {
          power = 0;
          const k1 = Math.min(p.length - 1, Math.ceil(hi));
          for (let k = Math.floor(lo); k <= k1; k++) if (p[k]! > power) power = p[k]!;
        }
        const db = 10 * Math.log10(power + 1e-20) - this.refDb;
        out[base + b] = Math.max(0, Math.min(255, Math.round((db - floorDb) * scale)));
      }
    }
  }
}
