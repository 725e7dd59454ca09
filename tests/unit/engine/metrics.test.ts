import { describe, it, expect } from "vitest";
import { readFileSync } from "node:fs";
import { noteMetrics } from "@/lib/engine/metrics";

// Reference values from mir_eval.transcription.precision_recall_f1_overlap (Debian
// python3-mir-eval), computed by `npm run fixtures` (scripts/make-fixtures.ts) for 40 seeded
// random note lists: onset tolerance 50 ms, pitch 50 cents; with offsets: ratio 0.2, min 50 ms.
const fx = JSON.parse(readFileSync(new URL("../../fixtures/engine/mireval-notes.json", import.meta.url), "utf8")) as {
  cases: Array<{ ref: number[][]; est: number[][]; onset: number[]; onoff: number[] }>;
};
const toNotes = (xs: number[][]) => xs.map(([onsetSec, offsetSec, midi]) => ({ onsetSec, offsetSec, midi }));

describe("MIREX note metrics against mir_eval", () => {
  it("has the 40 cases", () => expect(fx.cases.length).toBe(40));
  fx.cases.forEach((c, i) => {
    it(`case ${i}`, () => {
      const on = noteMetrics(toNotes(c.ref), toNotes(c.est));
      expect(on.precision).toBeCloseTo(c.onset[0], 9);
      expect(on.recall).toBeCloseTo(c.onset[1], 9);
      expect(on.f1).toBeCloseTo(c.onset[2], 9);
      const oo = noteMetrics(toNotes(c.ref), toNotes(c.est), { offsetRatio: 0.2, offsetMinTolSec: 0.05 });
      expect(oo.f1).toBeCloseTo(c.onoff[2], 9);
    });
  });
  it("matching is one-to-one: two estimates on one reference count once", () => {
    const m = noteMetrics([{ onsetSec: 1, offsetSec: 2, midi: 60 }], [{ onsetSec: 1, offsetSec: 2, midi: 60 }, { onsetSec: 1.01, offsetSec: 2, midi: 60.1 }]);
    expect(m.matches.length).toBe(1);
    expect(m.precision).toBe(0.5);
  });
});
