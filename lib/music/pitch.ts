/**
 * Pitch arithmetic for Tapernote (pure).
 *
 * 12-tone equal temperament: f = a4Hz · 2^((m − 69)/12), MIDI 69 = A4
 * (MIDI 1.0 specification; ISO 16 standard pitch A4 = 440 Hz).
 * Cents: 1200 · log2(f2 / f1).
 */

/** Standard reference pitch A4 in Hz (ISO 16). */
export const A4_STANDARD_HZ = 440;

/** Fractional MIDI number of a frequency: m = 69 + 12·log2(freqHz / a4Hz). */
export function hzToMidi(freqHz: number, a4Hz: number = A4_STANDARD_HZ): number {
  return 69 + 12 * Math.log2(freqHz / a4Hz);
}

/** Frequency in Hz of a (fractional) MIDI number: f = a4Hz · 2^((m − 69)/12). */
export function midiToHz(midiNote: number, a4Hz: number = A4_STANDARD_HZ): number {
  return a4Hz * Math.pow(2, (midiNote - 69) / 12);
}

/** Interval from f1 to f2 in cents: 1200·log2(f2/f1). */
export function centsBetween(f1Hz: number, f2Hz: number): number {
  return 1200 * Math.log2(f2Hz / f1Hz);
}

/**
 * Nearest equal-tempered MIDI note (at a4Hz) and the deviation from it in cents,
 * in [−50, +50).
 */
export function nearestNote(freqHz: number, a4Hz: number = A4_STANDARD_HZ): { midiNote: number; cents: number } {
  const m = hzToMidi(freqHz, a4Hz);
  const midiNote = Math.floor(m + 0.5);
  return { midiNote, cents: (m - midiNote) * 100 };
}

const SHARP_NAMES = ["C", "C♯", "D", "D♯", "E", "F", "F♯", "G", "G♯", "A", "A♯", "B"];
const FLAT_NAMES = ["C", "D♭", "D", "E♭", "E", "F", "G♭", "G", "A♭", "A", "B♭", "B"];

/** Scientific pitch name of an integer MIDI note (60 → "C4"; octave 4 starts at middle C). */
export function midiToNoteName(midiNote: number, spelling: "sharp" | "flat" = "sharp"): string {
  const m = Math.round(midiNote);
  const pc = ((m % 12) + 12) % 12;
  const octave = Math.floor(m / 12) - 1;
  return (spelling === "sharp" ? SHARP_NAMES : FLAT_NAMES)[pc] + octave;
}

/** Parse a scientific pitch name ("A4", "C#3", "Eb5", "B♭2") to a MIDI number; NaN if not a name. */
export function noteNameToMidi(name: string): number {
  const m = /^([A-Ga-g])([#♯b♭]?)(-?\d+)$/.exec(name.trim());
  if (!m) return NaN;
  const base: Record<string, number> = { c: 0, d: 2, e: 4, f: 5, g: 7, a: 9, b: 11 };
  let pc = base[m[1].toLowerCase()];
  if (m[2] === "#" || m[2] === "♯") pc += 1;
  if (m[2] === "b" || m[2] === "♭") pc -= 1;
  return (parseInt(m[3], 10) + 1) * 12 + pc;
}
