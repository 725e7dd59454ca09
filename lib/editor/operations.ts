/**
 * The piano roll's edits over a note list. Every function is pure: it returns a new list
 * (or the same list object when nothing changed, so a history can skip no-op edits) and
 * never mutates its input.
 */
import { gridStepSec, snapTime } from "./grid";
import { freshIds } from "./ids";
import { MAX_PITCH, MAX_VELOCITY, MIN_NOTE_SEC, MIN_PITCH, MIN_VELOCITY, type EditorNote, type NoteList, type SnapGrid } from "./types";

const clamp = (x: number, lo: number, hi: number) => Math.min(hi, Math.max(lo, x));
/** Times are kept to the microsecond so that repeated moves do not pile up float noise. */
const t6 = (x: number) => Math.round(x * 1e6) / 1e6;
/** The same grid of microseconds, rounded up or down, so that a minimum length survives the rounding. */
const up6 = (x: number) => Math.ceil(Math.round(x * 1e9) / 1e3) / 1e6;
const down6 = (x: number) => Math.floor(Math.round(x * 1e9) / 1e3) / 1e6;
const idSet = (ids: Iterable<string>) => (ids instanceof Set ? (ids as ReadonlySet<string>) : new Set(ids));

function shiftCurve(curve: EditorNote["pitchCurve"], deltaSec: number): EditorNote["pitchCurve"] {
  if (!curve || deltaSec === 0) return curve;
  return { timeSec: curve.timeSec.map((t) => t6(t + deltaSec)), cents: curve.cents };
}

function withCurve(n: EditorNote, curve: EditorNote["pitchCurve"]): EditorNote {
  if (curve) return { ...n, pitchCurve: curve };
  const { pitchCurve: _drop, ...rest } = n;
  return rest;
}

/** Part of a pitch curve between two times (inclusive), or nothing if no point falls inside. */
function sliceCurve(curve: EditorNote["pitchCurve"], fromSec: number, toSec: number): EditorNote["pitchCurve"] {
  if (!curve) return undefined;
  const timeSec: number[] = [];
  const cents: number[] = [];
  curve.timeSec.forEach((t, i) => {
    if (t >= fromSec && t <= toSec) {
      timeSec.push(t);
      cents.push(curve.cents[i] ?? 0);
    }
  });
  return timeSec.length ? { timeSec, cents } : undefined;
}

export type NewNote = Omit<EditorNote, "id"> & { id?: string };

/**
 * Draw: adds a note. Its onset is clamped to ≥ 0, its pitch to 0–127, its velocity to 1–127
 * and its length to at least `MIN_NOTE_SEC`. The id is `note.id` when given and free, else a fresh one.
 */
export function addNote(notes: NoteList, note: NewNote): EditorNote[] {
  const id = note.id && !notes.some((n) => n.id === note.id) ? note.id : freshIds(notes, 1)[0]!;
  const onsetSec = t6(Math.max(0, note.onsetSec));
  const offsetSec = Math.max(up6(onsetSec + MIN_NOTE_SEC), t6(note.offsetSec));
  return [
    ...notes,
    {
      ...note,
      id,
      onsetSec,
      offsetSec,
      pitch: clamp(Math.round(note.pitch), MIN_PITCH, MAX_PITCH),
      velocity: clamp(Math.round(note.velocity), MIN_VELOCITY, MAX_VELOCITY),
    },
  ];
}

/** Erase: removes the notes with these ids. */
export function removeNotes(notes: NoteList, ids: Iterable<string>): NoteList {
  const set = idSet(ids);
  if (set.size === 0) return notes;
  const next = notes.filter((n) => !set.has(n.id));
  return next.length === notes.length ? notes : next;
}

/**
 * Moves the notes by `deltaSec` and `deltaPitch` semitones as one group: the deltas are
 * clamped so that no onset goes below 0 s and no pitch leaves 0–127 (shapes between the
 * moved notes are kept). Pitch curves move with their notes in time.
 */
export function moveNotes(notes: NoteList, ids: Iterable<string>, deltaSec: number, deltaPitch: number): NoteList {
  const set = idSet(ids);
  const moving = notes.filter((n) => set.has(n.id));
  if (moving.length === 0) return notes;
  let dt = deltaSec;
  let dp = Math.round(deltaPitch);
  const minOnset = Math.min(...moving.map((n) => n.onsetSec));
  const minPitch = Math.min(...moving.map((n) => n.pitch));
  const maxPitch = Math.max(...moving.map((n) => n.pitch));
  dt = Math.max(dt, -minOnset);
  dp = clamp(dp, MIN_PITCH - minPitch, MAX_PITCH - maxPitch);
  if (dt === 0 && dp === 0) return notes;
  return notes.map((n) =>
    set.has(n.id)
      ? withCurve({ ...n, onsetSec: t6(n.onsetSec + dt), offsetSec: t6(n.offsetSec + dt), pitch: n.pitch + dp }, shiftCurve(n.pitchCurve, dt))
      : n,
  );
}

