import { describe, it, expect } from "vitest";
import { taperProperties, makeTaper, TAPER_NAMES } from "@/lib/engine/tapers";
import { SpectrumPlan } from "@/lib/engine/stft";

// Harris 1978, Table 1 (rows recomputed with scipy 1.17, periodic windows, N = 256), as copied
// in ../shared/REFERENCES.md §1: highest sidelobe (dB), coherent gain, ENBW (bins),
// scallop loss (dB), null-to-null width (bins).
const HARRIS: Array<[string, Record<string, number>, number, number, number, number, number | null]> = [
  ["rectangular", {}, -13.3, 1.0, 1.0, 3.92, 2],
  ["triangular", {}, -26.5, 0.5, 1.33, 1.82, 4],
  ["hann", {}, -31.5, 0.5, 1.5, 1.42, 4],
  ["hamming", {}, -42.7, 0.54, 1.36, 1.75, 4],
  ["blackman", {}, -58.1, 0.42, 1.73, 1.1, 6],
  ["blackman-harris", {}, -92.0, 0.36, 2.0, 0.83, 8],
  ["welch", {}, -21.3, 0.67, 1.2, 2.22, null],
  ["sine", {}, -23.0, 0.64, 1.23, 2.12, 3],
  ["parzen", {}, -53.0, 0.38, 1.91, 0.91, 8],
  ["gaussian", { gaussianAlpha: 2.5 }, -43.2, 0.5, 1.45, 1.58, null],
  ["kaiser", { kaiserBeta: 6.28 }, -45.8, 0.49, 1.5, 1.45, 4.47],
  ["kaiser", { kaiserBeta: 9.42 }, -69.6, 0.4, 1.8, 1.02, 6.33],
];

describe("taper properties against Harris 1978 Table 1 (REFERENCES.md §1)", () => {
  for (const [name, params, hsl, cg, enbw, scallop, nullWidth] of HARRIS) {
    it(`${name} ${JSON.stringify(params)}`, () => {
      const p = taperProperties(name as (typeof TAPER_NAMES)[number], params);
      expect(p.highestSidelobeDb).toBeCloseTo(hsl, 0); // table gives 0.1 dB; ±0.5 dB
      expect(Math.abs(p.highestSidelobeDb - hsl)).toBeLessThan(0.3);
      expect(Math.abs(p.coherentGain - cg)).toBeLessThan(0.006); // table rounds to 0.01
      expect(Math.abs(p.enbwBins - enbw)).toBeLessThan(0.011);
      expect(Math.abs(p.scallopLossDb - scallop)).toBeLessThan(0.05); // Harris prints 2 decimals
      // Welch: the table's 2.86 bins is where the main lobe meets its first minimum, not a true null
      if (nullWidth !== null) expect(p.nullToNullBins).not.toBeNull();
      if (nullWidth !== null) expect(Math.abs((p.nullToNullBins as number) - nullWidth)).toBeLessThan(0.05);
    });
  }

  it("every taper is periodic: w[N/2] is the peak and w[k] = w[N−k]", () => {
    for (const name of TAPER_NAMES) {
      const w = makeTaper(name, 64);
      for (let k = 1; k < 32; k++) expect(w[k]).toBeCloseTo(w[64 - k], 6);
      expect(Math.max(...w)).toBeCloseTo(w[32], 6);
    }
  });
});

describe("first zeros of the transforms (Oppenheim & Schafer; REFERENCES.md §1 textbook property)", () => {
  // a rectangle of length T has its first zero at 1/T, a triangle of length T at 2/T
  const T = 0.1; // s
  const fs = 8000;
  const N = T * fs;
  const firstZeroHz = (name: "rectangular" | "triangular") => {
    const plan = new SpectrumPlan(N, 65536, fs, name);
    const x = new Float32Array(N).fill(1); // DC through the taper = the taper's own transform
    const p = plan.analyse(x, N / 2);
    let k = 1;
    while (p[k + 1] < p[k]) k++;
    return k * plan.binHz;
  };
  it("rectangular: 1/T", () => expect(Math.abs(firstZeroHz("rectangular") - 1 / T)).toBeLessThan(0.2));
  it("triangular: 2/T", () => expect(Math.abs(firstZeroHz("triangular") - 2 / T)).toBeLessThan(0.2));
});
