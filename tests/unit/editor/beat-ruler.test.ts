import { describe, expect, it } from "vitest";
import { barBeatAt, barLabelEvery, beatTicks, validMeter, MIN_BEAT_PX } from "@/components/piano-roll/ruler";

const m = { tempoBpm: 120, beatsPerBar: 4 }; // a beat is 0.5 s, a bar 2 s

describe("bars-and-beats ruler", () => {
  it("puts a tick on every beat, numbering bars and beats from 1", () => {
    const ticks = beatTicks(m, 0, 4, 200); // 100 px a beat: room for beat labels
    expect(ticks.map((t) => t.sec)).toEqual([0, 0.5, 1, 1.5, 2, 2.5, 3, 3.5, 4]);
    expect(ticks.map((t) => t.kind)).toEqual(["bar", "beat", "beat", "beat", "bar", "beat", "beat", "beat", "bar"]);
    expect(ticks.map((t) => t.label)).toEqual(["1", "1.2", "1.3", "1.4", "2", "2.2", "2.3", "2.4", "3"]);
  });

  it("leaves beats unlabelled when they crowd, and drops them below the minimum spacing", () => {
    const mid = beatTicks(m, 0, 4, 40); // 20 px a beat, 80 px a bar
    expect(mid.filter((t) => t.label).map((t) => t.label)).toEqual(["1", "2", "3"]);
    expect(mid.length).toBe(9);
    const far = beatTicks(m, 0, 40, 10); // 5 px a beat: bars only (20 px apart) — labels every 4 bars (80 px)
    expect(far.every((t) => t.kind === "bar")).toBe(true);
    expect(5).toBeLessThan(MIN_BEAT_PX);
    expect(far.filter((t) => t.label).map((t) => t.label)).toEqual(["1", "5", "9", "13", "17", "21"]);
    // labelled bars are at least 44 px apart
    expect(barLabelEvery(m, 10) * 2 * 10).toBeGreaterThanOrEqual(44);
  });

  it("starts at the window, not at 0", () => {
    const ticks = beatTicks(m, 10.2, 11.1, 200);
    expect(ticks[0]!.sec).toBe(10);
    expect(ticks.at(-1)!.sec).toBe(11);
    expect(ticks[0]).toMatchObject({ bar: 6, beat: 1, label: "6" });
  });

  it("follows the metre: 3 beats a bar at 90 bpm", () => {
    const w = { tempoBpm: 90, beatsPerBar: 3 };
    const ticks = beatTicks(w, 0, 4, 100);
    expect(ticks.filter((t) => t.kind === "bar").map((t) => t.sec)).toEqual([0, 2, 4]);
    expect(barBeatAt(w, 2 + 2 / 3)).toEqual({ bar: 2, beat: 2 });
  });

  it("gives nothing for a missing or silly tempo", () => {
    expect(validMeter({ tempoBpm: 0, beatsPerBar: 4 })).toBe(false);
    expect(validMeter({ tempoBpm: 120, beatsPerBar: 0 })).toBe(false);
    expect(beatTicks({ tempoBpm: Number.NaN, beatsPerBar: 4 }, 0, 10, 100)).toEqual([]);
  });
});
