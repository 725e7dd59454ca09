import { describe, expect, it } from "vitest";
import { estimateKeyFifths, noteNameAscii, spelledToMidi, spellPitch } from "@/lib/export";
import { noteNameToMidi } from "@/lib/music/pitch";

// Reference: key signatures of the major keys (circle of fifths: sharps F C G D A E B, flats
// B E A D G C F) and scientific pitch notation (C4 = MIDI 60, MIDI 1.0 / ASA), as in any
// rudiments text; MusicXML 4.0 <step>/<alter>/<octave> (REFERENCES.md §6).

const scale = (tonic: number) => [0, 2, 4, 5, 7, 9, 11].map((d) => tonic + d);

describe("pitch spelling", () => {
  it.each([
    [60, 0], [67, 1], [62, 2], [69, 3], [64, 4], [71, 5], [66, 6],
    [65, -1], [70, -2], [63, -3], [68, -4], [61, -5],
  ])("a major scale on MIDI %i reads as the key with %i fifths", (tonic, fifths) => {
    expect(estimateKeyFifths(scale(tonic))).toBe(fifths);
  });

  it("spells in-key notes as the key does and others by the key's side", () => {
    const name = (midi: number, fifths: number) => noteNameAscii(spellPitch(midi, fifths));
    expect(name(70, 0)).toBe("A#4");
    expect(name(70, -1)).toBe("Bb4");
    expect(name(65, 6)).toBe("E#4"); // F♯ major
    expect(name(59, -6)).toBe("Cb4"); // G♭ major: C♭4 is MIDI 59
    expect(name(60, 6)).toBe("C4"); // out of F♯ major, a white key: natural
    expect(name(61, 1)).toBe("C#4");
    expect(name(63, -2)).toBe("Eb4");
    expect(name(21, 0)).toBe("A0");
    expect(name(0, 0)).toBe("C-1");
  });

  it("round-trips every MIDI note in every key", () => {
    for (let fifths = -6; fifths <= 6; fifths++)
      for (let midi = 0; midi <= 127; midi++) {
        const sp = spellPitch(midi, fifths);
        expect(spelledToMidi(sp)).toBe(midi);
        expect(Math.abs(sp.alter)).toBeLessThanOrEqual(1);
        expect(noteNameToMidi(noteNameAscii(sp))).toBe(midi); // lib/music's independent name parser
      }
  });
});
