import { describe, expect, it } from "vitest";
import { Chord, Interval, Note } from "@tonaljs/tonal";
import { chordSegments, nameChord, spellRoot, type ChordQuality } from "@/lib/music/chords";

/*
 * Outside check: @tonaljs/tonal 4.10.0 (a general-purpose music-theory library from the npm
 * registry), `Chord.detect` for the name and `Chord.get` for the intervals.
 *
 * Normalisation between tonal's conventions and ours, made explicit:
 *  - tonal writes the major triad "M" (CM, CM/E); we write "" (C, C/E);
 *  - tonal's chord-type names ("dominant seventh", "sixth" …) are mapped to our MusicXML
 *    `<kind>` qualities with the table below;
 *  - tonal spells the root with the note names it was given; we compare pitch classes
 *    (Note.chroma), not spellings — our spelling is checked separately;
 *  - tonal lists every reading, root-position readings first; readings whose type we do not
 *    name (e.g. "Em#5" for E–G–C, tonal's "minor augmented") are skipped. When tonal has a
 *    root-position reading ours must equal it; otherwise ours must be one of tonal's slash
 *    readings (E–G–A–C: tonal lists C6/E before Am7/E only because C's pitch-class number
 *    is lower; we prefer the seventh chord, Am7/E).
 */
const TONAL_TYPE_TO_QUALITY: Record<string, ChordQuality> = {
  major: "major",
  minor: "minor",
  diminished: "diminished",
  augmented: "augmented",
  "major seventh": "major-seventh",
  "dominant seventh": "dominant",
  "minor seventh": "minor-seventh",
  "half-diminished": "half-diminished",
  "diminished seventh": "diminished-seventh",
  sixth: "major-sixth",
  "minor sixth": "minor-sixth",
  "suspended fourth": "suspended-fourth",
  "suspended second": "suspended-second",
};

const SHARP = ["C", "C#", "D", "D#", "E", "F", "F#", "G", "G#", "A", "A#", "B"];
const pc = (m: number) => ((m % 12) + 12) % 12;

interface TonalReading {
  rootPc: number;
  quality: ChordQuality;
  bassPc: number | null;
  intervals: number[];
}

