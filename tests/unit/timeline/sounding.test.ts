import { describe, expect, it } from "vitest";
import { centsAgainst, mixGains, soundingHz } from "@/components/timeline/sounding";

// The published equal-tempered tuning: f(n) = 440 Hz · 2^((n − 69)/12) for MIDI note n (ISO 16:1975
// fixes A4 = 440 Hz; MIDI 1.0 numbers A4 as 69). Reference values from that formula as tabulated
// in "Piano key frequencies" (Wikipedia): A0 27.5000, C4 261.6256, E4 329.6276, A4 440, C8 4186.009.
describe("soundingHz against the 12-TET table", () => {
  it.each([
    [21, 27.5],
    [60, 261.6256],
    [64, 329.6276],
    [69, 440],
    [108, 4186.009],
  ])("MIDI %i → %f Hz", (pitch, hz) => {
    expect(soundingHz(pitch, 0)).toBeCloseTo(hz, 2);
  });

  it("a flat note sounds flat and a sharp one sharp, by the cents the engine measured", () => {
    // 1 cent is a frequency ratio of 2^(1/1200) (Ellis 1885)
    expect(soundingHz(69, -20)).toBeCloseTo(440 * 2 ** (-20 / 1200), 9); // 434.9 Hz
    expect(soundingHz(69, -20)).toBeLessThan(440);
    expect(soundingHz(64, 30)).toBeCloseTo(329.6276 * 2 ** (30 / 1200), 3); // 335.4 Hz
    // 50 cents flat of A4 is the quarter tone halfway (geometrically) to G♯4 = 415.3047 Hz
    expect(soundingHz(69, -50)).toBeCloseTo(Math.sqrt(440 * 415.3047), 2);
  });

  it("the take's reference pitch does not enter: cents are against 440 Hz already", () => {
    // a take tuned to A4 = 442 Hz: its A4s read +7.85 cents and sound at 442 Hz
    const cents = 1200 * Math.log2(442 / 440);
    expect(cents).toBeCloseTo(7.85, 2);
    expect(soundingHz(69, cents)).toBeCloseTo(442, 9);
    // against the take's own A4 the same note is in tune
    expect(centsAgainst(cents, 442)).toBeCloseTo(0, 9);
  });
});

describe("mixGains: listen modes and balance", () => {
  it("original and notes each play alone; both play both, the balance fading one side", () => {
    expect(mixGains("original", 0.7)).toEqual({ original: 1, notes: 0 });
    expect(mixGains("notes", -0.7)).toEqual({ original: 0, notes: 1 });
    expect(mixGains("both", 0)).toEqual({ original: 1, notes: 1 });
    expect(mixGains("both", 0.5)).toEqual({ original: 0.5, notes: 1 });
    expect(mixGains("both", -1)).toEqual({ original: 1, notes: 0 });
    expect(mixGains("both", 7)).toEqual({ original: 0, notes: 1 });
  });
});
