import { describe, expect, it } from "vitest";
import { EMPTY_SELECTION, clickSelect, marqueeSelect, notesInMarquee, pruneSelection, sameSelection } from "@/lib/editor";
import { frozen, note } from "./helpers";

const notes = frozen([note("a", 0, 1, 60), note("b", 1, 2, 64), note("c", 2.5, 3, 67), note("d", 0.2, 0.4, 48)]);

describe("selection", () => {
  it("a click selects one note; a click on empty space clears", () => {
    expect([...clickSelect(new Set(["a", "b"]), "c", false)]).toEqual(["c"]);
    expect(clickSelect(new Set(["a"]), null, false).size).toBe(0);
  });
  it("shift-click toggles one note and keeps the rest", () => {
    const s1 = clickSelect(new Set(["a"]), "b", true);
    expect([...s1].sort()).toEqual(["a", "b"]);
    expect([...clickSelect(s1, "a", true)]).toEqual(["b"]);
    expect(clickSelect(s1, null, true)).toBe(s1);
  });
  it("the marquee takes the notes it touches, corners in any order", () => {
    expect(notesInMarquee(notes, { t0Sec: 0.5, t1Sec: 1.5, pitchA: 59, pitchB: 65 }).sort()).toEqual(["a", "b"]);
    expect(notesInMarquee(notes, { t0Sec: 1.5, t1Sec: 0.5, pitchA: 65, pitchB: 59 }).sort()).toEqual(["a", "b"]);
    expect(notesInMarquee(notes, { t0Sec: 2.1, t1Sec: 2.4, pitchA: 0, pitchB: 127 })).toEqual([]);
    expect(notesInMarquee(notes, { t0Sec: 0, t1Sec: 5, pitchA: 48, pitchB: 48 })).toEqual(["d"]);
  });
  it("marquee replaces, shift-marquee adds", () => {
    const m = { t0Sec: 2.6, t1Sec: 2.7, pitchA: 60, pitchB: 70 };
    expect([...marqueeSelect(notes, new Set(["a"]), m, false)]).toEqual(["c"]);
    expect([...marqueeSelect(notes, new Set(["a"]), m, true)].sort()).toEqual(["a", "c"]);
  });
  it("prune drops ids that are gone and keeps the same object when none is", () => {
    const s = new Set(["a", "zz"]);
    expect([...pruneSelection(notes, s)]).toEqual(["a"]);
    const ok = new Set(["a"]);
    expect(pruneSelection(notes, ok)).toBe(ok);
    expect(pruneSelection(notes, EMPTY_SELECTION)).toBe(EMPTY_SELECTION);
  });
  it("sameSelection compares members", () => {
    expect(sameSelection(new Set(["a", "b"]), new Set(["b", "a"]))).toBe(true);
    expect(sameSelection(new Set(["a"]), new Set(["b"]))).toBe(false);
  });
});
