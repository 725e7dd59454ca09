/**
 * A note event as every part of Tapernote shares it (../../shared/NAMES.md): the engine writes
 * it, the API stores and serves it, the editor changes it, the export writers read it.
 */
export interface NoteEvent {
  onsetSec: number;
  offsetSec: number;
  /** MIDI note number 0 … 127: the equal-tempered note (A4 = 440 Hz) nearest the sounding pitch. */
  pitch: number;
  /** Deviation of the sounding pitch from `pitch`, in cents (−100 … 100). */
  cents: number;
  /** 1 … 127, from the note's level. */
  velocity: number;
  /** Voice number (the engine numbers voices from 1; 0 is allowed for imported notes). */
  voice: number;
}

/** The measured pitch of a note over time: absolute times (s) and cents from the note's `pitch`. */
export type PitchCurve = { timeSec: number[]; cents: number[] };

/** A note event with its pitch curve when there is one (`?curves=1`, the engine's drafts). */
export interface CurvedNoteEvent extends NoteEvent {
  pitchCurve?: PitchCurve;
}
