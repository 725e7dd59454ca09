/**
 * Just-intonation intervals (pure).
 *
 * Sizes in cents are computed from the frequency ratios, cents = 1200 · log2(n/d)
 * (Ellis 1885; check values in REFERENCES.md §4: 5:4 386.314, 6:5 315.641, 3:2 701.955 …).
 * The table is five-limit (ratios of 2, 3 and 5) plus the harmonic seventh 7:4, which is the
 * seventh of the beatless dominant-seventh chord 4:5:6:7.
 *
 * Which just interval a number of semitones stands for depends on the chord it sounds in:
 *  - default, per semitone above the root: 1:1, 16:15, 9:8, 6:5, 5:4, 4:3, 45:32, 3:2, 8:5,
 *    5:3, 9:5, 15:8 — the five-limit "just major/minor" choices (major triad 4:5:6, minor
 *    triad 10:12:15, major sixth 5:3, major seventh 15:8 as in 8:10:12:15);
 *  - minor seventh in a dominant-type chord (`dominant`, `dominant-ninth`, `augmented-seventh`):
 *    **7:4** (968.826 c, 31.2 c below equal temperament). Chosen because ensembles that tune a
 *    dominant seventh by ear settle on the beatless 4:5:6:7; in minor-seventh and
 *    half-diminished chords the seventh is **9:5** (1017.596 c; m7 = 10:12:15:18);
 *  - diminished fifth (6 semitones) in `diminished`, `half-diminished`, `diminished-seventh`:
 *    64:45 (609.776 c); elsewhere 6 semitones is the augmented fourth 45:32 (590.224 c);
 *  - augmented fifth (8 semitones) in `augmented`, `augmented-seventh`: 25:16 (772.627 c,
 *    two stacked 5:4); elsewhere the minor sixth 8:5;
 *  - diminished seventh (9 semitones) in `diminished-seventh`: 128:75 (925.418 c);
 *    elsewhere the major sixth 5:3.
 * Intervals beyond an octave are the interval within the octave plus whole 2:1 octaves.
 */
import type { ChordQuality } from "./chords";

/** Interval in cents of the frequency ratio numerator/denominator: 1200 · log2(n/d). */
export function ratioToCents(numerator: number, denominator: number = 1): number {
  return 1200 * Math.log2(numerator / denominator);
}

export interface JustInterval {
  /** Interval name (music theory term). */
  name: string;
  /** Equal-tempered size in semitones that the interval stands for. */
  semitones: number;
  numerator: number;
  denominator: number;
  /** Size in cents, 1200·log2(numerator/denominator). */
  cents: number;
  /** cents − 100·semitones: how far the just interval lies from its equal-tempered neighbour. */
  deviationFromEqualCents: number;
}

function interval(name: string, semitones: number, numerator: number, denominator: number): JustInterval {
  const cents = ratioToCents(numerator, denominator);
  return { name, semitones, numerator, denominator, cents, deviationFromEqualCents: cents - 100 * semitones };
}

/** The just intervals Tapernote uses, by name. */
export const JUST = {
  unison: interval("unison", 0, 1, 1),
  minorSecond: interval("minor second", 1, 16, 15),
  majorSecond: interval("major second", 2, 9, 8),
  minorThird: interval("minor third", 3, 6, 5),
  majorThird: interval("major third", 4, 5, 4),
  perfectFourth: interval("perfect fourth", 5, 4, 3),
  augmentedFourth: interval("augmented fourth", 6, 45, 32),
  diminishedFifth: interval("diminished fifth", 6, 64, 45),
  perfectFifth: interval("perfect fifth", 7, 3, 2),
  augmentedFifth: interval("augmented fifth", 8, 25, 16),
  minorSixth: interval("minor sixth", 8, 8, 5),
  majorSixth: interval("major sixth", 9, 5, 3),
  diminishedSeventh: interval("diminished seventh", 9, 128, 75),
  harmonicSeventh: interval("harmonic seventh", 10, 7, 4),
  minorSeventh: interval("minor seventh", 10, 9, 5),
  lesserMinorSeventh: interval("lesser minor seventh", 10, 16, 9),
  majorSeventh: interval("major seventh", 11, 15, 8),
  octave: interval("octave", 12, 2, 1),
} as const satisfies Record<string, JustInterval>;

/** The whole table, ordered by size. */
export const JUST_INTERVALS: readonly JustInterval[] = Object.values(JUST).sort((a, b) => a.cents - b.cents);

/** Syntonic comma 81:80 (21.506 c): the gap between four just fifths and a just major third plus two octaves. */
export const SYNTONIC_COMMA_CENTS = ratioToCents(81, 80);

const DEFAULT_BY_SEMITONE: readonly JustInterval[] = [
  JUST.unison,
  JUST.minorSecond,
  JUST.majorSecond,
  JUST.minorThird,
  JUST.majorThird,
  JUST.perfectFourth,
  JUST.augmentedFourth,
  JUST.perfectFifth,
  JUST.minorSixth,
  JUST.majorSixth,
  JUST.minorSeventh,
  JUST.majorSeventh,
];

const DOMINANT: ReadonlySet<ChordQuality> = new Set<ChordQuality>(["dominant", "dominant-ninth", "augmented-seventh"]);
const DIMINISHED_FIFTH: ReadonlySet<ChordQuality> = new Set<ChordQuality>(["diminished", "half-diminished", "diminished-seventh"]);
const AUGMENTED_FIFTH: ReadonlySet<ChordQuality> = new Set<ChordQuality>(["augmented", "augmented-seventh"]);

/**
 * The just interval that `semitones` (0 … 11) above the root stands for in a chord of `quality`
 * (null: no chord, the default table). See the module comment for the choices.
 */
export function justIntervalFor(semitones: number, quality: ChordQuality | null = null): JustInterval {
  const s = ((Math.round(semitones) % 12) + 12) % 12;
  if (quality) {
    if (s === 10 && DOMINANT.has(quality)) return JUST.harmonicSeventh;
    if (s === 6 && DIMINISHED_FIFTH.has(quality)) return JUST.diminishedFifth;
    if (s === 8 && AUGMENTED_FIFTH.has(quality)) return JUST.augmentedFifth;
    if (s === 9 && quality === "diminished-seventh") return JUST.diminishedSeventh;
  }
  return DEFAULT_BY_SEMITONE[s];
}

/**
 * Just size in cents of an interval of `semitones` (any integer, negative = below the root),
 * in a chord of `quality`: justIntervalFor(s mod 12).cents + 1200 · floor(s / 12).
 * E.g. 16 semitones in a major chord → 386.314 + 1200; −8 (a major third's pitch class an
 * octave-and-less below the root, as in C/E) → 386.314 − 1200 = −813.686.
 */
export function justCentsAbove(semitones: number, quality: ChordQuality | null = null): number {
  const s = Math.round(semitones);
  return justIntervalFor(s, quality).cents + 1200 * Math.floor(s / 12);
}
