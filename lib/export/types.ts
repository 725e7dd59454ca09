import type { NoteEvent } from "../music/note";

/** The note that every export writer takes: the API's note fields; extra fields (such as `pitchCurve`) are ignored. */
export type ExportNote = NoteEvent;

/** Time signature as [beats per measure, beat type]; the beat type is a power of two. */
export type TimeSignature = readonly [number, number];

export const DEFAULT_TIME_SIGNATURE: TimeSignature = [4, 4];

export function checkTimeSignature(ts: TimeSignature): void {
  const [beats, beatType] = ts;
  if (!Number.isInteger(beats) || beats < 1 || beats > 99) throw new RangeError(`time signature: ${beats} beats per measure is out of range 1 … 99`);
  if (![1, 2, 4, 8, 16, 32, 64].includes(beatType)) throw new RangeError(`time signature: beat type ${beatType} is not a power of two from 1 to 64`);
}

/** The distinct voices of a note list, ascending. */
export function voicesOf(notes: readonly ExportNote[]): number[] {
  return [...new Set(notes.map((n) => n.voice))].sort((a, b) => a - b);
}
