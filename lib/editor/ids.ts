import type { EditorNote, NoteList } from "./types";

/**
 * `count` ids not used in `notes` ("n1", "n2", …, continuing past the highest numbered one).
 * Deterministic, so an edit replayed from the same list yields the same ids.
 */
export function freshIds(notes: NoteList, count: number): string[] {
  let max = 0;
  const used = new Set<string>();
  for (const n of notes) {
    used.add(n.id);
    const m = /^n(\d+)$/.exec(n.id);
    if (m) max = Math.max(max, Number(m[1]));
  }
  const out: string[] = [];
  for (let k = max + 1; out.length < count; k++) {
    const id = `n${k}`;
    if (!used.has(id)) out.push(id);
  }
  return out;
}

/** Gives ids ("n1", "n2", …) to notes that come without one, e.g. from the API. */
export function withIds<T extends Omit<EditorNote, "id">>(notes: readonly T[]): EditorNote[] {
  return notes.map((n, i) => ({ ...n, id: `n${i + 1}` }));
}

/** Drops the ids again, for saving (`PUT /api/v1/takes/{id}/notes`). */
export function withoutIds(notes: NoteList): Omit<EditorNote, "id">[] {
  return notes.map(({ id: _id, ...rest }) => rest);
}
