import type { EditorNote } from "@/lib/editor";

export function note(id: string, onsetSec: number, offsetSec: number, pitch: number, extra: Partial<EditorNote> = {}): EditorNote {
  return { id, onsetSec, offsetSec, pitch, cents: 0, velocity: 80, voice: 1, ...extra };
}

/** mulberry32: a small seeded PRNG so that the property checks are reproducible. */
export function rng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Deep-freezes a list so that any mutation by an operation throws in strict mode. */
export function frozen<T>(value: T): T {
  if (value && typeof value === "object") {
    Object.values(value as object).forEach(frozen);
    Object.freeze(value);
  }
  return value;
}
