import { describe, expect, it } from "vitest";
import { type NoteList, addNote, apply, canRedo, canUndo, createHistory, moveNotes, redo, removeNotes, reset, undo } from "@/lib/editor";
import { frozen, note } from "./helpers";

const start = frozen([note("n1", 0, 1, 60), note("n2", 1, 2, 62)]);

describe("history", () => {
  it("starts with nothing to undo or redo", () => {
    const h = createHistory<NoteList>(start);
    expect(h.present).toBe(start);
    expect(canUndo(h)).toBe(false);
    expect(canRedo(h)).toBe(false);
    expect(undo(h)).toBe(h);
    expect(redo(h)).toBe(h);
  });

  it("undo and redo walk back and forth through the edits", () => {
    let h = createHistory<NoteList>(start);
    const a = moveNotes(h.present, ["n1"], 0.5, 0);
    h = apply(h, a);
    const b = removeNotes(h.present, ["n2"]);
    h = apply(h, b);
    expect(h.present).toBe(b);
    h = undo(h);
    expect(h.present).toBe(a);
    h = undo(h);
    expect(h.present).toBe(start);
    expect(canUndo(h)).toBe(false);
    expect(canRedo(h)).toBe(true);
    h = redo(h);
    expect(h.present).toBe(a);
    h = redo(h);
    expect(h.present).toBe(b);
    expect(canRedo(h)).toBe(false);
  });

  it("a new edit after undo drops the redo branch", () => {
    let h = createHistory<NoteList>(start);
    h = apply(h, moveNotes(h.present, ["n1"], 0.5, 0));
    h = apply(h, moveNotes(h.present, ["n1"], 0.5, 0));
    h = undo(h);
    expect(canRedo(h)).toBe(true);
    const c = addNote(h.present, { onsetSec: 3, offsetSec: 4, pitch: 70, cents: 0, velocity: 80, voice: 1 });
    h = apply(h, c);
    expect(canRedo(h)).toBe(false);
    expect(redo(h).present).toBe(c);
    h = undo(undo(h));
    expect(h.present).toBe(start);
  });

  it("an edit that changes nothing is not recorded", () => {
    const h = createHistory<NoteList>(start);
    expect(apply(h, moveNotes(start, ["missing"], 1, 1))).toBe(h);
  });

  it("has no limit within a session", () => {
    let h = createHistory<NoteList>(start);
    for (let i = 0; i < 2000; i++) h = apply(h, moveNotes(h.present, ["n1"], 0.01, 0));
    expect(h.past).toHaveLength(2000);
    for (let i = 0; i < 2000; i++) h = undo(h);
    expect(h.present).toBe(start);
  });

  it("reset starts over from a value", () => {
    let h = apply(createHistory<NoteList>(start), removeNotes(start, ["n1"]));
    h = reset(h.present);
    expect(canUndo(h)).toBe(false);
  });
});
