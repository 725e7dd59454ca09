/**
 * Chord naming and chord segmentation (pure).
 *
 * Names are standard chord symbols (C, Cm, C7, Cmaj7, Cm7, Cdim, Cdim7, Cm7b5, Caug, Csus4,
 * Csus2, C6, Cm6, C5, CmMaj7, Caug7, C9, Cmaj9, Cm9), with an inversion written as a slash
 * chord (C/E, G7/B). Qualities use the MusicXML 4.0 `<kind>` values (an open standard's terms:
 * "major", "minor-seventh", "half-diminished" …).
 *
 * Naming rule: the chord's pitch-class set must equal one template exactly (doubling and
 * octave placement do not matter). When several roots fit, the one equal to the bass wins
 * (so C–E–G–A over C is C6, over A it is Am7; a diminished-seventh or augmented chord, which
 * fits on every one of its notes, takes the bass as root and is never a slash chord; a power
 * chord C5 is named only over its root — a bare fourth is unnamed);
 * otherwise the template listed first below wins.
 *
 * Root spelling (ASCII `#`/`b`, as chord charts and MusicXML `<root-alter>` text do): a
 * white-key root is natural; a black-key root is spelled as the tonic of the key with fewer
 * sharps or flats — the major key for major-type chords (D♭, E♭, F♯, A♭, B♭: Db, Eb, F#, Ab,
 * Bb), the minor key for minor-type chords (minor, minor sixth/seventh/ninth, minor-major,
 * diminished, half-diminished, diminished seventh: C#m, D#m, F#m, G#m, Bbm); a tie (F♯/G♭
 * major, D♯/E♭ minor) goes to sharps, as in lib/export/spelling.ts. The slash bass is spelled
 * as the chord degree it is (E in C/E, G# in E/G#), falling back to the root's side for
 * double accidentals.
 */
import { justCentsAbove } from "./intervals";

/** Chord quality, as MusicXML 4.0 `<kind>` values. */
export type ChordQuality =
  | "major"
  | "minor"
  | "diminished"
  | "augmented"
  | "suspended-second"
  | "suspended-fourth"
  | "power"
  | "dominant"
  | "major-seventh"
  | "minor-seventh"
  | "half-diminished"
  | "diminished-seventh"
  | "major-sixth"
  | "minor-sixth"
  | "major-minor"
  | "augmented-seventh"
  | "dominant-ninth"
  | "major-ninth"
  | "minor-ninth";

interface Template {
  quality: ChordQuality;
  suffix: string;
  /** Semitones above the root, ascending. */
  intervals: number[];
  /** Chord degree (1, 3, 5, 7, 6, 2 = 9th, 4) of each interval, for spelling a slash bass. */
  degrees: number[];
  minorType: boolean;
}

/** Templates in order of preference when a chord fits several roots, none of them the bass. */
export const CHORD_TEMPLATES: readonly Template[] = [
  { quality: "major", suffix: "", intervals: [0, 4, 7], degrees: [1, 3, 5], minorType: false },
  { quality: "minor", suffix: "m", intervals: [0, 3, 7], degrees: [1, 3, 5], minorType: true },
  { quality: "diminished", suffix: "dim", intervals: [0, 3, 6], degrees: [1, 3, 5], minorType: true },
  { quality: "augmented", suffix: "aug", intervals: [0, 4, 8], degrees: [1, 3, 5], minorType: false },
  { quality: "dominant", suffix: "7", intervals: [0, 4, 7, 10], degrees: [1, 3, 5, 7], minorType: false },
  { quality: "major-seventh", suffix: "maj7", intervals: [0, 4, 7, 11], degrees: [1, 3, 5, 7], minorType: false },
  { quality: "minor-seventh", suffix: "m7", intervals: [0, 3, 7, 10], degrees: [1, 3, 5, 7], minorType: true },
  { quality: "half-diminished", suffix: "m7b5", intervals: [0, 3, 6, 10], degrees: [1, 3, 5, 7], minorType: true },
  { quality: "diminished-seventh", suffix: "dim7", intervals: [0, 3, 6, 9], degrees: [1, 3, 5, 7], minorType: true },
  { quality: "suspended-fourth", suffix: "sus4", intervals: [0, 5, 7], degrees: [1, 4, 5], minorType: false },
  { quality: "suspended-second", suffix: "sus2", intervals: [0, 2, 7], degrees: [1, 2, 5], minorType: false },
  { quality: "major-sixth", suffix: "6", intervals: [0, 4, 7, 9], degrees: [1, 3, 5, 6], minorType: false },
  { quality: "minor-sixth", suffix: "m6", intervals: [0, 3, 7, 9], degrees: [1, 3, 5, 6], minorType: true },
  { quality: "major-minor", suffix: "mMaj7", intervals: [0, 3, 7, 11], degrees: [1, 3, 5, 7], minorType: true },
  { quality: "augmented-seventh", suffix: "aug7", intervals: [0, 4, 8, 10], degrees: [1, 3, 5, 7], minorType: false },
  { quality: "dominant-ninth", suffix: "9", intervals: [0, 2, 4, 7, 10], degrees: [1, 2, 3, 5, 7], minorType: false },
  { quality: "major-ninth", suffix: "maj9", intervals: [0, 2, 4, 7, 11], degrees: [1, 2, 3, 5, 7], minorType: false },
  { quality: "minor-ninth", suffix: "m9", intervals: [0, 2, 3, 7, 10], degrees: [1, 2, 3, 5, 7], minorType: true },
  { quality: "power", suffix: "5", intervals: [0, 7], degrees: [1, 5], minorType: false },
];

