import { describe, expect, it } from "vitest";
import { leastSquaresSlope, tuningReport, vibrato, type ReportInputNote } from "@/lib/music/tuning-report";
import { ratioToCents } from "@/lib/music/intervals";
import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { rng } from "../../support/random";

const note = (pitch: number, cents: number, voice: number, onsetSec = 0, offsetSec = 2): ReportInputNote => ({
  onsetSec,
  offsetSec,
  pitch,
  cents,
  velocity: 80,
  voice,
});

// REFERENCES.md §4: 5:4 = 386.314 c, 3:2 = 701.955 c, 7:4 = 968.826 c.
const JUST_THIRD_BELOW_ET = 386.314 - 400;
const JUST_FIFTH_ABOVE_ET = 701.955 - 700;

describe("tuningReport on a constructed chord with known detuning", () => {
  it("C major with a just third, a flat fifth and a sharp octave", () => {
    const notes = [
      note(48, 0, 1), // C3 root, in tune
      note(64, JUST_THIRD_BELOW_ET, 2), // E4 a just major third (+ octave) above
      note(67, JUST_FIFTH_ABOVE_ET - 10, 3), // G4 10 c below a just fifth
      note(72, 3, 4), // C5 3 c sharp of the root's octaves
    ];
    const r = tuningReport(notes, 440);
    expect(r.referenceHz).toBe(440);
    expect(r.notes.map((n) => n.chord)).toEqual(["C", "C", "C", "C"]);
    // centsEqual is the engine's cents at 440 exactly (2-decimal rounding)
    expect(r.notes[1].centsEqual).toBeCloseTo(-13.686, 2);
    expect(Math.abs(r.notes[2].centsEqual - -8.045)).toBeLessThanOrEqual(0.0051); // rounded to 0.01 c
    // just third ≈ 0 against just, ≈ −13.7 against equal (issue 6)
    expect(r.notes[1].centsJust).toBeCloseTo(0, 2);
    expect(r.notes[0].centsJust).toBe(0);
    expect(r.notes[2].centsJust).toBeCloseTo(-10, 2);
    expect(r.notes[3].centsJust).toBeCloseTo(3, 2);
    expect(r.chords).toEqual([{ startSec: 0, endSec: 2, symbol: "C", rootPc: 0, quality: "major" }]);
  });

  it("measures against the root's sounding pitch, not the reference", () => {
    // the whole chord 6 c sharp, tuned just within itself
    const notes = [note(48, 6, 1), note(64, 6 + JUST_THIRD_BELOW_ET, 2), note(67, 6 + JUST_FIFTH_ABOVE_ET, 3)];
    const r = tuningReport(notes, 440);
    expect(r.notes.map((n) => n.centsJust)).toEqual([0, expect.closeTo(0, 2), expect.closeTo(0, 2)]);
    expect(r.notes.map((n) => n.centsEqual)).toEqual([6, expect.closeTo(-7.686, 2), expect.closeTo(7.955, 2)]);
  });

  it("inversions and sevenths: C/E with a just bass third, G7 with a 7:4 seventh", () => {
    const inverted = tuningReport([note(52, JUST_THIRD_BELOW_ET, 1), note(60, 0, 2), note(67, JUST_FIFTH_ABOVE_ET, 3)], 440);
    expect(inverted.notes[0].chord).toBe("C/E");
    expect(inverted.notes.map((n) => n.centsJust)).toEqual([expect.closeTo(0, 2), 0, expect.closeTo(0, 2)]);

    const seventh = ratioToCents(7, 4) - 1000; // −31.174 c
    const g7 = tuningReport(
      [note(43, 0, 1), note(59, JUST_THIRD_BELOW_ET, 2), note(62, JUST_FIFTH_ABOVE_ET, 3), note(65, seventh, 4)],
      440,
    );
    expect(g7.notes[0].chord).toBe("G7");
    expect(g7.notes.map((n) => n.centsJust)).toEqual([0, expect.closeTo(0, 2), expect.closeTo(0, 2), expect.closeTo(0, 2)]);
    expect(g7.notes[3].centsEqual).toBeCloseTo(-31.17, 2);
  });

  it("a note sounding alone has no chord and no centsJust; a bare dyad is measured above its lower note", () => {
    const r = tuningReport([note(60, 4, 1, 0, 1), note(60, 0, 1, 2, 3), note(67, JUST_FIFTH_ABOVE_ET + 1, 2, 2, 3), note(64, 0, 3, 2, 3)], 440);
    expect(r.notes[0]).toMatchObject({ chord: null, centsJust: null, centsEqual: 4 });
    const dyad = tuningReport([note(60, 0, 1), note(64, -10, 2)], 440);
    expect(dyad.notes[1]).toMatchObject({ chord: null });
    expect(dyad.notes[1].centsJust).toBeCloseTo(-10 - JUST_THIRD_BELOW_ET, 2);
  });

  it("reference pitch 442 Hz is +7.85 c (REFERENCES.md §4)", () => {
    const offset = 1200 * Math.log2(442 / 440);
    const r = tuningReport([note(69, offset, 1), note(69, offset - 5, 1, 2, 4)], 442);
    expect(r.referenceOffsetCents).toBeCloseTo(7.85, 2);
    expect(r.notes[0].centsEqual).toBeCloseTo(0, 2);
    expect(r.notes[1].centsEqual).toBeCloseTo(-5, 2);
    const r415 = tuningReport([note(69, 0, 1)], 415);
    expect(r415.referenceOffsetCents).toBeCloseTo(-101.3, 1); // REFERENCES.md §4
    expect(r415.notes[0].centsEqual).toBeCloseTo(101.3, 1);
  });
});

