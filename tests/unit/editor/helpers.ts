import type { EditorNote } from "@/lib/editor";
export { rng } from "../../support/random";

export function note(id: string, onsetSec: number, offsetSec: number, pitch: number, extra: Partial<EditorNote> = {}): EditorNote {
  return { id, onsetSec, offsetSec, pitch, cents: 0, velocity: 80, voice: 1, ...extra };
}

/** Deep-freezes a list so that any mutation by an operation throws in strict mode. */
export function frozen<T>(value: T): T {
  if (value && typeof value === "object") {
    Object.values(value as object).forEach(frozen);
    Object.freeze(value);
  }
  return value;
}
