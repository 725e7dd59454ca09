import { describe, expect, it } from "vitest";
import { buildTimeIndex, soundingAt, summarise, visibleNotes, visibleSlice } from "@/lib/editor";
import { note, rng } from "./helpers";

describe("visible-range search", () => {
  it("finds exactly the notes overlapping a window, as a full scan does", () => {
    const rand = rng(5);
    // 5 000 notes over 10 minutes, a few long ones
    const notes = Array.from({ length: 5000 }, (_, i) => {
      const on = rand() * 600;
      const len = rand() < 0.01 ? 5 + rand() * 20 : 0.05 + rand() * 1.5;
      return note(`n${i + 1}`, on, on + len, 40 + Math.floor(rand() * 40));
    });
    const index = buildTimeIndex(notes);
    for (let k = 0; k < 200; k++) {
      const t0 = rand() * 620 - 10;
      const t1 = t0 + rand() * 30;
      const got = visibleNotes(notes, index, t0, t1).sort((a, b) => a - b);
      const want = notes.map((n, i) => (n.onsetSec <= t1 && n.offsetSec >= t0 ? i : -1)).filter((i) => i >= 0);
      expect(got).toEqual(want);
      // and it looks at far fewer notes than all of them
      const { from, to } = visibleSlice(index, t0, t1);
      expect(to - from).toBeLessThan(notes.length / 5);
    }
  });

  it("an empty list has an empty slice", () => {
    const index = buildTimeIndex([]);
    expect(visibleSlice(index, 0, 10)).toEqual({ from: 0, to: 0 });
  });

  it("orders ties by list position", () => {
    const notes = [note("a", 1, 2, 60), note("b", 0, 1, 60), note("c", 1, 3, 62)];
    expect([...buildTimeIndex(notes).order]).toEqual([1, 0, 2]);
  });
});

describe("notes sounding at a time (?t= links)", () => {
  const notes = [note("n1", 0, 1, 60), note("n2", 0.98, 2, 64), note("n3", 1, 1.5, 67)];
  it("includes notes starting up to 50 ms after it and excludes notes that ended", () => {
    expect(soundingAt(notes, 0.94).map((n) => n.id)).toEqual(["n1", "n2"]);
    expect(soundingAt(notes, 1).map((n) => n.id)).toEqual(["n2", "n3"]);
    expect(soundingAt(notes, 2).map((n) => n.id)).toEqual([]);
  });
});

describe("the inspector's summary of the selection", () => {
  const notes = [note("n1", 0, 1, 60, { velocity: 70, cents: -12 }), note("n2", 1, 1.5, 64, { velocity: 90, cents: 8, voice: 2 }), note("n3", 2, 3, 67)];
  it("gives ranges over the selected notes only", () => {
    const s = summarise(notes, new Set(["n1", "n2"]))!;
    expect(s.count).toBe(2);
    expect(s.pitch).toEqual({ min: 60, max: 64 });
    expect(s.lengthSec).toEqual({ min: 0.5, max: 1 });
    expect(s.velocity).toEqual({ min: 70, max: 90 });
    expect(s.cents).toEqual({ min: -12, max: 8 });
    expect(s.voices).toEqual([1, 2]);
  });
  it("is null for no selection, or a selection of ids that are gone", () => {
    expect(summarise(notes, new Set())).toBeNull();
    expect(summarise(notes, new Set(["x"]))).toBeNull();
  });
});
