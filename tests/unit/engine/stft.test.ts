import { describe, it, expect } from "vitest";
import { SpectrumPlan } from "@/lib/engine/stft";
import { findPeaks, PeakScratch } from "@/lib/engine/peaks";
import type { TaperName } from "@/lib/engine/tapers";
import { rng } from "../../support/random";

describe("FFT stage against a direct DFT (definition X(k) = Σ x[n] e^{−2πikn/M})", () => {
  for (const [N, M] of [[64, 64], [100, 128], [256, 512]]) {
    it(`frame ${N}, transform ${M}`, () => {
      const r = rng(N);
      const x = Float32Array.from({ length: N }, () => 2 * r() - 1);
      const plan = new SpectrumPlan(N, M, 1000, "rectangular");
      const p = plan.analyse(x, N >> 1);
      for (let k = 0; k <= M / 2; k++) {
        let re = 0;
        let im = 0;
        for (let n = 0; n < N; n++) {
          re += x[n] * Math.cos((2 * Math.PI * k * n) / M);
          im -= x[n] * Math.sin((2 * Math.PI * k * n) / M);
        }
        const ref = re * re + im * im;
        expect(Math.abs(p[k] - ref)).toBeLessThan(1e-4 * (1 + ref));
      }
    });
  }
});

function estimateSine(freqHz: number, fsHz: number, taper: TaperName, frameSec: number, amp = 0.5) {
  const N = Math.round(frameSec * fsHz);
  let M = 1;
  while (M < N) M <<= 1;
  M <<= 1;
  const plan = new SpectrumPlan(N, M, fsHz, taper);
  const len = N * 3;
  const x = new Float32Array(len);
  for (let i = 0; i < len; i++) x[i] = amp * Math.cos((2 * Math.PI * freqHz * i) / fsHz + 0.3);
  const power = plan.analyse(x, len >> 1);
  const f = new Float32Array(64);
  const a = new Float32Array(64);
  const n = findPeaks(
    power,
    { binLo: 2, binHi: plan.bins - 2, binHz: plan.binHz, taperSum: plan.taperSum, rangeDb: 60, minPower: 1e-12, floorHalfWidth: 8, floorFactor: 2 },
    new PeakScratch(plan.bins),
    f,
    a,
    0,
  );
  let best = 0;
  for (let i = 1; i < n; i++) if (a[i] > a[best]) best = i;
  return { freqHz: f[best], amp: a[best] };
}

describe("sinusoid frequency within 0.5 cent (parabolic log-magnitude interpolation, 2× zero-padding; Smith & Serra 1987, REFERENCES.md §2)", () => {
  for (const fs of [16000, 22050, 44100, 48000]) {
    it(`at ${fs} Hz, 55 Hz … 6 kHz`, () => {
      for (let m = 33; m <= 102; m += 3.37) {
        const f = 440 * Math.pow(2, (m - 69) / 12);
        if (f > 0.4 * fs) continue;
        // the engine's register rule: long frames low, short frames high
        const frameSec = f < 250 ? 0.256 : f < 800 ? 0.128 : 0.064;
        const e = estimateSine(f, fs, "hann", frameSec);
        expect(Math.abs(1200 * Math.log2(e.freqHz / f))).toBeLessThan(0.5);
      }
    });
  }
  it("amplitude corrected for the taper's gain (within 0.2 dB; Hann scallop loss 1.42 dB is removed by the interpolation)", () => {
    for (const taper of ["hann", "hamming", "blackman", "blackman-harris", "kaiser"] as TaperName[]) {
      for (const f of [311.1, 440, 1234.5]) {
        const e = estimateSine(f, 16000, taper, 0.064, 0.25);
        expect(Math.abs(20 * Math.log10(e.amp / 0.25))).toBeLessThan(0.2);
      }
    }
  });
});

describe("two close equal tones resolved as the main-lobe width says (REFERENCES.md §3, computed worst case, in phase)", () => {
  const THRESHOLD_BINS: Array<[TaperName, number]> = [["rectangular", 1.33], ["hamming", 1.68], ["hann", 1.89], ["blackman", 2.08], ["blackman-harris", 2.36]];
  const peaksBetween = (taper: TaperName, sepBins: number) => {
    const N = 512;
    const fs = 8192;
    const plan = new SpectrumPlan(N, N * 32, fs, taper);
    const binHz = fs / N;
    const f1 = 1000;
    const f2 = f1 + sepBins * binHz;
    const x = new Float32Array(N);
    // both cosines in phase at the frame centre
    for (let i = 0; i < N; i++) x[i] = Math.cos((2 * Math.PI * f1 * (i - N / 2)) / fs) + Math.cos((2 * Math.PI * f2 * (i - N / 2)) / fs);
    const p = plan.analyse(x, N / 2);
    const lo = Math.floor((f1 - 3 * binHz) / plan.binHz);
    const hi = Math.ceil((f2 + 3 * binHz) / plan.binHz);
    let count = 0;
    const max = Math.max(...p.subarray(lo, hi));
    for (let k = lo; k < hi; k++) if (p[k] > p[k - 1] && p[k] > p[k + 1] && p[k] > max * 0.1) count++;
    return count;
  };
  for (const [taper, thr] of THRESHOLD_BINS) {
    it(`${taper}: one peak at ${(0.9 * thr).toFixed(2)} bins, two at ${(1.1 * thr).toFixed(2)}`, () => {
      expect(peaksBetween(taper, 0.9 * thr)).toBe(1);
      expect(peaksBetween(taper, 1.1 * thr)).toBe(2);
    });
  }
  it("sufficient rule ≥ 2L bins (J. O. Smith, SASP): Hann at 4 bins, Blackman at 6, BH4 at 8 show two peaks", () => {
    expect(peaksBetween("hann", 4)).toBe(2);
    expect(peaksBetween("blackman", 6)).toBe(2);
    expect(peaksBetween("blackman-harris", 8)).toBe(2);
  });
});
