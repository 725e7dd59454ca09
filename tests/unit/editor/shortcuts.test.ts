import { describe, expect, it } from "vitest";
import { commandFor } from "@/components/editor/shortcuts";

describe("editor shortcuts", () => {
  it("undo and redo with Ctrl or Cmd, Shift for redo", () => {
    expect(commandFor({ key: "z", ctrlKey: true }, true)).toEqual({ kind: "undo" });
    expect(commandFor({ key: "z", metaKey: true }, true)).toEqual({ kind: "undo" });
    expect(commandFor({ key: "Z", ctrlKey: true, shiftKey: true }, true)).toEqual({ kind: "redo" });
    expect(commandFor({ key: "y", ctrlKey: true }, true)).toEqual({ kind: "redo" });
  });
  it("tools by letter, moves by arrow (Shift: an octave), delete and reset cents", () => {
    expect(commandFor({ key: "d" }, true)).toEqual({ kind: "tool", tool: "draw" });
    expect(commandFor({ key: "J" }, true)).toEqual({ kind: "tool", tool: "join" });
    expect(commandFor({ key: "ArrowUp", shiftKey: true }, true)).toEqual({ kind: "nudge", steps: 0, semitones: 12 });
    expect(commandFor({ key: "ArrowLeft" }, true)).toEqual({ kind: "nudge", steps: -1, semitones: 0 });
    expect(commandFor({ key: "Backspace" }, true)).toEqual({ kind: "delete" });
    expect(commandFor({ key: "0" }, true)).toEqual({ kind: "resetCents" });
  });
  it("leaves space to the transport and plain letters with Ctrl to the browser", () => {
    expect(commandFor({ key: " " }, true)).toBeNull();
    expect(commandFor({ key: "d", ctrlKey: true }, true)).toBeNull();
  });
  it("gives listeners only the selection's keys", () => {
    expect(commandFor({ key: "a", ctrlKey: true }, false)).toEqual({ kind: "selectAll" });
    expect(commandFor({ key: "Escape" }, false)).toEqual({ kind: "clearSelection" });
    for (const k of [{ key: "z", ctrlKey: true }, { key: "d" }, { key: "Delete" }, { key: "ArrowUp" }, { key: "v", ctrlKey: true }]) expect(commandFor(k, false)).toBeNull();
  });
});
