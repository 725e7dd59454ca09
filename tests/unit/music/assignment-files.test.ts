import { describe, expect, it } from "vitest";
import m from "@tonejs/midi";
import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { writeMusicXml, writeSmf } from "@/lib/export";
import {
  AssignmentFileError,
  detectAssignmentFormat,
  parseAssignmentFile,
  parseMidiAssignment,
  parseMusicXmlAssignment,
} from "@/lib/music/assignment-files";

const { Midi } = m;
const enc = (s: string) => new TextEncoder().encode(s);

function expectAssignmentError(fn: () => unknown, code: string) {
  try {
    fn();
  } catch (e) {
    expect(e).toBeInstanceOf(AssignmentFileError);
    expect((e as AssignmentFileError).code).toBe(code);
    expect((e as Error).message.length).toBeGreaterThan(10);
    return;
  }
  throw new Error(`expected an AssignmentFileError ${code}`);
}

describe("MIDI assignments (written with @tonejs/midi, read back)", () => {
  it("reads notes, tempo and tracks as voices; leaves percussion out", () => {
    const midi = new Midi();
    midi.header.setTempo(90); // a quarter note (480 ticks) = 2/3 s
    const ppq = midi.header.ppq;
    const upper = midi.addTrack();
    upper.channel = 0;
    upper.addNote({ midi: 64, ticks: 0, durationTicks: ppq });
    upper.addNote({ midi: 67, ticks: ppq, durationTicks: 2 * ppq });
    const drums = midi.addTrack();
    drums.channel = 9;
    drums.addNote({ midi: 36, ticks: 0, durationTicks: ppq / 2 });
    const lower = midi.addTrack();
    lower.channel = 1;
    lower.addNote({ midi: 48, ticks: 0, durationTicks: 4 * ppq });
    const notes = parseMidiAssignment(midi.toArray());
    expect(notes).toEqual([
      { onsetSec: 0, offsetSec: expect.closeTo(8 / 3, 5), pitch: 48, voice: 2 },
      { onsetSec: 0, offsetSec: expect.closeTo(2 / 3, 5), pitch: 64, voice: 1 },
      { onsetSec: expect.closeTo(2 / 3, 5), offsetSec: expect.closeTo(2, 5), pitch: 67, voice: 1 },
    ]);
    expect(detectAssignmentFormat(midi.toArray())).toBe("midi");
    expect(parseAssignmentFile(midi.toArray())).toEqual(notes);
  });

  it("uses 120 bpm when the file has no tempo (MIDI 1.0 default)", () => {
    const midi = new Midi();
    const track = midi.addTrack();
    track.addNote({ midi: 60, ticks: midi.header.ppq * 2, durationTicks: midi.header.ppq });
    // @tonejs/midi writes no tempo event unless one was set
    const [n] = parseMidiAssignment(midi.toArray());
    expect(n.onsetSec).toBeCloseTo(1, 6);
    expect(n.offsetSec).toBeCloseTo(1.5, 6);
  });

  it("bad MIDI files raise the typed error", () => {
    expectAssignmentError(() => parseMidiAssignment(enc("MThd\x00\x00\x00\x06garbage")), "invalid_midi");
    expectAssignmentError(() => parseMidiAssignment(new Midi().toArray()), "no_notes");
  });
});

