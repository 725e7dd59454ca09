import { describe, expect, it } from "vitest";
import {
  MIN_NOTE_SEC,
  addNote,
  canJoin,
  copyNotes,
  freshIds,
  joinNotes,
  moveNotes,
  nextOfPitch,
  pasteNotes,
  removeNotes,
  resetCents,
  setNoteEdge,
  setVelocity,
  snapNotes,
  splitNote,
  stretchNotes,
  withIds,
  withoutIds,
} from "@/lib/editor";
import { frozen, note } from "./helpers";

const base = () =>
  frozen([
    note("n1", 0.5, 1.0, 60, { cents: -12, velocity: 70 }),
    note("n2", 1.0, 1.5, 64, { voice: 2 }),
    note("n3", 2.0, 2.5, 60, { pitchCurve: { timeSec: [2.0, 2.1, 2.2, 2.3, 2.4], cents: [-5, -4, -3, -2, -1] } }),
  ]);

describe("ids", () => {
  it("freshIds continues past the highest numbered id and skips used ones", () => {
    expect(freshIds(base(), 2)).toEqual(["n4", "n5"]);
    expect(freshIds([note("x", 0, 1, 60)], 1)).toEqual(["n1"]);
    expect(freshIds([], 0)).toEqual([]);
  });
  it("withIds / withoutIds round-trip the API's notes", () => {
    const api = [{ onsetSec: 0, offsetSec: 1, pitch: 60, cents: 3, velocity: 90, voice: 1 }];
    const ed = withIds(api);
    expect(ed[0]!.id).toBe("n1");
    expect(withoutIds(ed)).toEqual(api);
  });
});

describe("addNote (draw)", () => {
  it("appends a note with a fresh id and leaves the input alone", () => {
    const notes = base();
    const next = addNote(notes, { onsetSec: 3, offsetSec: 3.5, pitch: 67, cents: 0, velocity: 80, voice: 1 });
    expect(next).toHaveLength(4);
    expect(next[3]).toMatchObject({ id: "n4", onsetSec: 3, offsetSec: 3.5, pitch: 67 });
    expect(notes).toHaveLength(3);
  });
  it("keeps a given free id, replaces a taken one", () => {
    const mk = (id: string) => addNote(base(), { id, onsetSec: 0, offsetSec: 1, pitch: 60, cents: 0, velocity: 80, voice: 1 }).at(-1)!.id;
    expect(mk("mine")).toBe("mine");
    expect(mk("n2")).toBe("n4");
  });
  it("clamps onset ≥ 0, pitch 0–127, velocity 1–127 and the minimum length", () => {
    const n = addNote([], { onsetSec: -1, offsetSec: -0.5, pitch: 140, cents: 0, velocity: 0, voice: 1 })[0]!;
    expect(n.onsetSec).toBe(0);
    expect(n.offsetSec).toBeCloseTo(MIN_NOTE_SEC, 9);
    expect(n.pitch).toBe(127);
    expect(n.velocity).toBe(1);
    expect(addNote([], { onsetSec: 0, offsetSec: 1, pitch: -3, cents: 0, velocity: 200, voice: 1 })[0]).toMatchObject({ pitch: 0, velocity: 127 });
  });
});

describe("removeNotes (erase)", () => {
  it("removes the given ids", () => {
    expect(removeNotes(base(), ["n1", "n3"]).map((n) => n.id)).toEqual(["n2"]);
  });
  it("returns the same list when nothing matches", () => {
    const notes = base();
    expect(removeNotes(notes, ["nope"])).toBe(notes);
    expect(removeNotes(notes, [])).toBe(notes);
  });
});

describe("moveNotes", () => {
  it("moves the selected notes in time and pitch, with their pitch curves", () => {
    const notes = base();
    const next = moveNotes(notes, ["n3"], 0.25, 2);
    const n3 = next.find((n) => n.id === "n3")!;
    expect(n3).toMatchObject({ onsetSec: 2.25, offsetSec: 2.75, pitch: 62 });
    expect(n3.pitchCurve!.timeSec[0]).toBeCloseTo(2.25, 9);
    expect(n3.pitchCurve!.cents).toEqual([-5, -4, -3, -2, -1]);
    expect(next[0]).toBe(notes[0]); // untouched notes are shared, not copied
  });
  it("clamps the group so no onset goes below 0 (the shape between notes is kept)", () => {
    const next = moveNotes(base(), ["n1", "n2"], -2, 0);
    expect(next[0]!.onsetSec).toBe(0);
    expect(next[1]!.onsetSec).toBeCloseTo(0.5, 9);
    expect(next[0]!.offsetSec - next[0]!.onsetSec).toBeCloseTo(0.5, 9);
  });
  it("clamps pitch to 0–127 as a group", () => {
    const up = moveNotes(base(), ["n1", "n2"], 0, 100);
    expect(up.map((n) => n.pitch).slice(0, 2)).toEqual([123, 127]);
    const down = moveNotes(base(), ["n1", "n2"], 0, -100);
    expect(down.map((n) => n.pitch).slice(0, 2)).toEqual([0, 4]);
  });
  it("a move that clamps to nothing returns the same list", () => {
    const notes = frozen([note("a", 0, 1, 127)]);
    expect(moveNotes(notes, ["a"], -1, 1)).toBe(notes);
  });
});

