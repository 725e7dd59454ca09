import { create } from "xmlbuilder2";
import type { XMLBuilder } from "xmlbuilder2/lib/interfaces";
import { gcd, lcm, parseGrid, snapInterval } from "./grid";
import { estimateKeyFifths, spellPitch } from "./spelling";
import { clampTempoBpm, estimateTempoBpm } from "./tempo";
import { checkTimeSignature, DEFAULT_TIME_SIGNATURE, voicesOf, type ExportNote, type TimeSignature } from "./types";

export interface MusicXmlOptions {
  /** `<work-title>`. Default "Untitled take". */
  title?: string;
  /** Quarter notes per minute; clamped to 40 … 240. Default: estimated from the onsets (tempo.ts). */
  tempoBpm?: number;
  /** Default [4, 4]. */
  timeSignature?: TimeSignature;
  /** Grid every onset and offset is snapped to ("1/16", "1/8", "1/12" …). Default "1/16". */
  quantize?: string;
  /** Key signature, sharps (> 0) or flats (< 0), −6 … 6. Default: estimated (spelling.ts). */
  keyFifths?: number;
}

/** A note after quantisation, in divisions from the start of measure 1 (exported for tests). */
export interface QuantizedNote {
  voice: number;
  pitch: number;
  startDiv: number;
  endDiv: number;
  velocity: number;
}

export interface MusicXmlLayout {
  tempoBpm: number;
  divisionsPerQuarter: number;
  measureDivisions: number;
  keyFifths: number;
  notes: QuantizedNote[];
}

export const MUSICXML_PUBLIC_ID = "-//Recordare//DTD MusicXML 4.0 Partwise//EN";
export const MUSICXML_SYSTEM_ID = "http://www.musicxml.org/dtds/partwise.dtd";

/** Note types by length in quarter notes, longest first. */
const NOTE_TYPES: [string, number][] = [
  ["whole", 4],
  ["half", 2],
  ["quarter", 1],
  ["eighth", 1 / 2],
  ["16th", 1 / 4],
  ["32nd", 1 / 8],
  ["64th", 1 / 16],
  ["128th", 1 / 32],
];

/**
 * MusicXML 4.0 partwise score of a note list, built with xmlbuilder2.
 *
 * - One part per voice ("Voice N"), ascending; measures of the time signature from time 0 at the
 *   tempo, the same number in every part.
 * - `<divisions>` per quarter: the least that expresses the grid and the measure length
 *   (4 for "1/16" in 4/4, 3 for "1/12").
 * - Onsets and offsets are snapped to the grid (`quantize`); a note never shrinks to nothing.
 * - Pitch as step/alter/octave spelled by the key (spelling.ts); `<key>` carries that key. Cents
 *   are not written (`<alter>` holds whole semitones of the spelling only); velocity is the note's
 *   `dynamics` attribute (percent of forte = velocity 90, as the MusicXML reference defines it).
 * - Notes of one voice with the same quantised onset and offset are a chord (`<chord/>` on every
 *   tone after the first). Notes of one voice that overlap otherwise go to further MusicXML voices
 *   inside the part (`<voice>` 2, 3 …, after a `<backup>`); their gaps hold hidden rests.
 * - A note that crosses a barline, or whose length is no single (dotted) note value, is written as
 *   tied notes (`<tie>` and `<notations><tied>`). On grids that are not powers of two (triplets) a
 *   length that no note value fits is written without `<type>`.
 * - Gaps are rests; an empty measure is a measure rest.
 * - Measure 1 of the first part has `<direction>` with `<metronome>` and `<sound tempo>`.
 */
export function notesToMusicXml(notes: readonly ExportNote[], opts: MusicXmlOptions = {}): string {
  return writeMusicXml(notes, opts).xml;
}