export type NoteEdge = "onset" | "offset";

/**
 * Stretches one end of each note by `deltaSec`: the onset stays ≥ 0 and every note keeps
 * at least `minLengthSec`.
 */
export function stretchNotes(
  notes: NoteList,
  ids: Iterable<string>,
  edge: NoteEdge,
  deltaSec: number,
  minLengthSec = MIN_NOTE_SEC,
): NoteList {
  const set = idSet(ids);
  if (set.size === 0 || deltaSec === 0) return notes;
  let changed = false;
  const next = notes.map((n) => {
    if (!set.has(n.id)) return n;
    let { onsetSec, offsetSec } = n;
    if (edge === "onset") onsetSec = Math.min(t6(Math.max(0, n.onsetSec + deltaSec)), Math.max(0, down6(n.offsetSec - minLengthSec)));
    else offsetSec = Math.max(t6(n.offsetSec + deltaSec), up6(n.onsetSec + minLengthSec));
    if (onsetSec === n.onsetSec && offsetSec === n.offsetSec) return n;
    changed = true;
    return { ...n, onsetSec, offsetSec };
  });
  return changed ? next : notes;
}

/**
 * Sets one end of a note to an absolute time (a drag on a note's end), with the same limits
 * as `stretchNotes`.
 */
export function setNoteEdge(notes: NoteList, id: string, edge: NoteEdge, timeSec: number, minLengthSec = MIN_NOTE_SEC): NoteList {
  const n = notes.find((x) => x.id === id);
  if (!n) return notes;
  const current = edge === "onset" ? n.onsetSec : n.offsetSec;
  return stretchNotes(notes, [id], edge, timeSec - current, minLengthSec);
}

/**
 * Splits a note at `atSec` into two notes of the same pitch, cents, velocity and voice; the
 * first keeps the id, the second gets `newId` (or a fresh one). Nothing happens when either
 * part would be shorter than `minLengthSec`.
 */
export function splitNote(notes: NoteList, id: string, atSec: number, newId?: string, minLengthSec = MIN_NOTE_SEC): NoteList {
  const i = notes.findIndex((n) => n.id === id);
  const n = notes[i];
  if (!n) return notes;
  const at = t6(atSec);
  if (at - n.onsetSec < minLengthSec - 1e-9 || n.offsetSec - at < minLengthSec - 1e-9) return notes;
  const second = newId && !notes.some((x) => x.id === newId) ? newId : freshIds(notes, 1)[0]!;
  const a = withCurve({ ...n, offsetSec: at }, sliceCurve(n.pitchCurve, n.onsetSec, at));
  const b = withCurve({ ...n, id: second, onsetSec: at }, sliceCurve(n.pitchCurve, at, n.offsetSec));
  return [...notes.slice(0, i), a, b, ...notes.slice(i + 1)];
}

/**
 * True when two notes may be joined: different notes of the same pitch with no other note
 * of that pitch starting between them.
 */
export function canJoin(notes: NoteList, idA: string, idB: string): boolean {
  if (idA === idB) return false;
  const a = notes.find((n) => n.id === idA);
  const b = notes.find((n) => n.id === idB);
  if (!a || !b || a.pitch !== b.pitch) return false;
  const [first, second] = a.onsetSec <= b.onsetSec ? [a, b] : [b, a];
  return !notes.some(
    (n) => n.id !== a.id && n.id !== b.id && n.pitch === a.pitch && n.onsetSec >= first.onsetSec && n.onsetSec <= second.onsetSec,
  );
}

/**
 * Joins two adjacent notes of the same pitch into one spanning both. The earlier note keeps
 * its id, velocity, cents and voice; pitch curves are concatenated. Unchanged when `canJoin` is false.
 */
export function joinNotes(notes: NoteList, idA: string, idB: string): NoteList {
  if (!canJoin(notes, idA, idB)) return notes;
  const a = notes.find((n) => n.id === idA)!;
  const b = notes.find((n) => n.id === idB)!;
  const [first, second] = a.onsetSec <= b.onsetSec ? [a, b] : [b, a];
  let curve: EditorNote["pitchCurve"];
  if (first.pitchCurve || second.pitchCurve) {
    const lastSec = first.pitchCurve?.timeSec.at(-1) ?? -Infinity;
    const timeSec = [...(first.pitchCurve?.timeSec ?? [])];
    const cents = [...(first.pitchCurve?.cents ?? [])];
    second.pitchCurve?.timeSec.forEach((t, i) => {
      if (t > lastSec) {
        timeSec.push(t);
        cents.push(second.pitchCurve!.cents[i] ?? 0);
      }
    });
    curve = { timeSec, cents };
  }
  const joined = withCurve({ ...first, offsetSec: Math.max(first.offsetSec, second.offsetSec) }, curve);
  return notes.filter((n) => n.id !== second.id).map((n) => (n.id === first.id ? joined : n));
}

