/**
 * Pitch spelling for notation and note names: which letter and alteration a MIDI note is written
 * with. The rule, kept simple on purpose:
 *  1. Key: of the 13 major keys with 0 … 6 sharps or flats (circle of fifths, `fifths` −6 … 6),
 *     the one whose scale holds the most notes of the take; a tie goes to the key with fewer
 *     sharps or flats, then to sharps (so F♯ major over G♭ major).
 *  2. A pitch class in the key's scale is spelled as the key spells it (E♯ in F♯ major, C♭ in
 *     G♭ major).
 *  3. Any other pitch class: a white key is written natural; a black key with a sharp in keys
 *     with sharps (and C major), with a flat in keys with flats.
 * Octave numbers are scientific (4 = the octave from middle C, MIDI 60 = C4), counted by letter,
 * so MIDI 59 spelled C♭ is C♭4 and MIDI 60 spelled B♯ is B♯3.
 */

export type Step = "C" | "D" | "E" | "F" | "G" | "A" | "B";

export interface SpelledPitch {
  step: Step;
  /** −1, 0 or +1 semitones (MusicXML `<alter>`). */
  alter: number;
  /** Scientific octave number (MusicXML `<octave>`). */
  octave: number;
}

const STEPS: Step[] = ["C", "D", "E", "F", "G", "A", "B"];
const NATURAL_PC: Record<Step, number> = { C: 0, D: 2, E: 4, F: 5, G: 7, A: 9, B: 11 };
const SHARP_ORDER: Step[] = ["F", "C", "G", "D", "A", "E", "B"];
const FLAT_ORDER: Step[] = ["B", "E", "A", "D", "G", "C", "F"];
const MAJOR_SCALE = [0, 2, 4, 5, 7, 9, 11];

const pcOf = (midi: number) => ((Math.round(midi) % 12) + 12) % 12;

/** The alteration the key signature gives each letter. */
function keyAlters(fifths: number): Record<Step, number> {
  const alters: Record<Step, number> = { C: 0, D: 0, E: 0, F: 0, G: 0, A: 0, B: 0 };
  if (fifths > 0) for (const s of SHARP_ORDER.slice(0, fifths)) alters[s] = 1;
  if (fifths < 0) for (const s of FLAT_ORDER.slice(0, -fifths)) alters[s] = -1;
  return alters;
}

/** Major key (−6 … 6 on the circle of fifths) whose scale holds the most of these MIDI notes. */
export function estimateKeyFifths(pitches: Iterable<number>): number {
  const counts = new Array<number>(12).fill(0);
  for (const p of pitches) counts[pcOf(p)]++;
  let best = 0;
  let bestIn = -1;
  // fewest accidentals first, sharps before flats: 0, 1, −1, 2, −2, …
  for (const fifths of [0, 1, -1, 2, -2, 3, -3, 4, -4, 5, -5, 6, -6]) {
    const tonic = pcOf(7 * fifths);
    const inScale = MAJOR_SCALE.reduce((sum, d) => sum + counts[(tonic + d) % 12], 0);
    if (inScale > bestIn) {
      bestIn = inScale;
      best = fifths;
    }
  }
  return best;
}

/** Letter, alteration and octave of a MIDI note in the key with `fifths` sharps (> 0) or flats (< 0). */
export function spellPitch(midi: number, fifths: number): SpelledPitch {
  const m = Math.round(midi);
  const pc = pcOf(m);
  const alters = keyAlters(Math.max(-6, Math.min(6, Math.round(fifths))));
  let step: Step | undefined = STEPS.find((s) => pcOf(NATURAL_PC[s] + alters[s]) === pc);
  let alter = step ? alters[step] : 0;
  if (!step) {
    step = STEPS.find((s) => NATURAL_PC[s] === pc);
    alter = 0;
    if (!step) {
      alter = fifths < 0 ? -1 : 1;
      step = STEPS.find((s) => NATURAL_PC[s] === pc - alter)!;
    }
  }
  const octave = Math.floor((m - (NATURAL_PC[step] + alter)) / 12) - 1;
  return { step, alter, octave };
}

/** MIDI number of a spelled pitch (inverse of spellPitch). */
export function spelledToMidi(p: SpelledPitch): number {
  return (p.octave + 1) * 12 + NATURAL_PC[p.step] + p.alter;
}

/** ASCII note name of a spelled pitch: "C#4", "Bb3", "E4". */
export function noteNameAscii(p: SpelledPitch): string {
  return p.step + (p.alter > 0 ? "#".repeat(p.alter) : "b".repeat(-p.alter)) + p.octave;
}