/** notesToMusicXml, also returning the tempo, divisions, key and quantised notes it used. */
export function writeMusicXml(notes: readonly ExportNote[], opts: MusicXmlOptions = {}): { xml: string; layout: MusicXmlLayout } {
  const [beats, beatType] = opts.timeSignature ?? DEFAULT_TIME_SIGNATURE;
  checkTimeSignature([beats, beatType]);
  const grid = parseGrid(opts.quantize ?? "1/16");
  const bpm = clampTempoBpm(opts.tempoBpm ?? estimateTempoBpm(notes.map((n) => n.onsetSec)));
  const secPerQuarter = 60 / bpm;

  // grid step = 4/N quarters = 4·d/N divisions; a measure = beats·4/beatType quarters
  const divisions = lcm(grid.n / gcd(grid.n, 4), beatType > 4 ? beatType / 4 : 1);
  const gridDiv = (4 * divisions) / grid.n;
  const measureDiv = (beats * 4 * divisions) / beatType;
  const fifths = opts.keyFifths ?? estimateKeyFifths(notes.map((n) => n.pitch));
  if (!Number.isInteger(fifths) || fifths < -6 || fifths > 6) throw new RangeError(`keyFifths ${fifths} is not a whole number −6 … 6`);

  const quantized: QuantizedNote[] = notes.map((n) => {
    const [startDiv, endDiv] = snapInterval((n.onsetSec / secPerQuarter) * divisions, (n.offsetSec / secPerQuarter) * divisions, gridDiv);
    return { voice: n.voice, pitch: Math.round(n.pitch), startDiv: Math.max(0, startDiv), endDiv: Math.max(gridDiv, endDiv), velocity: n.velocity };
  });
  const lastDiv = quantized.reduce((mx, n) => Math.max(mx, n.endDiv), 0);
  const measureCount = Math.max(1, Math.ceil(lastDiv / measureDiv));

  const doc = create({ version: "1.0", encoding: "UTF-8", standalone: false }).dtd({ name: "score-partwise", pubID: MUSICXML_PUBLIC_ID, sysID: MUSICXML_SYSTEM_ID });
  const score = doc.ele("score-partwise", { version: "4.0" });
  score.ele("work").ele("work-title").txt(opts.title ?? "Untitled take");
  score.ele("identification").ele("encoding").ele("software").txt("Tapernote");

  const voices = voicesOf(notes);
  const partList = score.ele("part-list");
  for (const [i, v] of voices.entries()) {
    partList.ele("score-part", { id: `P${i + 1}` }).ele("part-name").txt(`Voice ${v}`);
  }

  for (const [i, v] of voices.entries()) {
    const mine = quantized.filter((n) => n.voice === v);
    const layers = toLayers(toChords(mine));
    const meanPitch = mine.reduce((s, n) => s + n.pitch, 0) / mine.length;
    const part = score.ele("part", { id: `P${i + 1}` });
    const next = layers.map(() => 0);

    for (let m = 0; m < measureCount; m++) {
      const mStart = m * measureDiv;
      const mEnd = mStart + measureDiv;
      const measure = part.ele("measure", { number: String(m + 1) });
      if (m === 0) {
        const attrs = measure.ele("attributes");
        attrs.ele("divisions").txt(String(divisions));
        attrs.ele("key").ele("fifths").txt(String(fifths));
        const time = attrs.ele("time");
        time.ele("beats").txt(String(beats));
        time.ele("beat-type").txt(String(beatType));
        const clef = attrs.ele("clef");
        if (meanPitch < 60) clef.ele("sign").txt("F").up().ele("line").txt("4");
        else clef.ele("sign").txt("G").up().ele("line").txt("2");
        if (i === 0) {
          const dir = measure.ele("direction", { placement: "above" });
          const metronome = dir.ele("direction-type").ele("metronome");
          metronome.ele("beat-unit").txt("quarter");
          metronome.ele("per-minute").txt(String(Math.round(bpm)));
          dir.ele("sound", { tempo: String(Math.round(bpm * 100) / 100) });
        }
      }

      let written = 0;
      for (const [li, layer] of layers.entries()) {
        // a layer's chords never overlap, so they are sorted by end too: walk them with a cursor
        while (next[li] < layer.length && layer[next[li]].endDiv <= mStart) next[li]++;
        const inMeasure: Chord[] = [];
        for (let k = next[li]; k < layer.length && layer[k].startDiv < mEnd; k++) inMeasure.push(layer[k]);
        if (li > 0 && inMeasure.length === 0) continue;
        if (written > 0) measure.ele("backup").ele("duration").txt(String(measureDiv));
        written++;
        const voiceNo = String(li + 1);
        if (inMeasure.length === 0) {
          const rest = measure.ele("note");
          rest.ele("rest", { measure: "yes" });
          rest.ele("duration").txt(String(measureDiv));
          rest.ele("voice").txt(voiceNo);
          continue;
        }
        let cursor = mStart;
        for (const chord of inMeasure) {
          const from = Math.max(chord.startDiv, mStart);
          const to = Math.min(chord.endDiv, mEnd);
          if (from > cursor) writeRests(measure, from - cursor, divisions, voiceNo, li > 0);
          const pieces = splitValues(to - from, divisions);
          pieces.forEach((piece, k) => {
            const tieStop = k > 0 || chord.startDiv < mStart;
            const tieStart = k < pieces.length - 1 || chord.endDiv > mEnd;
            chord.pitches.forEach((pitch, j) => {
              const note = measure.ele("note", { dynamics: String(Math.round((chord.velocities[j] / 90) * 10000) / 100) });
              if (j > 0) note.ele("chord");
              const sp = spellPitch(pitch, fifths);
              const p = note.ele("pitch");
              p.ele("step").txt(sp.step);
              if (sp.alter !== 0) p.ele("alter").txt(String(sp.alter));
              p.ele("octave").txt(String(sp.octave));
              note.ele("duration").txt(String(piece.div));
              if (tieStop) note.ele("tie", { type: "stop" });
              if (tieStart) note.ele("tie", { type: "start" });
              note.ele("voice").txt(voiceNo);
              writeType(note, piece);
              if (tieStop || tieStart) {
                const notations = note.ele("notations");
                if (tieStop) notations.ele("tied", { type: "stop" });
                if (tieStart) notations.ele("tied", { type: "start" });
              }
            });
          });
          cursor = to;
        }
        if (cursor < mEnd) writeRests(measure, mEnd - cursor, divisions, voiceNo, li > 0);
      }
    }
  }

  const xml = doc.end({ prettyPrint: true });
  return { xml, layout: { tempoBpm: bpm, divisionsPerQuarter: divisions, measureDivisions: measureDiv, keyFifths: fifths, notes: quantized } };
}