// A small partwise score written by hand after the MusicXML 4.0 specification (w3.org/2021/06/musicxml40):
// divisions 2 (an eighth = 1), ♩ = 60 in measure 1 and ♩ = 120 from measure 2.
const SCORE = `<?xml version="1.0" encoding="UTF-8" standalone="no"?>
<!DOCTYPE score-partwise PUBLIC "-//Recordare//DTD MusicXML 4.0 Partwise//EN" "http://www.musicxml.org/dtds/partwise.dtd">
<score-partwise version="4.0">
  <part-list>
    <score-part id="P1"><part-name>Piano</part-name></score-part>
    <score-part id="P2"><part-name>Flute</part-name></score-part>
  </part-list>
  <part id="P1">
    <measure number="1">
      <attributes>
        <divisions>2</divisions>
        <key><fifths>0</fifths></key>
        <time><beats>4</beats><beat-type>4</beat-type></time>
        <staves>2</staves>
        <clef number="1"><sign>G</sign><line>2</line></clef>
        <clef number="2"><sign>F</sign><line>4</line></clef>
      </attributes>
      <direction placement="above">
        <direction-type><metronome><beat-unit>quarter</beat-unit><per-minute>60</per-minute></metronome></direction-type>
        <sound tempo="60"/>
      </direction>
      <note><pitch><step>C</step><octave>4</octave></pitch><duration>2</duration><voice>1</voice><type>quarter</type><staff>1</staff></note>
      <note><chord/><pitch><step>E</step><octave>4</octave></pitch><duration>2</duration><voice>1</voice><type>quarter</type><staff>1</staff></note>
      <note><chord/><pitch><step>G</step><octave>4</octave></pitch><duration>2</duration><voice>1</voice><type>quarter</type><staff>1</staff></note>
      <note><rest/><duration>2</duration><voice>1</voice><type>quarter</type><staff>1</staff></note>
      <note><pitch><step>D</step><octave>4</octave></pitch><duration>4</duration><tie type="start"/><voice>1</voice><type>half</type><staff>1</staff><notations><tied type="start"/></notations></note>
      <backup><duration>8</duration></backup>
      <forward><duration>2</duration><voice>2</voice><staff>2</staff></forward>
      <note><pitch><step>B</step><alter>-1</alter><octave>2</octave></pitch><duration>6</duration><voice>2</voice><type>half</type><dot/><staff>2</staff></note>
    </measure>
    <measure number="2">
      <direction><direction-type><words>Allegro</words></direction-type><sound tempo="120"/></direction>
      <note><pitch><step>D</step><octave>4</octave></pitch><duration>2</duration><tie type="stop"/><voice>1</voice><type>quarter</type><staff>1</staff><notations><tied type="stop"/></notations></note>
      <note><pitch><step>F</step><alter>1</alter><octave>4</octave></pitch><duration>1</duration><voice>1</voice><type>eighth</type><staff>1</staff></note>
      <note><grace slash="yes"/><pitch><step>B</step><octave>4</octave></pitch><voice>1</voice><type>eighth</type><staff>1</staff></note>
      <note><pitch><step>A</step><octave>4</octave></pitch><duration>1</duration><voice>1</voice><type>eighth</type><staff>1</staff></note>
      <note><rest/><duration>4</duration><voice>1</voice><type>half</type><staff>1</staff></note>
      <backup><duration>8</duration></backup>
      <note><pitch><step>C</step><octave>3</octave></pitch><duration>8</duration><voice>2</voice><type>whole</type><staff>2</staff></note>
    </measure>
  </part>
  <part id="P2">
    <measure number="1">
      <attributes><divisions>1</divisions></attributes>
      <note><pitch><step>C</step><octave>5</octave></pitch><duration>4</duration><voice>1</voice><type>whole</type></note>
    </measure>
    <measure number="2">
      <note><pitch><step>G</step><octave>5</octave></pitch><duration>2</duration><voice>1</voice><type>half</type></note>
      <note><rest/><duration>2</duration><voice>1</voice><type>half</type></note>
    </measure>
  </part>
</score-partwise>`;

