/**
 * The frequency a note actually sounded at: f = 440 · 2^((pitch + cents/100 − 69)/12), with
 * `cents` the engine's deviation from 12-TET at A4 = 440 Hz, so a flat note is played back flat.
 */
export function soundingHz(pitch: number, cents: number): number {
  return 440 * Math.pow(2, (pitch + cents / 100 - 69) / 12);
}

export type ListenMode = "original" | "notes" | "both";
export const LISTEN_MODES: readonly ListenMode[] = ["original", "notes", "both"];

/** The level playback starts at (25 %): quiet, so a loud take does not harm anyone's ears. */
export const INITIAL_LEVEL = 0.25;
