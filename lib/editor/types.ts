import type { CurvedNoteEvent } from "../music/note";

/** A note as the piano roll edits it: the shared note event (with its pitch curve) plus a stable id for selection and undo. */
export type EditorNote = CurvedNoteEvent & { id: string };

export type NoteList = readonly EditorNote[];

/** Snap grid: off, or a subdivision of the beat at a tempo (subdivision 4 = sixteenths in 4/4). */
export type SnapGrid = { kind: "off" } | { kind: "beat"; tempoBpm: number; subdivision: number };

/** The shortest note any edit may leave behind (s). */
export const MIN_NOTE_SEC = 0.01;
export const MIN_PITCH = 0;
export const MAX_PITCH = 127;
export const MIN_VELOCITY = 1;
export const MAX_VELOCITY = 127;
