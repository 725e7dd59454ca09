import { describe, it, expect } from "vitest";
import { MultiPitchEstimator } from "@/lib/engine/multipitch";

// Peaks of a C major triad (C4, E4, G4), each voice with partials 1…10 at amplitude 1/h:
// G4's 2nd partial (784 Hz) is C4's 3rd, and their 4th/6th (1568 Hz) coincide too.
function triadPeaks() {
  const peaks = new Map<number, number>();
  for (const midi of [60, 64, 67]) {
    const f0 = 440 * Math.pow(2, (midi - 69) / 12);
    for (let h = 1; h <= 10; h++) {
      const f = h * f0;
      // coinciding partials (within 30 cents) add up in one peak
      let key = -1;
      for (const k of peaks.keys()) if (Math.abs(1200 * Math.log2(f / k)) < 30) key = k;
      if (key >= 0) peaks.set(key, peaks.get(key)! + 1 / h);
      else peaks.set(f, 1 / h);
    }
  }
  const fs = [...peaks.keys()].sort((a, b) => a - b);
  return { freq: Float32Array.from(fs), amp: Float32Array.from(fs.map((f) => peaks.get(f)!)) };
}

describe("concurrent pitches: levels with shared partials split", () => {
  it("the voices of an equal-level triad come out within 3 dB of each other", () => {
    const { freq, amp } = triadPeaks();
    const est = new MultiPitchEstimator({ lowMidi: 28, highMidi: 100, voiceLimit: 8, sensitivityDb: 30, maxFreqHz: 7000 }, freq.length);
    const f0 = new Float32Array(8);
    const level = new Float32Array(8);
    const sal = new Float32Array(8);
    const shared = new Float32Array(8);
    const n = est.estimate(freq, amp, freq.length, f0, level, sal, 0, shared);
    const midis = Array.from(f0.subarray(0, n), (f) => Math.round(69 + 12 * Math.log2(f / 440))).sort((a, b) => a - b);
    expect(midis).toEqual([60, 64, 67]);
    const db = Array.from(shared.subarray(0, n), (l) => 20 * Math.log10(l));
    expect(Math.max(...db) - Math.min(...db)).toBeLessThan(3);
    // the residual level of the voice found first holds the partials it shares
    const resid = Array.from(level.subarray(0, n), (l) => 20 * Math.log10(l));
    expect(Math.max(...resid) - Math.min(...resid)).toBeGreaterThan(Math.max(...db) - Math.min(...db));
  });
});
