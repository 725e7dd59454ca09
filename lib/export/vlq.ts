/**
 * Variable-length quantities of the Standard MIDI File (MIDI 1.0 specification, "Standard MIDI
 * Files 1.0", section "Conventions"): 7 bits per byte, most significant group first, bit 7 set on
 * every byte but the last. Four bytes at most, so 0 … 0x0FFFFFFF.
 */

export const VLQ_MAX = 0x0fffffff;

/** Bytes of `value` (an integer 0 … 0x0FFFFFFF) as a variable-length quantity. */
export function encodeVlq(value: number): Uint8Array {
  if (!Number.isInteger(value) || value < 0 || value > VLQ_MAX) throw new RangeError(`VLQ: ${value} is not an integer in 0 … 0x0FFFFFFF`);
  const groups = [value & 0x7f];
  for (let v = value >>> 7; v > 0; v >>>= 7) groups.push((v & 0x7f) | 0x80);
  return Uint8Array.from(groups.reverse());
}

/**
 * Reads one variable-length quantity starting at `offset`.
 * Returns the value and the number of bytes it took; throws on a truncated or over-long quantity.
 */
export function decodeVlq(bytes: ArrayLike<number>, offset = 0): { value: number; length: number } {
  let value = 0;
  for (let i = 0; i < 4; i++) {
    if (offset + i >= bytes.length) throw new RangeError("VLQ: truncated quantity");
    const b = bytes[offset + i];
    value = (value << 7) | (b & 0x7f);
    if ((b & 0x80) === 0) return { value: value >>> 0, length: i + 1 };
  }
  throw new RangeError("VLQ: longer than four bytes");
}