/** Sets the velocity (clamped to 1–127, rounded) of these notes. */
export function setVelocity(notes: NoteList, ids: Iterable<string>, velocity: number): NoteList {
  const set = idSet(ids);
  const v = clamp(Math.round(velocity), MIN_VELOCITY, MAX_VELOCITY);
  let changed = false;
  const next = notes.map((n) => {
    if (!set.has(n.id) || n.velocity === v) return n;
    changed = true;
    return { ...n, velocity: v };
  });
  return changed ? next : notes;
}

/** Resets these notes' cents to 0 (exactly on the equal-tempered pitch). The measured pitch curve stays. */
export function resetCents(notes: NoteList, ids: Iterable<string>): NoteList {
  const set = idSet(ids);
  let changed = false;
  const next = notes.map((n) => {
    if (!set.has(n.id) || n.cents === 0) return n;
    changed = true;
    return { ...n, cents: 0 };
  });
  return changed ? next : notes;
}

/**
 * Snaps both ends of these notes to the grid. A note that would collapse keeps one grid
 * step of length. Unchanged when the grid is off.
 */
export function snapNotes(notes: NoteList, ids: Iterable<string>, grid: SnapGrid): NoteList {
  const step = gridStepSec(grid);
  if (step === null) return notes;
  const set = idSet(ids);
  let changed = false;
  const next = notes.map((n) => {
    if (!set.has(n.id)) return n;
    const onsetSec = snapTime(n.onsetSec, grid);
    let offsetSec = snapTime(n.offsetSec, grid);
    if (offsetSec - onsetSec < Math.max(step, MIN_NOTE_SEC) - 1e-9) offsetSec = up6(onsetSec + Math.max(step, MIN_NOTE_SEC));
    if (onsetSec === n.onsetSec && offsetSec === n.offsetSec) return n;
    changed = true;
    return withCurve({ ...n, onsetSec, offsetSec }, shiftCurve(n.pitchCurve, onsetSec - n.onsetSec));
  });
  return changed ? next : notes;
}

/** Copied notes, their times relative to the earliest onset (so `[0]` starts at 0 s). */
export type Clipboard = { notes: Omit<EditorNote, "id">[]; spanSec: number };

/** Copies these notes (in time order) to a clipboard; empty when none is selected. */
export function copyNotes(notes: NoteList, ids: Iterable<string>): Clipboard {
  const set = idSet(ids);
  const picked = notes.filter((n) => set.has(n.id)).sort((a, b) => a.onsetSec - b.onsetSec || a.pitch - b.pitch);
  if (picked.length === 0) return { notes: [], spanSec: 0 };
  const start = picked[0]!.onsetSec;
  const end = Math.max(...picked.map((n) => n.offsetSec));
  return {
    notes: picked.map(({ id: _id, ...n }) => {
      const moved = { ...n, onsetSec: t6(n.onsetSec - start), offsetSec: t6(n.offsetSec - start) };
      const curve = shiftCurve(n.pitchCurve, -start);
      if (curve) return { ...moved, pitchCurve: curve };
      const { pitchCurve: _drop, ...rest } = moved;
      return rest;
    }),
    spanSec: t6(end - start),
  };
}

/**
 * Pastes a clipboard with its first onset at `atSec` (≥ 0). The new notes get `ids` when
 * given (one per clipboard note, e.g. from `freshIds` so the caller can select them), else fresh ids.
 */
export function pasteNotes(notes: NoteList, clipboard: Clipboard, atSec: number, ids?: readonly string[]): NoteList {
  if (clipboard.notes.length === 0) return notes;
  const newIds = ids && ids.length === clipboard.notes.length ? ids : freshIds(notes, clipboard.notes.length);
  const at = Math.max(0, atSec);
  const pasted = clipboard.notes.map((n, i) =>
    withCurve({ ...n, id: newIds[i]!, onsetSec: t6(n.onsetSec + at), offsetSec: t6(n.offsetSec + at) }, shiftCurve(n.pitchCurve, at)),
  );
  return [...notes, ...pasted];
}

/** The next note of the same pitch after this one (by onset): the join tool's partner. */
export function nextOfPitch(notes: NoteList, id: string): EditorNote | undefined {
  const n = notes.find((x) => x.id === id);
  if (!n) return undefined;
  let best: EditorNote | undefined;
  for (const x of notes) {
    if (x.id === n.id || x.pitch !== n.pitch || x.onsetSec < n.onsetSec) continue;
    if (x.onsetSec === n.onsetSec && x.id < n.id) continue;
    if (!best || x.onsetSec < best.onsetSec) best = x;
  }
  return best;
}
