import { describe, expect, it } from "vitest";
import { JUST, JUST_INTERVALS, SYNTONIC_COMMA_CENTS, justCentsAbove, justIntervalFor, ratioToCents } from "@/lib/music/intervals";

describe("just intervals from their ratios", () => {
  it("match REFERENCES.md §4 (computed from the ratios) to 0.001 c", () => {
    const table: [number, number, number][] = [
      [5, 4, 386.314],
      [6, 5, 315.641],
      [3, 2, 701.955],
      [4, 3, 498.045],
      [5, 3, 884.359],
      [8, 5, 813.686],
      [7, 4, 968.826],
      [9, 8, 203.91],
    ];
    for (const [n, d, cents] of table) expect(Math.abs(ratioToCents(n, d) - cents), `${n}:${d}`).toBeLessThan(0.0006);
    expect(Math.abs(SYNTONIC_COMMA_CENTS - 21.506)).toBeLessThan(0.0006);
    expect(ratioToCents(2)).toBe(1200);
  });

  it("the syntonic comma is four just fifths against a just third plus two octaves", () => {
    expect(4 * JUST.perfectFifth.cents - (JUST.majorThird.cents + 2400)).toBeCloseTo(SYNTONIC_COMMA_CENTS, 9);
  });

  it("the table is ordered and its deviations from equal temperament are consistent", () => {
    for (let i = 1; i < JUST_INTERVALS.length; i++) expect(JUST_INTERVALS[i].cents).toBeGreaterThan(JUST_INTERVALS[i - 1].cents);
    for (const j of JUST_INTERVALS) {
      expect(j.deviationFromEqualCents).toBeCloseTo(j.cents - 100 * j.semitones, 9);
      expect(Math.abs(j.deviationFromEqualCents)).toBeLessThan(50);
    }
    expect(JUST.majorThird.deviationFromEqualCents).toBeCloseTo(-13.686, 3);
  });
});

describe("just interval above a root by chord quality", () => {
  it("chooses the intervals of the documented table", () => {
    expect(justIntervalFor(4, "major")).toBe(JUST.majorThird);
    expect(justIntervalFor(3, "minor")).toBe(JUST.minorThird);
    expect(justIntervalFor(7, "major")).toBe(JUST.perfectFifth);
    expect(justIntervalFor(10, "dominant")).toBe(JUST.harmonicSeventh); // 7:4
    expect(justIntervalFor(10, "minor-seventh")).toBe(JUST.minorSeventh); // 9:5
    expect(justIntervalFor(10, null)).toBe(JUST.minorSeventh);
    expect(justIntervalFor(6, "diminished")).toBe(JUST.diminishedFifth);
    expect(justIntervalFor(6, null)).toBe(JUST.augmentedFourth);
    expect(justIntervalFor(8, "augmented")).toBe(JUST.augmentedFifth);
    expect(justIntervalFor(9, "diminished-seventh")).toBe(JUST.diminishedSeventh);
    expect(justIntervalFor(9, "major-sixth")).toBe(JUST.majorSixth);
    expect(justIntervalFor(11, "major-seventh")).toBe(JUST.majorSeventh);
  });

  it("adds octaves above and below the root", () => {
    expect(justCentsAbove(16, "major")).toBeCloseTo(1586.314, 3);
    expect(justCentsAbove(-8, "major")).toBeCloseTo(-813.686, 3); // E below C in C/E: 8:5 down
    expect(justCentsAbove(-12, "major")).toBe(-1200);
    expect(justCentsAbove(0, "minor")).toBe(0);
  });
});
