/**
 * A notes answer (`GET /api/v1/takes/{id}/notes`, with or without pitch curves) in a compact
 * form, for the take page's own HTML: its `notes` become one list of keys and a row of values
 * per note, so the keys are written once instead of once per note (a 5 000-note revision: about
 * a third of the JSON). Note fields are never null, so a null in a row stands for a field that
 * note does not have (a note without a pitch curve).
 */
export type NoteRows = { keys: string[]; rows: unknown[][] };

export type WithNoteRows<T extends { notes: readonly object[] }> = Omit<T, "notes"> & { notes: NoteRows };

export function toNoteRows<T extends { notes: readonly object[] }>(answer: T): WithNoteRows<T> {
  const keys: string[] = [];
  const column = new Map<string, number>();
  for (const note of answer.notes) {
    for (const key of Object.keys(note)) {
      if (!column.has(key)) {
        column.set(key, keys.length);
        keys.push(key);
      }
    }
  }
  const rows = answer.notes.map((note) => {
    const row: unknown[] = new Array(keys.length).fill(null);
    for (const [key, value] of Object.entries(note)) if (value !== undefined) row[column.get(key)!] = value;
    return row;
  });
  return { ...answer, notes: { keys, rows } };
}

export function fromNoteRows<T extends { notes: readonly object[] }>(compact: WithNoteRows<T>): T {
  const { keys, rows } = compact.notes;
  const notes = rows.map((row) => {
    const note: Record<string, unknown> = {};
    for (let i = 0; i < keys.length; i++) if (row[i] !== null && row[i] !== undefined) note[keys[i]!] = row[i];
    return note;
  });
  return { ...compact, notes } as unknown as T;
}