describe("MusicXML assignments (partwise, MusicXML 4.0)", () => {
  it("pitches, chords, rests, ties, backup/forward, grace notes, divisions and tempo changes", () => {
    const notes = parseMusicXmlAssignment(SCORE);
    const row = (onsetSec: number, offsetSec: number, pitch: number, voice: number) => ({ onsetSec, offsetSec, pitch, voice });
    expect(notes).toEqual([
      row(0, 1, 60, 1),
      row(0, 1, 64, 1),
      row(0, 1, 67, 1),
      row(0, 4, 72, 3),
      row(1, 4, 46, 2), // B♭2 = 12·3 + 11 − 1
      row(2, 4.5, 62, 1), // D4 half tied to a quarter at ♩ = 120
      row(4, 6, 48, 2),
      row(4, 5, 79, 3),
      row(4.5, 4.75, 66, 1), // F♯4
      row(4.75, 5, 69, 1),
    ]);
    expect(detectAssignmentFormat(enc(SCORE))).toBe("musicxml");
    expect(parseAssignmentFile(enc(SCORE))).toEqual(notes);
  });

  const single = (measureBody: string, divisions = 1) => `<?xml version="1.0"?>
<score-partwise version="4.0"><part-list><score-part id="P1"><part-name>A</part-name></score-part></part-list>
<part id="P1"><measure number="1"><attributes><divisions>${divisions}</divisions></attributes>${measureBody}</measure></part></score-partwise>`;
  const c4 = (dur: number) => `<note><pitch><step>C</step><octave>4</octave></pitch><duration>${dur}</duration></note>`;

  it("120 bpm without a tempo, a metronome mark without <sound>, UTF-16 files", () => {
    expect(parseMusicXmlAssignment(single(c4(1) + c4(1)))).toEqual([
      { onsetSec: 0, offsetSec: 0.5, pitch: 60, voice: 1 },
      { onsetSec: 0.5, offsetSec: 1, pitch: 60, voice: 1 },
    ]);
    const dottedHalf40 = `<direction><direction-type><metronome><beat-unit>half</beat-unit><beat-unit-dot/><per-minute>40</per-minute></metronome></direction-type></direction>`;
    // dotted half = 3 quarters at 40/min → 120 quarters per minute; half = 30/min → 60
    expect(parseMusicXmlAssignment(single(dottedHalf40 + c4(2)))[0].offsetSec).toBeCloseTo(1, 9);
    const half30 = `<direction><direction-type><metronome><beat-unit>half</beat-unit><per-minute>30</per-minute></metronome></direction-type></direction>`;
    expect(parseMusicXmlAssignment(single(half30 + c4(1)))[0].offsetSec).toBeCloseTo(1, 9);
    const text = single(c4(1));
    const utf16 = new Uint8Array(2 + text.length * 2);
    utf16.set([0xff, 0xfe]);
    for (let i = 0; i < text.length; i++) {
      utf16[2 + 2 * i] = text.charCodeAt(i) & 0xff;
      utf16[3 + 2 * i] = text.charCodeAt(i) >> 8;
    }
    expect(parseAssignmentFile(utf16)).toHaveLength(1);
  });

  it("bad files raise the typed error", () => {
    expectAssignmentError(() => parseMusicXmlAssignment("<score-partwise><part></score-partwise>"), "invalid_musicxml");
    expectAssignmentError(() => parseMusicXmlAssignment(`<?xml version="1.0"?><html><body/></html>`), "invalid_musicxml");
    expectAssignmentError(() => parseMusicXmlAssignment(`<score-timewise version="4.0"></score-timewise>`), "unsupported_musicxml");
    expectAssignmentError(() => parseMusicXmlAssignment(single(`<note><rest/><duration>4</duration></note>`)), "no_notes");
    expectAssignmentError(() => parseMusicXmlAssignment(single(`<note><pitch><step>H</step><octave>4</octave></pitch><duration>1</duration></note>`)), "invalid_musicxml");
    expectAssignmentError(() => parseMusicXmlAssignment(single(c4(1), 0)), "invalid_musicxml");
    expectAssignmentError(() => parseAssignmentFile(new Uint8Array([0x50, 0x4b, 0x03, 0x04, 1, 2, 3])), "unsupported_musicxml");
    expectAssignmentError(() => parseAssignmentFile(enc("ID3\x03 this is an mp3, not a score")), "unrecognised_format");
    const noise = new Uint8Array(2048).map((_, i) => (i * 7919 + 13) % 251);
    expectAssignmentError(() => parseAssignmentFile(noise), "unrecognised_format");
  });
});

describe("files written by Tapernote's own exporters (lib/export) read back as assignments", () => {
  const demo = JSON.parse(readFileSync(fileURLToPath(new URL("../../../demo/two-hand-study.json", import.meta.url)), "utf8")).notes;
  const key = (n: { pitch: number; onsetSec: number }) => `${n.pitch}@${n.onsetSec.toFixed(3)}`;

  it("MusicXML: the quantised notes come back (ties rejoined, hidden rests skipped)", () => {
    const { xml, layout } = writeMusicXml(demo, { tempoBpm: 96, quantize: "1/16" });
    const secPerDiv = 60 / layout.tempoBpm / layout.divisionsPerQuarter;
    const written = layout.notes
      .map((q) => ({ pitch: q.pitch, onsetSec: q.startDiv * secPerDiv, offsetSec: q.endDiv * secPerDiv }))
      .sort((a, b) => a.onsetSec - b.onsetSec || a.pitch - b.pitch);
    const read = parseMusicXmlAssignment(xml);
    expect(read.map(key)).toEqual(written.map(key));
    read.forEach((n, i) => expect(n.offsetSec).toBeCloseTo(written[i].offsetSec, 6));
  });

  it("Standard MIDI File: onsets, offsets and pitches within a tick", () => {
    const { bytes, layout } = writeSmf(demo);
    const tickSec = layout.microsecondsPerQuarter / 1e6 / layout.ticksPerQuarter;
    const read = parseMidiAssignment(bytes);
    expect(read).toHaveLength(demo.length);
    const sorted = [...demo].sort((a, b) => a.onsetSec - b.onsetSec || a.pitch - b.pitch);
    read.forEach((n, i) => {
      expect(n.pitch).toBe(sorted[i].pitch);
      expect(Math.abs(n.onsetSec - sorted[i].onsetSec)).toBeLessThanOrEqual(tickSec);
      expect(Math.abs(n.offsetSec - sorted[i].offsetSec)).toBeLessThanOrEqual(tickSec);
    });
  });
});