describe("stretchNotes / setNoteEdge", () => {
  it("moves the end, never shorter than the minimum", () => {
    expect(stretchNotes(base(), ["n1"], "offset", 0.5)[0]).toMatchObject({ onsetSec: 0.5, offsetSec: 1.5 });
    expect(stretchNotes(base(), ["n1"], "offset", -5)[0]!.offsetSec).toBeCloseTo(0.5 + MIN_NOTE_SEC, 9);
  });
  it("moves the start, never below 0 and never past offset − minimum", () => {
    expect(stretchNotes(base(), ["n1"], "onset", -0.2)[0]).toMatchObject({ onsetSec: 0.3, offsetSec: 1 });
    expect(stretchNotes(base(), ["n1"], "onset", -3)[0]!.onsetSec).toBe(0);
    expect(stretchNotes(base(), ["n1"], "onset", 3)[0]!.onsetSec).toBeCloseTo(1 - MIN_NOTE_SEC, 9);
  });
  it("honours a caller's minimum length", () => {
    expect(stretchNotes(base(), ["n1"], "offset", -5, 0.1)[0]!.offsetSec).toBeCloseTo(0.6, 9);
  });
  it("setNoteEdge sets an absolute time", () => {
    expect(setNoteEdge(base(), "n2", "offset", 2)[1]!.offsetSec).toBe(2);
    expect(setNoteEdge(base(), "n2", "onset", 0.25)[1]!.onsetSec).toBe(0.25);
    const notes = base();
    expect(setNoteEdge(notes, "nope", "onset", 0)).toBe(notes);
  });
});

describe("splitNote", () => {
  it("splits into two notes with the same pitch, cents, velocity, voice; the pitch curve is divided", () => {
    const next = splitNote(base(), "n3", 2.2);
    expect(next.map((n) => n.id)).toEqual(["n1", "n2", "n3", "n4"]);
    const [a, b] = [next[2]!, next[3]!];
    expect(a).toMatchObject({ onsetSec: 2, offsetSec: 2.2, pitch: 60 });
    expect(b).toMatchObject({ onsetSec: 2.2, offsetSec: 2.5, pitch: 60, velocity: a.velocity, cents: a.cents, voice: a.voice });
    expect(a.pitchCurve!.timeSec).toEqual([2.0, 2.1, 2.2]);
    expect(b.pitchCurve!.timeSec).toEqual([2.2, 2.3, 2.4]);
  });
  it("uses a given new id", () => {
    expect(splitNote(base(), "n1", 0.75, "half")[1]!.id).toBe("half");
  });
  it("does nothing outside the note or too close to an end", () => {
    const notes = base();
    expect(splitNote(notes, "n1", 0.2)).toBe(notes);
    expect(splitNote(notes, "n1", 0.505)).toBe(notes);
    expect(splitNote(notes, "n1", 1.2)).toBe(notes);
    expect(splitNote(notes, "nope", 0.7)).toBe(notes);
  });
});

describe("joinNotes", () => {
  it("joins two notes of the same pitch into one spanning both; the earlier keeps its id", () => {
    const split = splitNote(base(), "n3", 2.2);
    const joined = joinNotes(split, "n4", "n3");
    expect(joined).toHaveLength(3);
    expect(joined[2]).toMatchObject({ id: "n3", onsetSec: 2, offsetSec: 2.5 });
    expect(joined[2]!.pitchCurve).toEqual(base()[2]!.pitchCurve);
  });
  it("split then join gives back the note", () => {
    expect(joinNotes(splitNote(base(), "n3", 2.3), "n3", "n4")).toEqual(base());
  });
  it("joins across a gap, keeping the first note's velocity and cents", () => {
    const joined = joinNotes(base(), "n1", "n3");
    expect(joined).toHaveLength(2);
    expect(joined[0]).toMatchObject({ id: "n1", onsetSec: 0.5, offsetSec: 2.5, cents: -12, velocity: 70 });
    expect(joined[0]!.pitchCurve!.timeSec).toEqual([2.0, 2.1, 2.2, 2.3, 2.4]);
  });
  it("refuses different pitches, the same note, and notes with another of their pitch between", () => {
    const notes = frozen([...base(), note("n9", 1.5, 1.8, 60)]);
    expect(canJoin(notes, "n1", "n2")).toBe(false);
    expect(canJoin(notes, "n1", "n1")).toBe(false);
    expect(canJoin(notes, "n1", "n3")).toBe(false);
    expect(canJoin(notes, "n9", "n3")).toBe(true);
    expect(joinNotes(notes, "n1", "n2")).toBe(notes);
  });
});

