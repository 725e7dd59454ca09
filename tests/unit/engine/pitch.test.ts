import { describe, it, expect } from "vitest";
import { hzToMidi, midiToHz, centsBetween, midiToNoteName, noteNameToMidi, nearestNote } from "@/lib/music/pitch";

describe("pitch arithmetic (REFERENCES.md §4: MIDI 1.0 specification, ISO 16)", () => {
  it("MIDI 69 = A4 = 440 Hz, MIDI 60 = middle C = 261.626 Hz", () => {
    expect(midiToHz(69)).toBe(440);
    expect(midiToHz(60)).toBeCloseTo(261.626, 3);
    expect(hzToMidi(261.626)).toBeCloseTo(60, 4);
  });
  it("A4 = 442 Hz is +7.85 cents, 415 Hz is −101.3 cents (computed in REFERENCES.md §4)", () => {
    expect(centsBetween(440, 442)).toBeCloseTo(7.85, 2);
    expect(centsBetween(440, 415)).toBeCloseTo(-101.3, 1);
  });
  it("a steady 443 Hz tone is pitch 69, +11.8 cents (issue 3 example)", () => {
    const n = nearestNote(443);
    expect(n.midiNote).toBe(69);
    expect(n.cents).toBeCloseTo(11.76, 1);
  });
  it("just fifth 3:2 = 701.955 cents, major third 5:4 = 386.314 (REFERENCES.md §4)", () => {
    expect(centsBetween(200, 300)).toBeCloseTo(701.955, 3);
    expect(centsBetween(400, 500)).toBeCloseTo(386.314, 3);
  });
  it("note names: octave 4 starts at middle C (scientific pitch notation)", () => {
    expect(midiToNoteName(60)).toBe("C4");
    expect(midiToNoteName(69)).toBe("A4");
    expect(midiToNoteName(70, "flat")).toBe("B♭4");
    expect(noteNameToMidi("C#3")).toBe(49);
    expect(noteNameToMidi("Eb5")).toBe(75);
    expect(noteNameToMidi("H2")).toBeNaN();
  });
});
