import { describe, expect, it } from "vitest";
import { decodeVlq, encodeVlq, VLQ_MAX } from "@/lib/export";

// The variable-length quantity examples printed in the MIDI 1.0 specification, "Standard MIDI
// Files 1.0", Conventions (../../../../shared/REFERENCES.md §6).
const SPEC_EXAMPLES: [number, number[]][] = [
  [0x00, [0x00]],
  [0x40, [0x40]],
  [0x7f, [0x7f]],
  [0x80, [0x81, 0x00]],
  [0x2000, [0xc0, 0x00]],
  [0x3fff, [0xff, 0x7f]],
  [0x4000, [0x81, 0x80, 0x00]],
  [0x100000, [0xc0, 0x80, 0x00]],
  [0x1fffff, [0xff, 0xff, 0x7f]],
  [0x200000, [0x81, 0x80, 0x80, 0x00]],
  [0x8000000, [0xc0, 0x80, 0x80, 0x00]],
  [0xfffffff, [0xff, 0xff, 0xff, 0x7f]],
];

describe("variable-length quantities (MIDI 1.0 specification examples)", () => {
  it.each(SPEC_EXAMPLES)("%i encodes as the specification's bytes", (value, bytes) => {
    expect([...encodeVlq(value)]).toEqual(bytes);
  });

  it.each(SPEC_EXAMPLES)("the specification's bytes for %i decode back", (value, bytes) => {
    expect(decodeVlq([0x99, ...bytes, 0x55], 1)).toEqual({ value, length: bytes.length });
  });

  it("round-trips every width boundary and a spread of values", () => {
    const values = [1, 127, 128, 16383, 16384, 2097151, 2097152, VLQ_MAX];
    for (let v = 3; v < VLQ_MAX; v = Math.floor(v * 1.37) + 11) values.push(v);
    for (const v of values) {
      const bytes = encodeVlq(v);
      expect(bytes.length).toBe(v < 0x80 ? 1 : v < 0x4000 ? 2 : v < 0x200000 ? 3 : 4);
      expect(decodeVlq(bytes)).toEqual({ value: v, length: bytes.length });
    }
  });

  it("refuses what a four-byte quantity cannot hold, and truncated or over-long input", () => {
    expect(() => encodeVlq(-1)).toThrow(RangeError);
    expect(() => encodeVlq(VLQ_MAX + 1)).toThrow(RangeError);
    expect(() => encodeVlq(1.5)).toThrow(RangeError);
    expect(() => decodeVlq([0x81])).toThrow(/truncated/);
    expect(() => decodeVlq([0x81, 0x80, 0x80, 0x80, 0x00])).toThrow(/four bytes/);
  });
});