function parseTonal(name: string): TonalReading | null {
  const m = /^([A-G][#b]*)([^/]*)(?:\/([A-G][#b]*))?$/.exec(name);
  if (!m) throw new Error(`unparsed tonal name ${name}`);
  const chord = Chord.get(m[1] + m[2]);
  const quality = TONAL_TYPE_TO_QUALITY[chord.type];
  if (!quality) return null;
  return {
    rootPc: Note.chroma(m[1])!,
    quality,
    bassPc: m[3] ? Note.chroma(m[3])! : null,
    intervals: chord.intervals.map((i) => Interval.semitones(i)!),
  };
}

const FAMILIES: { label: string; intervals: number[] }[] = [
  { label: "major", intervals: [0, 4, 7] },
  { label: "minor", intervals: [0, 3, 7] },
  { label: "diminished", intervals: [0, 3, 6] },
  { label: "augmented", intervals: [0, 4, 8] },
  { label: "maj7", intervals: [0, 4, 7, 11] },
  { label: "7", intervals: [0, 4, 7, 10] },
  { label: "m7", intervals: [0, 3, 7, 10] },
  { label: "m7b5", intervals: [0, 3, 6, 10] },
  { label: "dim7", intervals: [0, 3, 6, 9] },
];

describe("nameChord against @tonaljs/tonal Chord.detect", () => {
  for (const family of FAMILIES) {
    it(`${family.label}: all 12 roots × all inversions`, () => {
      let checked = 0;
      for (let root = 0; root < 12; root++) {
        const rootPosition = family.intervals.map((i) => 48 + root + i);
        for (let inversion = 0; inversion < rootPosition.length; inversion++) {
          const voicing = [...rootPosition.slice(inversion), ...rootPosition.slice(0, inversion).map((p) => p + 12)];
          const ours = nameChord(voicing);
          expect(ours, `${voicing}`).not.toBeNull();
          const readings = Chord.detect(voicing.map((p) => SHARP[pc(p)]));
          const named = readings.map(parseTonal).filter((r): r is TonalReading => r !== null);
          const rootPositionReading = named.find((r) => r.bassPc === null);
          const where = `${voicing} → ours ${ours!.symbol}, tonal ${readings.join(" ")}`;
          // tonal weights a root-position reading 1 and every slash reading 0.5; among equal
          // weights its order is the roots' pitch-class numbers, so any slash reading counts.
          const candidates = rootPositionReading ? [rootPositionReading] : named;
          const same = candidates.find((r) => r.rootPc === ours!.rootPc && r.quality === ours!.quality);
          expect(same, where).toBeDefined();
          expect(ours!.intervals, where).toEqual(same!.intervals);
          // slash bass: tonal writes one exactly when the bass is not the root
          expect(ours!.bassPc, where).toBe(pc(voicing[0]));
          expect(ours!.symbol.includes("/"), where).toBe(same!.bassPc !== null);
          if (same!.bassPc !== null) expect(ours!.bassPc, where).toBe(same!.bassPc);
          checked++;
        }
      }
      expect(checked).toBe(12 * family.intervals.length);
    });
  }

  it("sixth and suspended chords in root position, all 12 roots", () => {
    for (const intervals of [[0, 4, 7, 9], [0, 3, 7, 9], [0, 5, 7], [0, 2, 7]]) {
      for (let root = 0; root < 12; root++) {
        const voicing = intervals.map((i) => 48 + root + i);
        const ours = nameChord(voicing)!;
        const first = Chord.detect(voicing.map((p) => SHARP[pc(p)])).map(parseTonal).find((r) => r !== null)!;
        expect([ours.rootPc, ours.quality]).toEqual([first.rootPc, first.quality]);
      }
    }
  });
});

describe("nameChord symbols and spelling", () => {
  it("writes the usual symbols", () => {
    const cases: [number[], string][] = [
      [[60, 64, 67], "C"],
      [[60, 63, 67], "Cm"],
      [[60, 64, 67, 70], "C7"],
      [[60, 64, 67, 71], "Cmaj7"],
      [[60, 63, 67, 70], "Cm7"],
      [[60, 63, 66], "Cdim"],
      [[60, 63, 66, 69], "Cdim7"],
      [[60, 63, 66, 70], "Cm7b5"],
      [[60, 64, 68], "Caug"],
      [[60, 65, 67], "Csus4"],
      [[60, 62, 67], "Csus2"],
      [[60, 64, 67, 69], "C6"],
      [[60, 63, 67, 69], "Cm6"],
      [[59, 67, 74], "G/B"],
      [[53, 67, 71, 74], "G7/F"],
      [[57, 60, 64, 67], "Am7"],
      [[48, 55, 64, 72, 76], "C"], // doubled root and third, open voicing
      [[68, 72, 75], "Ab"],
      [[61, 64, 68], "C#m"],
      [[70, 73, 77], "Bbm"],
      [[66, 70, 73], "F#"],
      [[56, 64, 71], "E/G#"],
      [[56, 60, 63], "Ab"],
      [[60, 63, 68], "Ab/C"],
      [[47, 50, 53, 56], "Bdim7"],
      [[36, 43], "C5"],
    ];
    for (const [pitches, symbol] of cases) expect(nameChord(pitches)?.symbol, `${pitches}`).toBe(symbol);
  });

  it("returns null for one pitch class and for unnamed sets", () => {
    expect(nameChord([60, 72, 84])).toBeNull();
    expect(nameChord([60, 61, 62])).toBeNull();
    expect(nameChord([55, 60])).toBeNull(); // a bare fourth G–C
    expect(nameChord([])).toBeNull();
  });

  it("spells black-key roots by the key with fewer accidentals", () => {
    expect([1, 3, 6, 8, 10].map((p) => spellRoot(p, false).name)).toEqual(["Db", "Eb", "F#", "Ab", "Bb"]);
    expect([1, 3, 6, 8, 10].map((p) => spellRoot(p, true).name)).toEqual(["C#", "D#", "F#", "G#", "Bb"]);
  });

  it("uses the given bass, not the lowest pitch, when one is given", () => {
    expect(nameChord([64, 67, 72], 64)?.symbol).toBe("C/E");
  });
});

describe("chordSegments", () => {
  it("cuts where the sounding pitch classes change and ignores short notes", () => {
    const notes = [
      // I (C E G) for 2 s over a held bass C; an added A makes it C6 at 1 s
      { onsetSec: 0, offsetSec: 2, pitch: 48 },
      { onsetSec: 0.01, offsetSec: 2, pitch: 64 }, // 10 ms late: same instant
      { onsetSec: 0, offsetSec: 2, pitch: 67 },
      { onsetSec: 1, offsetSec: 2, pitch: 69 },
      { onsetSec: 0.5, offsetSec: 0.55, pitch: 61 }, // 50 ms sliver: ignored
      // gap, then a lone note
      { onsetSec: 3, offsetSec: 4, pitch: 60 },
    ];
    const segs = chordSegments(notes);
    expect(segs.map((s) => [s.startSec, s.endSec, s.chord?.symbol ?? null])).toEqual([
      [0, 1, "C"],
      [1, 2, "C6"],
      [3, 4, null],
    ]);
    expect(segs[0].noteIndices).toEqual([0, 1, 2]);
    expect(segs[0].bassPitch).toBe(48);
  });

  it("keeps a constant chord as one segment through re-articulations", () => {
    const notes = [0, 1, 2].flatMap((k) => [60, 64, 67].map((pitch) => ({ onsetSec: k, offsetSec: k + 1, pitch })));
    const segs = chordSegments(notes);
    expect(segs).toHaveLength(1);
    expect(segs[0]).toMatchObject({ startSec: 0, endSec: 3, chord: { symbol: "C" } });
    expect(segs[0].noteIndices).toHaveLength(9);
  });
});
