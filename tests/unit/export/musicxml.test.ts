import { execFileSync } from "node:child_process";
import { existsSync, mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { XMLParser, XMLValidator } from "fast-xml-parser";
import { describe, expect, it } from "vitest";
import { notesToMusicXml, writeMusicXml, MUSICXML_PUBLIC_ID, MUSICXML_SYSTEM_ID, type ExportNote } from "@/lib/export";
import { rng } from "../../support/random";

// Outside checks: the score is read back by fast-xml-parser 5.12.1, a general-purpose XML parser
// (npm), and checked against the MusicXML 4.0 reference (W3C Music Notation Community Group;
// REFERENCES.md §6): <divisions> per quarter, <duration> in divisions, <pitch> = step/alter/octave
// with octave 4 from middle C, <chord/> on chord tones after the first, ties as <tie> + <tied>.
//
// XSD validation: no package in the npm registry or the Debian archive ships the MusicXML 4.0 XSD
// (searched `apt-cache search musicxml` and the npm package list; Debian's musescore3-common 3.2.3
// predates MusicXML 4.0 and ships no schema), so the schema check below runs only when MUSICXML_XSD
// names a local copy of musicxml.xsd; otherwise the structural checks here stand in for it.

/** Voice 1: a melody with chords; voice 2: notes that overlap each other; voice 4: long notes across barlines. */
function takeNotes(seed: number): ExportNote[] {
  const rand = rng(seed);
  const notes: ExportNote[] = [];
  let t = 0.1;
  for (let k = 0; k < 30; k++) {
    const len = 0.1 + rand() * 1.2;
    const size = rand() < 0.3 ? 3 : 1;
    for (let c = 0; c < size; c++) notes.push({ onsetSec: t, offsetSec: t + len, pitch: 60 + Math.floor(rand() * 12) + 4 * c, cents: 0, velocity: 80, voice: 1 });
    t += len + (rand() < 0.3 ? rand() : 0);
  }
  for (let k = 0; k < 30; k++) {
    const on = rand() * 20;
    notes.push({ onsetSec: on, offsetSec: on + 0.05 + rand() * 2, pitch: 40 + Math.floor(rand() * 20), cents: 0, velocity: 1 + Math.floor(rand() * 127), voice: 2 });
  }
  for (let k = 0, on = 0.3; k < 6; k++, on += 3.7) notes.push({ onsetSec: on, offsetSec: on + 3.1, pitch: 50 + k, cents: 0, velocity: 70, voice: 4 });
  return notes;
}

type Node = Record<string, any>;
const tagOf = (n: Node) => Object.keys(n).find((k) => k !== ":@")!;
const kids = (n: Node): Node[] => n[tagOf(n)] ?? [];
const child = (n: Node, tag: string) => kids(n).find((c) => tagOf(c) === tag);
const all = (n: Node, tag: string) => kids(n).filter((c) => tagOf(c) === tag);
const text = (n: Node | undefined): string => (n ? String(kids(n).find((c) => "#text" in c)?.["#text"] ?? "") : "");
const attr = (n: Node, name: string): string | undefined => n[":@"]?.[`@_${name}`];

function parse(xml: string): Node[] {
  return new XMLParser({ preserveOrder: true, ignoreAttributes: false, parseTagValue: false, trimValues: true }).parse(xml);
}

const STEP_PC: Record<string, number> = { C: 0, D: 2, E: 4, F: 5, G: 7, A: 9, B: 11 };

interface ReadNote {
  part: string;
  pitch: number;
  start: number;
  end: number;
}

/**
 * Notes of a parsed score in divisions from the start: positions by MusicXML's rules (a note moves
 * the position by its duration, a <chord/> tone does not, <backup> moves back), tied notes joined.
 * Also checks that every MusicXML voice fills each measure exactly.
 */
function readScore(doc: Node[], measureDiv: number): { notes: ReadNote[]; divisions: number; measureCounts: number[] } {
  const score = doc.find((n) => tagOf(n) === "score-partwise")!;
  const names = new Map(all(child(score, "part-list")!, "score-part").map((sp) => [attr(sp, "id")!, text(child(sp, "part-name"))]));
  const notes: ReadNote[] = [];
  let divisions = 0;
  const measureCounts: number[] = [];
  for (const part of all(score, "part")) {
    const name = names.get(attr(part, "id")!)!;
    const open = new Map<string, ReadNote>();
    const measures = all(part, "measure");
    measureCounts.push(measures.length);
    measures.forEach((measure, m) => {
      expect(attr(measure, "number")).toBe(String(m + 1));
      const start = m * measureDiv;
      let pos = start;
      let lastOnset = start;
      const filled = new Map<string, number>();
      for (const el of kids(measure)) {
        const tag = tagOf(el);
        if (tag === "attributes" && child(el, "divisions")) divisions = Number(text(child(el, "divisions")));
        if (tag === "backup") pos -= Number(text(child(el, "duration")));
        if (tag !== "note") continue;
        const dur = Number(text(child(el, "duration")));
        const voice = text(child(el, "voice"));
        expect(Number.isInteger(dur) && dur > 0).toBe(true);
        const isChord = !!child(el, "chord");
        const onset = isChord ? lastOnset : pos;
        if (!isChord) {
          lastOnset = pos;
          pos += dur;
          filled.set(voice, (filled.get(voice) ?? 0) + dur);
        }
        const pitchEl = child(el, "pitch");
        if (!pitchEl) continue;
        const pitch = (Number(text(child(pitchEl, "octave"))) + 1) * 12 + STEP_PC[text(child(pitchEl, "step"))] + Number(text(child(pitchEl, "alter")) || 0);
        const ties = all(el, "tie").map((t) => attr(t, "type"));
        const tied = all(child(el, "notations") ?? { notations: [] }, "tied").map((t) => attr(t, "type"));
        expect(tied).toEqual(ties); // <tie> (sound) and <tied> (notation) agree
        const key = `${voice}:${pitch}`;
        if (ties.includes("stop")) {
          const prev = open.get(key);
          expect(prev?.end).toBe(onset);
          prev!.end += dur;
          if (!ties.includes("start")) open.delete(key);
        } else {
          const n = { part: name, pitch, start: onset, end: onset + dur };
          notes.push(n);
          if (ties.includes("start")) open.set(key, n);
        }
      }
      for (const [, total] of filled) expect(total).toBe(measureDiv);
    });
    expect(open.size).toBe(0);
  }
  return { notes, divisions, measureCounts };
}

/** The test's own quantisation: ends to the nearest grid line, never shorter than one step. */
function expectedNotes(notes: ExportNote[], bpm: number, divisions: number, gridDiv: number): ReadNote[] {
  const toDiv = (sec: number) => Math.round(((sec * bpm) / 60) * divisions / gridDiv) * gridDiv;
  const seen = new Set<string>();
  const out: ReadNote[] = [];
  for (const n of notes) {
    const start = toDiv(n.onsetSec);
    let end = toDiv(n.offsetSec);
    if (end <= start) end = start + gridDiv;
    const key = `${n.voice}:${n.pitch}:${start}:${end}`;
    if (seen.has(key)) continue;
    seen.add(key);
    out.push({ part: `Voice ${n.voice}`, pitch: n.pitch, start, end });
  }
  return out;
}

const sortNotes = (a: ReadNote[]) => [...a].sort((x, y) => x.part.localeCompare(y.part) || x.start - y.start || x.pitch - y.pitch || x.end - y.end);

describe("MusicXML 4.0 partwise read back by fast-xml-parser", () => {
  const notes = takeNotes(5);
  const xml = notesToMusicXml(notes, { tempoBpm: 120, title: "Étude, \"no. 3\" <draft>" });

  it("is well-formed XML with the MusicXML 4.0 partwise DOCTYPE and root", () => {
    expect(XMLValidator.validate(xml)).toBe(true);
    expect(xml).toMatch(/^<\?xml version="1.0" encoding="UTF-8"/);
    expect(xml).toContain(`<!DOCTYPE score-partwise PUBLIC "${MUSICXML_PUBLIC_ID}" "${MUSICXML_SYSTEM_ID}">`);
    const doc = parse(xml);
    const score = doc.find((n) => tagOf(n) === "score-partwise")!;
    expect(attr(score, "version")).toBe("4.0");
    expect(text(child(child(score, "work")!, "work-title"))).toBe('Étude, "no. 3" <draft>');
  });

  it("is well-formed for libxml2 too (xmllint, where installed)", (ctx) => {
    try {
      execFileSync("xmllint", ["--version"], { stdio: "ignore" });
    } catch {
      ctx.skip();
    }
    execFileSync("xmllint", ["--noout", "--nonet", "-"], { input: xml });
  });

  it("has a part per voice, the same measures in each, and the header elements in schema order", () => {
    const score = parse(xml).find((n) => tagOf(n) === "score-partwise")!;
    expect(kids(score).map(tagOf)).toEqual(["work", "identification", "part-list", "part", "part", "part"]);
    const ids = all(child(score, "part-list")!, "score-part").map((p) => attr(p, "id"));
    expect(all(score, "part").map((p) => attr(p, "id"))).toEqual(ids);
    expect(all(child(score, "part-list")!, "score-part").map((p) => text(child(p, "part-name")))).toEqual(["Voice 1", "Voice 2", "Voice 4"]);
    for (const part of all(score, "part")) {
      const first = all(part, "measure")[0];
      const attrs = child(first, "attributes")!;
      expect(kids(attrs).map(tagOf)).toEqual(["divisions", "key", "time", "clef"]);
      expect(text(child(attrs, "divisions"))).toBe("4"); // 1/16 grid = 4 per quarter
      // every <note>'s children in the order of the XSD's note sequence
      const ORDER = ["chord", "pitch", "rest", "duration", "tie", "voice", "type", "dot", "notations"];
      for (const measure of all(part, "measure"))
        for (const note of all(measure, "note")) {
          const idx = kids(note).map((c) => ORDER.indexOf(tagOf(c)));
          expect(idx.every((v) => v >= 0)).toBe(true);
          expect([...idx].sort((a, b) => a - b)).toEqual(idx);
          expect(!!child(note, "pitch") !== !!child(note, "rest")).toBe(true);
        }
    }
    const p1m1 = all(all(score, "part")[0], "measure")[0];
    const direction = child(p1m1, "direction")!;
    expect(text(child(child(child(direction, "direction-type")!, "metronome")!, "per-minute"))).toBe("120");
    expect(attr(child(direction, "sound")!, "tempo")).toBe("120");
  });

  it("round-trips every pitch and quantised duration (4/4, 1/16)", () => {
    const { notes: got, divisions, measureCounts } = readScore(parse(xml), 16);
    expect(divisions).toBe(4);
    expect(new Set(measureCounts).size).toBe(1);
    expect(sortNotes(got)).toEqual(sortNotes(expectedNotes(notes, 120, 4, 1)));
  });

  it.each([
    { ts: [3, 4] as const, quantize: "1/8", bpm: 90, divisions: 2, gridDiv: 1, measureDiv: 6 },
    { ts: [6, 8] as const, quantize: "1/12", bpm: 72, divisions: 6, gridDiv: 2, measureDiv: 18 },
    { ts: [5, 4] as const, quantize: "1/32", bpm: 140, divisions: 8, gridDiv: 1, measureDiv: 40 },
  ])("round-trips in $ts.0/$ts.1 on a $quantize grid", ({ ts, quantize, bpm, divisions, gridDiv, measureDiv }) => {
    const notes = takeNotes(17);
    const { xml, layout } = writeMusicXml(notes, { tempoBpm: bpm, timeSignature: ts, quantize });
    expect(XMLValidator.validate(xml)).toBe(true);
    expect(layout.divisionsPerQuarter).toBe(divisions);
    expect(layout.measureDivisions).toBe(measureDiv);
    const { notes: got } = readScore(parse(xml), measureDiv);
    expect(sortNotes(got)).toEqual(sortNotes(expectedNotes(notes, bpm, divisions, gridDiv)));
  });

  it("marks chord tones after the first with <chord/>", () => {
    const chord = [64, 60, 67].map((pitch) => ({ onsetSec: 0, offsetSec: 1, pitch, cents: 0, velocity: 90, voice: 1 }));
    const score = parse(notesToMusicXml(chord, { tempoBpm: 120 })).find((n) => tagOf(n) === "score-partwise")!;
    const measure = all(all(score, "part")[0], "measure")[0];
    const pitched = all(measure, "note").filter((n) => child(n, "pitch"));
    expect(pitched.map((n) => !!child(n, "chord"))).toEqual([false, true, true]);
    expect(pitched.map((n) => text(child(child(n, "pitch")!, "step")))).toEqual(["C", "E", "G"]);
    expect(pitched.map((n) => text(child(n, "duration")))).toEqual(["8", "8", "8"]);
  });

  it("writes a note across a barline as two tied notes", () => {
    // beat 3 of measure 1 to the end of beat 1 of measure 2 at 60 bpm in 4/4: 3 quarters
    const one = [{ onsetSec: 2, offsetSec: 5, pitch: 62, cents: 0, velocity: 90, voice: 1 }];
    const score = parse(notesToMusicXml(one, { tempoBpm: 60 })).find((n) => tagOf(n) === "score-partwise")!;
    const measures = all(all(score, "part")[0], "measure");
    expect(measures).toHaveLength(2);
    const [a, b] = measures.map((m) => all(m, "note").filter((n) => child(n, "pitch")));
    expect(a).toHaveLength(1);
    expect(b).toHaveLength(1);
    expect([text(child(a[0], "duration")), text(child(b[0], "duration"))]).toEqual(["8", "4"]);
    expect(all(a[0], "tie").map((t) => attr(t, "type"))).toEqual(["start"]);
    expect(all(child(a[0], "notations")!, "tied").map((t) => attr(t, "type"))).toEqual(["start"]);
    expect(all(b[0], "tie").map((t) => attr(t, "type"))).toEqual(["stop"]);
    expect(all(child(b[0], "notations")!, "tied").map((t) => attr(t, "type"))).toEqual(["stop"]);
    // the rests before and after fill both measures
    const rests = measures.map((m) => all(m, "note").filter((n) => child(n, "rest")).map((n) => text(child(n, "duration"))));
    expect(rests).toEqual([["8"], ["12"]]); // a half rest; a dotted half rest
  });

  it("writes an empty measure as a measure rest and an empty take as one measure", () => {
    const score = parse(notesToMusicXml([], { tempoBpm: 100 })).find((n) => tagOf(n) === "score-partwise")!;
    expect(all(score, "part")).toHaveLength(0);
    const gap = [
      { onsetSec: 0, offsetSec: 0.5, pitch: 60, cents: 0, velocity: 90, voice: 1 },
      { onsetSec: 4.5, offsetSec: 5, pitch: 60, cents: 0, velocity: 90, voice: 1 },
    ];
    const s2 = parse(notesToMusicXml(gap, { tempoBpm: 120 })).find((n) => tagOf(n) === "score-partwise")!;
    const m2 = all(all(s2, "part")[0], "measure")[1];
    const rest = all(m2, "note");
    expect(rest).toHaveLength(1);
    expect(attr(child(rest[0], "rest")!, "measure")).toBe("yes");
    expect(text(child(rest[0], "duration"))).toBe("16");
  });

  it("spells pitches by the estimated key", () => {
    const fMajor = [65, 67, 69, 70, 72, 74, 76, 77].map((pitch, k) => ({ onsetSec: k * 0.5, offsetSec: k * 0.5 + 0.5, pitch, cents: 0, velocity: 90, voice: 1 }));
    const { xml, layout } = writeMusicXml(fMajor, { tempoBpm: 120 });
    expect(layout.keyFifths).toBe(-1);
    expect(xml).toMatch(/<step>B<\/step>\s*<alter>-1<\/alter>\s*<octave>4<\/octave>/);
    const { xml: sharp } = writeMusicXml(fMajor, { tempoBpm: 120, keyFifths: 2 });
    expect(sharp).toMatch(/<step>A<\/step>\s*<alter>1<\/alter>\s*<octave>4<\/octave>/);
  });

  it.skipIf(!process.env.MUSICXML_XSD || !existsSync(process.env.MUSICXML_XSD))("validates against the MusicXML 4.0 XSD (MUSICXML_XSD)", () => {
    const dir = mkdtempSync(join(tmpdir(), "tapernote-musicxml-"));
    try {
      const path = join(dir, "take.musicxml");
      writeFileSync(path, xml);
      execFileSync("xmllint", ["--noout", "--nonet", "--schema", process.env.MUSICXML_XSD!, path]);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
