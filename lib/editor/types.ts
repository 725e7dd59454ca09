/** A note as the piano roll edits it: the API's note (NAMES.md) plus a stable id for selection and undo. */
export type EditorNote = {
  id: string;
  onsetSec: number;
  offsetSec: number;
  /** MIDI note number, 0–127 (60 = C4). */
  pitch: number;
  cents: number;
  /** 1–127. */
  velocity: number;
  voice: number;
  /** The measured pitch trace: absolute times (s) and cents relative to `pitch`. */
  pitchCurve?: { timeSec: number[]; cents: number[] };
};

export type NoteList = readonly EditorNote[];

/** Snap grid: off, or a subdivision of the beat at a tempo (subdivision 4 = sixteenths in 4/4). */
export type SnapGrid = { kind: "off" } | { kind: "beat"; tempoBpm: number; subdivision: number };

/** The shortest note any edit may leave behind (s). */
export const MIN_NOTE_SEC = 0.01;
export const MIN_PITCH = 0;
export const MAX_PITCH = 127;
export const MIN_VELOCITY = 1;
export const MAX_VELOCITY = 127;