describe("tuningReport on the committed demo demo/chord-exercise.json", () => {
  it("names I–IV–V7–I and finds the alto's 14 c flat third close to just", () => {
    const demo = JSON.parse(readFileSync(fileURLToPath(new URL("../../../demo/chord-exercise.json", import.meta.url)), "utf8"));
    const r = tuningReport(demo.notes, 440);
    expect(r.chords.slice(0, 4).map((c) => c.symbol)).toEqual(["C", "F", "G7", "C"]);
    const altoThird = r.notes[1]; // E4 of the first C chord, cents −14 in the ground truth
    expect(altoThird).toMatchObject({ pitch: 64, voice: 2, centsEqual: -14, chord: "C" });
    expect(altoThird.centsJust).toBeCloseTo(-14 - JUST_THIRD_BELOW_ET, 2); // −0.31 c
    expect(r.voices.find((v) => v.voice === 2)).toMatchObject({ tendencyCents: -14, within10: 0 });
    expect(r.voices.find((v) => v.voice === 1)).toMatchObject({ tendencyCents: 0, within5: 1 });
  });
});

describe("tuning summary", () => {
  it("shares, mean absolute deviation, tendency and the worst notes", () => {
    const devs = [0, 3, -7, 12, -25];
    const r = tuningReport(devs.map((c, i) => note(60 + i, c, i < 3 ? 1 : 2, i, i + 0.5)), 440);
    expect(r.summary).toMatchObject({
      noteCount: 5,
      within5: 0.4,
      within10: 0.6,
      within20: 0.8,
      meanAbsCents: 9.4,
      tendencyCents: -3.4,
    });
    expect(r.summary.worst.map((w) => w.centsEqual)).toEqual([-25, 12, -7, 3, 0]);
    expect(r.summary.worst[0]).toMatchObject({ onsetSec: 4, noteIndex: 4, voice: 2 });
    expect(r.voices.map((v) => [v.voice, v.noteCount, v.within5])).toEqual([
      [1, 3, expect.closeTo(2 / 3, 4)],
      [2, 2, 0],
    ]);
  });

  it("drift: a sequence sagging 12 c per minute", () => {
    const random = rng(7);
    const notes = Array.from({ length: 120 }, (_, k) => {
      const t = k * 0.5;
      return note(60 + (k % 5), -0.2 * t + (random() - 0.5) * 2, 1, t, t + 0.4);
    });
    const r = tuningReport(notes, 440);
    expect(r.summary.driftCentsPerMin).toBeCloseTo(-12, 0);
    expect(r.summary.worst).toHaveLength(10);
    expect(leastSquaresSlope([0, 1, 2, 3], [1, 3, 5, 7])).toBe(2);
    expect(leastSquaresSlope([1, 1], [0, 5])).toBeNull();
  });

  it("an empty take has empty summaries", () => {
    const r = tuningReport([], 440);
    expect(r.summary).toMatchObject({ noteCount: 0, within5: null, meanAbsCents: null, driftCentsPerMin: null, worst: [] });
    expect(r.voices).toEqual([]);
  });
});

describe("vibrato", () => {
  const curve = (rateHz: number, extentCents: number, durationSec: number, hopSec: number, noiseCents = 0, driftCents = 0) => {
    const random = rng(11);
    const timeSec: number[] = [];
    const cents: number[] = [];
    for (let t = 0; t <= durationSec + 1e-9; t += hopSec) {
      timeSec.push(t);
      cents.push(extentCents * Math.sin(2 * Math.PI * rateHz * t + 0.3) + (driftCents * t) / durationSec + (random() - 0.5) * 2 * noiseCents);
    }
    return { timeSec, cents };
  };

  it("finds 5.5 Hz ± 30 c on a synthetic curve (10 ms hop, drift and noise)", () => {
    const v = vibrato(curve(5.5, 30, 1.5, 0.01, 1, -8));
    expect(v).not.toBeNull();
    expect(v!.rateHz).toBeCloseTo(5.5, 1);
    expect(Math.abs(v!.rateHz - 5.5)).toBeLessThan(0.08);
    expect(Math.abs(v!.extentCents - 30)).toBeLessThan(1.5);
  });

  it("over a grid of rates and hops", () => {
    for (const rateHz of [3.5, 5, 6.5, 8]) {
      for (const hopSec of [0.005, 0.01, 0.02]) {
        const v = vibrato(curve(rateHz, 20, 2, hopSec));
        expect(Math.abs(v!.rateHz - rateHz), `${rateHz} Hz, hop ${hopSec}`).toBeLessThan(0.05 * rateHz);
        expect(Math.abs(v!.extentCents - 20), `${rateHz} Hz, hop ${hopSec}`).toBeLessThan(1);
      }
    }
  });

  it("is null for a steady or noisy note and for a curve too short", () => {
    expect(vibrato(curve(0, 0, 1, 0.01, 1.5))).toBeNull();
    expect(vibrato(curve(5.5, 30, 0.15, 0.01))).toBeNull();
    expect(vibrato({ timeSec: [], cents: [] })).toBeNull();
  });

  it("appears on report notes that carry a pitch curve", () => {
    const withCurve = { ...note(67, 0, 1), pitchCurve: curve(5.5, 30, 1.5, 0.01) };
    const r = tuningReport([withCurve, note(60, 0, 2)], 440);
    expect(r.notes[0].vibrato?.rateHz).toBeCloseTo(5.5, 1);
    expect(r.notes[1].vibrato).toBeNull();
  });
});
