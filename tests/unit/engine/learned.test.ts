import { describe, expect, it } from "vitest";
import { scoreFeatures, FEATURE_COUNT, type MlpWeights } from "@/lib/engine/onset-model";
import { NOTE_FEATURE_COUNT } from "@/lib/engine/note-check";
import { ONSET_MODEL } from "@/lib/engine/onset-weights";
import { NOTE_MODEL } from "@/lib/engine/note-weights";
import { strongestNear } from "@/lib/engine/attacks";

describe("learned stages (onset model, note check)", () => {
  it("an MLP scores a worked example by hand: one hidden ReLU layer, logistic output", () => {
    // 2 inputs, 2 hidden units; z = (x − mean)·scale = (1, −2)
    const model: MlpWeights = { inputs: 2, hidden: 2, mean: [1, 0], scale: [1, 2], w1: [1, 1, 2, -1], b1: [0.5, -10], w2: [2, 3], b2: -1 };
    // h1 = 1·1 + 1·(−2) + 0.5 = −0.5 → 0;  h2 = 2·1 − 1·(−2) − 10 = −6 → 0;  y = −1
    // second row z = (3, 1): h1 = 4.5, h2 = −5 → 0; y = −1 + 2·4.5 = 8
    const p = scoreFeatures([Float32Array.of(2, -1), Float32Array.of(4, 0.5)], model, 2);
    expect(p[0]).toBeCloseTo(1 / (1 + Math.exp(1)), 6);
    expect(p[1]).toBeCloseTo(1 / (1 + Math.exp(-8)), 6);
    expect(() => scoreFeatures([], model, 3)).toThrow(/expects 2 features/);
  });

  it("the committed weights fit the features the code makes", () => {
    for (const [m, n] of [[ONSET_MODEL, FEATURE_COUNT], [NOTE_MODEL, NOTE_FEATURE_COUNT]] as const) {
      expect(m.inputs).toBe(n);
      expect(m.mean).toHaveLength(n);
      expect(m.scale).toHaveLength(n);
      expect(m.w1).toHaveLength(n * m.hidden);
      expect(m.b1).toHaveLength(m.hidden);
      expect(m.w2).toHaveLength(m.hidden);
      expect([...m.w1, ...m.w2, m.b2].every(Number.isFinite)).toBe(true);
    }
  });

  it("finds the strongest peak within ±40 cents in a sorted peak list", () => {
    const hz = Float32Array.of(100, 438, 441, 445, 452, 900);
    const amp = Float32Array.of(9, 0.2, 0.5, 0.3, 7, 9);
    // 440 Hz ± 40 c = 430.0 … 450.2 Hz: 438, 441, 445 (452 is 46 c above)
    expect(strongestNear(hz, amp, 440)).toBeCloseTo(0.5, 6);
    expect(strongestNear(hz, amp, 300)).toBe(0);
  });
});