export interface ChordName {
  /** Chord symbol, e.g. "Cm7", "G/B", "F#dim7". */
  symbol: string;
  /** Pitch class of the root, 0 = C … 11 = B. */
  rootPc: number;
  quality: ChordQuality;
  /** Pitch class of the lowest sounding note. */
  bassPc: number;
  /** Semitones above the root of the chord's pitch classes, ascending (the template). */
  intervals: number[];
  /** Root spelled, e.g. "F#", "Bb". */
  rootName: string;
}

const pcOf = (midi: number) => ((Math.round(midi) % 12) + 12) % 12;
const LETTERS = ["C", "D", "E", "F", "G", "A", "B"] as const;
const LETTER_PC = [0, 2, 4, 5, 7, 9, 11];
const BLACK: Record<number, { sharp: string; flat: string }> = {
  1: { sharp: "C#", flat: "Db" },
  3: { sharp: "D#", flat: "Eb" },
  6: { sharp: "F#", flat: "Gb" },
  8: { sharp: "G#", flat: "Ab" },
  10: { sharp: "A#", flat: "Bb" },
};

/** Key signature (fifths, −7 … 7) with the fewer accidentals for a major tonic of pitch class pc; tie → sharps. */
function majorKeyFifths(pc: number): number {
  const sharpSide = (pc * 7) % 12; // 0 … 11 sharps
  const flatSide = sharpSide - 12;
  return Math.abs(flatSide) < Math.abs(sharpSide) ? flatSide : sharpSide;
}

/** Spelling of a root: see the module comment. Returns the name and whether it uses sharps (true) or flats. */
export function spellRoot(rootPc: number, minorType: boolean): { name: string; sharps: boolean } {
  const pc = pcOf(rootPc);
  const fifths = majorKeyFifths(minorType ? (pc + 3) % 12 : pc);
  const sharps = fifths >= 0;
  const black = BLACK[pc];
  if (!black) return { name: LETTERS[LETTER_PC.indexOf(pc)], sharps };
  return { name: sharps ? black.sharp : black.flat, sharps };
}

/** Spell pitch class pc on the letter `degree − 1` steps above the root's letter; null if it needs a double accidental. */
function spellOnLetter(rootName: string, degree: number, pc: number): string | null {
  const letterIndex = (LETTERS.indexOf(rootName[0] as (typeof LETTERS)[number]) + degree - 1) % 7;
  let alter = pcOf(pc - LETTER_PC[letterIndex]);
  if (alter > 6) alter -= 12;
  if (alter === 0) return LETTERS[letterIndex];
  if (alter === 1) return LETTERS[letterIndex] + "#";
  if (alter === -1) return LETTERS[letterIndex] + "b";
  return null;
}

/**
 * Name the chord formed by MIDI `pitches` over `bassPitch` (default: the lowest pitch).
 * Null when fewer than two pitch classes sound or the set fits no template.
 */
export function nameChord(pitches: readonly number[], bassPitch?: number): ChordName | null {
  if (pitches.length === 0) return null;
  const bass = bassPitch ?? Math.min(...pitches);
  const pcs = new Set(pitches.map(pcOf));
  pcs.add(pcOf(bass));
  if (pcs.size < 2) return null;
  const bassPc = pcOf(bass);
  let best: { template: Template; rootPc: number; rank: number } | null = null;
  CHORD_TEMPLATES.forEach((template, order) => {
    if (template.intervals.length !== pcs.size) return;
    for (const rootPc of pcs) {
      if (!template.intervals.every((i) => pcs.has((rootPc + i) % 12))) continue;
      if (template.quality === "power" && rootPc !== bassPc) continue; // a bare fourth is no chord
      const rank = (rootPc === bassPc ? 0 : 1000) + order;
      if (!best || rank < best.rank) best = { template, rootPc, rank };
    }
  });
  if (!best) return null;
  const { template, rootPc } = best as { template: Template; rootPc: number };
  const root = spellRoot(rootPc, template.minorType);
  let symbol = root.name + template.suffix;
  if (bassPc !== rootPc) {
    const interval = pcOf(bassPc - rootPc);
    const degree = template.degrees[template.intervals.indexOf(interval)];
    const bassName =
      spellOnLetter(root.name, degree, bassPc) ??
      (BLACK[bassPc] ? (root.sharps ? BLACK[bassPc].sharp : BLACK[bassPc].flat) : LETTERS[LETTER_PC.indexOf(bassPc)]);
    symbol += "/" + bassName;
  }
  return { symbol, rootPc, quality: template.quality, bassPc, intervals: [...template.intervals], rootName: root.name };
}

