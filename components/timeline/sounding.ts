/**
 * What the notes sound like when Tapernote plays them back.
 *
 * The engine gives each note `pitch`, the nearest 12-TET MIDI number at A4 = 440 Hz, and `cents`,
 * the deviation from it (lib/engine/transcribe.ts). So the frequency a note sounded at is
 *
 *   f = 440 Hz · 2^((pitch + cents/100 − 69) / 12)
 *
 * (the equal-tempered scale from A4 = 440 Hz, ISO 16:1975; MIDI 69 = A4 by the MIDI 1.0
 * specification's note numbering). The take's `referenceHz` (its estimated or chosen A4) does
 * NOT enter: the cents are already measured against 440 Hz, so a take tuned to A4 = 442 Hz has
 * notes about +7.85 cents and sounds at 442 Hz again; scaling by referenceHz/440 as well would
 * count the tuning twice. referenceHz only matters for showing intonation "against the take's
 * own A4" (the tuning report), never for the frequency played.
 */
export function soundingHz(pitch: number, cents: number): number {
  return 440 * Math.pow(2, (pitch + cents / 100 - 69) / 12);
}

/** Cents of a note against another A4 (e.g. the take's referenceHz), for display. */
export function centsAgainst(cents: number, referenceHz: number): number {
  return cents - 1200 * Math.log2(referenceHz / 440);
}

export type ListenMode = "original" | "notes" | "both";
export const LISTEN_MODES: readonly ListenMode[] = ["original", "notes", "both"];

/** The level playback starts at (25 %): quiet, so a loud take does not harm anyone's ears. */
export const INITIAL_LEVEL = 0.25;

/**
 * Gains (0…1, before the master level) of the recording and of the notes for a listen mode and
 * a balance in −1 (recording only) … 0 (both full) … +1 (notes only). The balance only matters
 * in `both`.
 */
export function mixGains(mode: ListenMode, balance: number): { original: number; notes: number } {
  if (mode === "original") return { original: 1, notes: 0 };
  if (mode === "notes") return { original: 0, notes: 1 };
  const b = Math.max(-1, Math.min(1, balance));
  return { original: Math.min(1, 1 - b), notes: Math.min(1, 1 + b) };
}
