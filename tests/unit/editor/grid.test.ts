import { describe, expect, it } from "vitest";
import { gridStepSec, snapTime } from "@/lib/editor";

describe("grid", () => {
  it("a step is 60 / tempo / subdivision seconds", () => {
    // 120 BPM: a beat is 0.5 s; sixteenths (4 per beat) are 0.125 s; 90 BPM triplets: 60/90/3 = 0.2222… s
    expect(gridStepSec({ kind: "beat", tempoBpm: 120, subdivision: 1 })).toBeCloseTo(0.5, 12);
    expect(gridStepSec({ kind: "beat", tempoBpm: 120, subdivision: 4 })).toBeCloseTo(0.125, 12);
    expect(gridStepSec({ kind: "beat", tempoBpm: 90, subdivision: 3 })).toBeCloseTo(2 / 9, 12);
    expect(gridStepSec({ kind: "off" })).toBeNull();
    expect(gridStepSec({ kind: "beat", tempoBpm: 0, subdivision: 4 })).toBeNull();
  });
  it("snaps to the nearest line, never below 0, and passes through when off", () => {
    const g = { kind: "beat", tempoBpm: 120, subdivision: 4 } as const;
    expect(snapTime(0.37, g)).toBe(0.375);
    expect(snapTime(0.06, g)).toBe(0);
    expect(snapTime(0.0625, g)).toBe(0.125); // halfway rounds up
    expect(snapTime(-0.3, g)).toBe(0);
    expect(snapTime(1.2345, { kind: "off" })).toBe(1.2345);
    expect(snapTime(-1, { kind: "off" })).toBe(0);
  });
});