interface Chord {
  startDiv: number;
  endDiv: number;
  pitches: number[];
  velocities: number[];
}

/** Notes with the same start and end are one chord; pitches ascending, a repeated pitch once. */
function toChords(notes: readonly QuantizedNote[]): Chord[] {
  const byKey = new Map<string, Chord>();
  for (const n of notes) {
    const key = `${n.startDiv}:${n.endDiv}`;
    const chord = byKey.get(key) ?? { startDiv: n.startDiv, endDiv: n.endDiv, pitches: [], velocities: [] };
    byKey.set(key, chord);
    if (!chord.pitches.includes(n.pitch)) {
      chord.pitches.push(n.pitch);
      chord.velocities.push(n.velocity);
    }
  }
  const chords = [...byKey.values()];
  for (const c of chords) {
    const order = c.pitches.map((p, i) => i).sort((a, b) => c.pitches[a] - c.pitches[b]);
    c.pitches = order.map((i) => c.pitches[i]);
    c.velocities = order.map((i) => c.velocities[i]);
  }
  return chords.sort((a, b) => a.startDiv - b.startDiv || a.endDiv - b.endDiv);
}

/** Chords into layers that never overlap themselves (greedy interval colouring, fewest layers). */
function toLayers(chords: readonly Chord[]): Chord[][] {
  const layers: Chord[][] = [];
  for (const c of chords) {
    const layer = layers.find((l) => l[l.length - 1].endDiv <= c.startDiv);
    if (layer) layer.push(c);
    else layers.push([c]);
  }
  return layers;
}

interface Piece {
  div: number;
  type?: string;
  dots: number;
}

/** A length in divisions as note values, longest first (dotted values allowed); untyped if none fit. */
function splitValues(lengthDiv: number, divisions: number): Piece[] {
  const values: Piece[] = [];
  for (const [type, q] of NOTE_TYPES) {
    for (const dots of [1, 0]) {
      const div = q * divisions * (dots ? 1.5 : 1);
      if (Number.isInteger(div) && div > 0) values.push({ div, type, dots });
    }
  }
  values.sort((a, b) => b.div - a.div);
  const pieces: Piece[] = [];
  let left = lengthDiv;
  while (left > 0) {
    const v = values.find((x) => x.div <= left);
    if (!v) return [{ div: lengthDiv, dots: 0 }];
    pieces.push(v);
    left -= v.div;
  }
  return pieces;
}

function writeType(note: XMLBuilder, piece: Piece): void {
  if (!piece.type) return;
  note.ele("type").txt(piece.type);
  for (let d = 0; d < piece.dots; d++) note.ele("dot");
}

function writeRests(measure: XMLBuilder, lengthDiv: number, divisions: number, voiceNo: string, hidden: boolean): void {
  for (const piece of splitValues(lengthDiv, divisions)) {
    const note = measure.ele("note", hidden ? { "print-object": "no" } : {});
    note.ele("rest");
    note.ele("duration").txt(String(piece.div));
    note.ele("voice").txt(voiceNo);
    writeType(note, piece);
  }
}
