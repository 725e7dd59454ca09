import type { NoteList } from "./types";

export type Selection = ReadonlySet<string>;
export const EMPTY_SELECTION: Selection = new Set<string>();

/**
 * A click on a note (or on empty space, `id` null): without shift it selects only that note
 * (or nothing); with shift it toggles that note and keeps the rest.
 */
export function clickSelect(selection: Selection, id: string | null, shift: boolean): Selection {
  if (!shift) return id === null ? EMPTY_SELECTION : new Set([id]);
  if (id === null) return selection;
  const next = new Set(selection);
  if (next.has(id)) next.delete(id);
  else next.add(id);
  return next;
}

/** A time/pitch rectangle; the corners may come in either order. Pitch bounds are inclusive rows. */
export type Marquee = { t0Sec: number; t1Sec: number; pitchA: number; pitchB: number };

/** Ids of the notes that the rectangle touches (overlap in time, pitch row inside). */
export function notesInMarquee(notes: NoteList, m: Marquee): string[] {
  const t0 = Math.min(m.t0Sec, m.t1Sec);
  const t1 = Math.max(m.t0Sec, m.t1Sec);
  const p0 = Math.min(m.pitchA, m.pitchB);
  const p1 = Math.max(m.pitchA, m.pitchB);
  return notes.filter((n) => n.onsetSec <= t1 && n.offsetSec >= t0 && n.pitch >= p0 && n.pitch <= p1).map((n) => n.id);
}

/** Marquee selection: replaces the selection, or with shift adds to it. */
export function marqueeSelect(notes: NoteList, selection: Selection, m: Marquee, shift: boolean): Selection {
  const hit = notesInMarquee(notes, m);
  return new Set(shift ? [...selection, ...hit] : hit);
}

/** Keeps only ids that still exist (after an undo or a delete). */
export function pruneSelection(notes: NoteList, selection: Selection): Selection {
  if (selection.size === 0) return selection;
  const ids = new Set(notes.map((n) => n.id));
  const next = [...selection].filter((id) => ids.has(id));
  return next.length === selection.size ? selection : new Set(next);
}

export function sameSelection(a: Selection, b: Selection): boolean {
  if (a.size !== b.size) return false;
  for (const id of a) if (!b.has(id)) return false;
  return true;
}