/** A note as chord segmentation needs it (extra fields are ignored). */
export interface TimedNote {
  onsetSec: number;
  offsetSec: number;
  /** MIDI note number. */
  pitch: number;
}

export interface ChordSegment {
  startSec: number;
  endSec: number;
  /** Sounding pitch classes, ascending. */
  pitchClasses: number[];
  /** Sounding MIDI pitches, ascending, unique. */
  pitches: number[];
  /** Lowest sounding MIDI pitch. */
  bassPitch: number;
  /** Indices (into the input) of the kept notes sounding in the segment. */
  noteIndices: number[];
  /** The chord, or null when fewer than two pitch classes sound or the set has no name. */
  chord: ChordName | null;
}

export interface ChordSegmentOptions {
  /** Notes shorter than this are left out of the segmentation (ornaments, detection slivers). Default 0.08 s. */
  minNoteSec?: number;
  /**
   * Note boundaries closer than this are taken as one instant, so that voices that start a
   * chord a few ms apart, or a legato line with small gaps, do not make slivers. Default 0.05 s.
   */
  boundaryToleranceSec?: number;
}

/**
 * Cut a note list into time segments within which the set of sounding pitch classes (and the
 * bass) is constant, and name each segment's chord. Times where nothing sounds are left out.
 *
 * Method: every kept note's onset and offset is a boundary; boundaries within
 * `boundaryToleranceSec` of the first boundary of their cluster are snapped to it; between
 * consecutive boundaries the sounding notes are those spanning the whole interval; adjacent
 * intervals with the same pitch-class set and bass are merged.
 */
export function chordSegments(notes: readonly TimedNote[], options: ChordSegmentOptions = {}): ChordSegment[] {
  const minNoteSec = options.minNoteSec ?? 0.08;
  const tol = options.boundaryToleranceSec ?? 0.05;
  const kept: number[] = [];
  notes.forEach((n, i) => {
    if (n.offsetSec - n.onsetSec >= minNoteSec) kept.push(i);
  });
  if (kept.length === 0) return [];

  const times = kept.flatMap((i) => [notes[i].onsetSec, notes[i].offsetSec]).sort((a, b) => a - b);
  const snapped = new Map<number, number>();
  const boundaries: number[] = [];
  let clusterStart = -Infinity;
  for (const t of times) {
    if (t - clusterStart > tol) {
      clusterStart = t;
      boundaries.push(t);
    }
    snapped.set(t, clusterStart);
  }
  const on = new Map<number, number>();
  const off = new Map<number, number>();
  for (const i of kept) {
    on.set(i, snapped.get(notes[i].onsetSec)!);
    off.set(i, snapped.get(notes[i].offsetSec)!);
  }

  // sweep: notes enter at their (snapped) onset and leave at their (snapped) offset
  const byOnset = [...kept].sort((a, b) => on.get(a)! - on.get(b)! || a - b);
  let next = 0;
  let active: number[] = [];
  const segments: ChordSegment[] = [];
  for (let b = 0; b + 1 < boundaries.length; b++) {
    const t0 = boundaries[b];
    const t1 = boundaries[b + 1];
    while (next < byOnset.length && on.get(byOnset[next])! <= t0) active.push(byOnset[next++]);
    active = active.filter((i) => off.get(i)! >= t1);
    const sounding = [...active].sort((a, b) => a - b);
    if (sounding.length === 0) continue;
    const pitches = [...new Set(sounding.map((i) => notes[i].pitch))].sort((a, b) => a - b);
    const pitchClasses = [...new Set(pitches.map(pcOf))].sort((a, b) => a - b);
    const bassPitch = pitches[0];
    const last = segments[segments.length - 1];
    if (
      last &&
      last.endSec === t0 &&
      pcOf(last.bassPitch) === pcOf(bassPitch) &&
      last.pitchClasses.join() === pitchClasses.join()
    ) {
      last.endSec = t1;
      last.pitches = [...new Set([...last.pitches, ...pitches])].sort((a, b) => a - b);
      last.bassPitch = Math.min(last.bassPitch, bassPitch);
      last.noteIndices = [...new Set([...last.noteIndices, ...sounding])].sort((a, b) => a - b);
      continue;
    }
    segments.push({
      startSec: t0,
      endSec: t1,
      pitchClasses,
      pitches,
      bassPitch,
      noteIndices: sounding,
      chord: nameChord(pitches, bassPitch),
    });
  }
  return segments;
}

/** Convenience for displays: the just size in cents of each chord tone above the chord's root. */
export function chordJustCents(chord: ChordName): number[] {
  return chord.intervals.map((i) => justCentsAbove(i, chord.quality));
}