describe("setVelocity / resetCents", () => {
  it("sets velocity, clamped and rounded", () => {
    expect(setVelocity(base(), ["n1", "n2"], 100.4).map((n) => n.velocity)).toEqual([100, 100, 80]);
    expect(setVelocity(base(), ["n1"], 500)[0]!.velocity).toBe(127);
    expect(setVelocity(base(), ["n1"], -4)[0]!.velocity).toBe(1);
    const notes = base();
    expect(setVelocity(notes, ["n2"], 80)).toBe(notes);
  });
  it("resets cents to 0 and keeps the measured curve", () => {
    const next = resetCents(base(), ["n1", "n3"]);
    expect(next[0]!.cents).toBe(0);
    expect(next[2]!.pitchCurve).toEqual(base()[2]!.pitchCurve);
    const notes = base();
    expect(resetCents(notes, ["n2"])).toBe(notes);
  });
});

describe("snapNotes", () => {
  // 120 BPM, subdivision 4: one step = 60 / 120 / 4 = 0.125 s
  const grid = { kind: "beat", tempoBpm: 120, subdivision: 4 } as const;
  it("snaps both ends to the nearest grid line", () => {
    const next = snapNotes(frozen([note("a", 0.51, 1.07, 60)]), ["a"], grid);
    expect(next[0]).toMatchObject({ onsetSec: 0.5, offsetSec: 1.125 });
  });
  it("keeps one step of length for a note that would collapse", () => {
    const next = snapNotes(frozen([note("a", 0.51, 0.53, 60)]), ["a"], grid);
    expect(next[0]).toMatchObject({ onsetSec: 0.5, offsetSec: 0.625 });
  });
  it("leaves the list alone when the grid is off or the notes are on it", () => {
    const notes = frozen([note("a", 0.5, 1, 60)]);
    expect(snapNotes(notes, ["a"], { kind: "off" })).toBe(notes);
    expect(snapNotes(notes, ["a"], grid)).toBe(notes);
  });
});

describe("copyNotes / pasteNotes", () => {
  it("copies relative to the earliest onset and pastes at a time with fresh ids", () => {
    const clip = copyNotes(base(), ["n3", "n1"]);
    expect(clip.notes.map((n) => n.onsetSec)).toEqual([0, 1.5]);
    expect(clip.spanSec).toBeCloseTo(2, 9);
    expect(clip.notes[1]!.pitchCurve!.timeSec[0]).toBeCloseTo(1.5, 9);
    const next = pasteNotes(base(), clip, 4);
    expect(next).toHaveLength(5);
    expect(next.slice(3)).toMatchObject([
      { id: "n4", onsetSec: 4, offsetSec: 4.5, pitch: 60, cents: -12 },
      { id: "n5", onsetSec: 5.5, offsetSec: 6, pitch: 60 },
    ]);
    expect(next[4]!.pitchCurve!.timeSec[0]).toBeCloseTo(5.5, 9);
  });
  it("pastes with the caller's ids and never before 0 s", () => {
    const clip = copyNotes(base(), ["n2"]);
    const next = pasteNotes(base(), clip, -3, ["p1"]);
    expect(next[3]).toMatchObject({ id: "p1", onsetSec: 0, offsetSec: 0.5, voice: 2 });
  });
  it("an empty clipboard pastes nothing", () => {
    const notes = base();
    expect(copyNotes(notes, [])).toEqual({ notes: [], spanSec: 0 });
    expect(pasteNotes(notes, copyNotes(notes, []), 1)).toBe(notes);
  });
});

describe("nextOfPitch (the join tool's partner)", () => {
  it("finds the next note of the same pitch by onset", () => {
    const notes = frozen([...base(), note("n9", 3, 3.5, 60), note("n8", 0, 0.2, 60)]);
    expect(nextOfPitch(notes, "n1")?.id).toBe("n3");
    expect(nextOfPitch(notes, "n3")?.id).toBe("n9");
    expect(nextOfPitch(notes, "n9")).toBeUndefined();
    expect(nextOfPitch(notes, "n2")).toBeUndefined();
    expect(nextOfPitch(notes, "nope")).toBeUndefined();
    expect(canJoin(notes, "n1", nextOfPitch(notes, "n1")!.id)).toBe(true);
  });
});
