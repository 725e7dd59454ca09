import { execFileSync } from "node:child_process";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { parseMidi } from "midi-file";
import { afterAll, describe, expect, it } from "vitest";
import { estimateTempoBpm, notesToSmf, type ExportNote } from "@/lib/export";
import { rng } from "../../support/random";

// Outside checks: the file is read back by midi-file 1.2.4 (npm) and, where Debian's python3-mido is
// installed, by mido; expected values come from the MIDI 1.0 specification (REFERENCES.md §6):
// header MThd format/tracks/division, tempo FF 51 in µs per quarter, time signature FF 58,
// pitch bend 14-bit around 8192 with its range set by RPN 0 (CC101 0, CC100 0, CC6, CC38).

/** Voices that never overlap themselves (as the engine writes them), with odd times and cents. */
function takeNotes(seed: number, voices: number[] = [1, 2, 3]): ExportNote[] {
  const rand = rng(seed);
  const notes: ExportNote[] = [];
  for (const voice of voices) {
    let t = rand() * 0.3;
    for (let k = 0; k < 25; k++) {
      const len = 0.05 + rand() * 0.9;
      notes.push({
        onsetSec: t,
        offsetSec: t + len,
        pitch: 36 + Math.floor(rand() * 60),
        cents: Math.round((rand() * 2 - 1) * 5000) / 100, // −50 … 50, two decimals
        velocity: 1 + Math.floor(rand() * 127),
        voice,
      });
      t += len + (rand() < 0.3 ? rand() * 0.5 : 0);
    }
  }
  return notes;
}

type Event = { tick: number; type: string; [key: string]: any };

/** midi-file's events per track with absolute ticks. */
function readWithMidiFile(bytes: Uint8Array) {
  const data = parseMidi(bytes);
  const tracks: Event[][] = data.tracks.map((track) => {
    let tick = 0;
    return track.map((e) => {
      tick += e.deltaTime;
      return { ...e, tick };
    });
  });
  return { header: data.header, tracks };
}

interface ReadNote {
  start: number;
  length: number;
  pitch: number;
  velocity: number;
  channel: number;
  /** The channel's pitch bend (signed) in force at the note-on. */
  bend: number | undefined;
}

/** Notes of one track: note-on … note-off (or note-on with velocity 0), with the bend in force. */
function notesOfTrack(events: Event[]): ReadNote[] {
  const open = new Map<number, ReadNote>();
  const out: ReadNote[] = [];
  let bend: number | undefined;
  for (const e of events) {
    if (e.type === "pitchBend") bend = e.value;
    if (e.type === "noteOn" && e.velocity > 0) {
      const n = { start: e.tick, length: -1, pitch: e.noteNumber, velocity: e.velocity, channel: e.channel, bend };
      open.set(e.noteNumber, n);
      out.push(n);
    } else if (e.type === "noteOff" || (e.type === "noteOn" && e.velocity === 0)) {
      const n = open.get(e.noteNumber)!;
      n.length = e.tick - n.start;
      open.delete(e.noteNumber);
    }
  }
  return out;
}

const expectedTick = (sec: number, usPerQuarter: number, division: number) => Math.round(((sec * 1e6) / usPerQuarter) * division);

describe("Standard MIDI File read back by midi-file 1.2.4", () => {
  const notes = takeNotes(7);
  const bytes = notesToSmf(notes, { tempoBpm: 96, timeSignature: [3, 4], ticksPerQuarter: 480, pitchBend: true });
  const { header, tracks } = readWithMidiFile(bytes);

  it("has an MThd of format 1, a header track plus one per voice, and the division", () => {
    expect(String.fromCharCode(...bytes.slice(0, 4))).toBe("MThd");
    expect(header.format).toBe(1);
    expect(header.numTracks).toBe(4);
    expect(tracks.length).toBe(4);
    expect(header.ticksPerBeat).toBe(480);
  });

  it("has the tempo in µs per quarter and the time signature in the header track", () => {
    const tempo = tracks[0].filter((e) => e.type === "setTempo");
    expect(tempo).toHaveLength(1);
    expect(tempo[0].tick).toBe(0);
    expect(tempo[0].microsecondsPerBeat).toBe(625_000); // 60e6 / 96
    const ts = tracks[0].filter((e) => e.type === "timeSignature");
    expect(ts).toHaveLength(1);
    expect([ts[0].numerator, ts[0].denominator]).toEqual([3, 4]);
  });

  it("names each track after its voice and gives each voice its own channel, never channel 10", () => {
    expect(tracks.slice(1).map((t) => t.find((e) => e.type === "trackName")?.text)).toEqual(["Voice 1", "Voice 2", "Voice 3"]);
    const channels = tracks.slice(1).map((t) => [...new Set(t.filter((e) => "channel" in e).map((e) => e.channel))]);
    expect(channels).toEqual([[0], [1], [2]]);
  });

  it("writes every note's start, length, pitch and velocity to the tick", () => {
    for (const [i, voice] of [1, 2, 3].entries()) {
      const want = notes
        .filter((n) => n.voice === voice)
        .map((n) => {
          const start = expectedTick(n.onsetSec, 625_000, 480);
          return { start, length: Math.max(1, expectedTick(n.offsetSec, 625_000, 480) - start), pitch: n.pitch, velocity: n.velocity };
        });
      const got = notesOfTrack(tracks[i + 1]).map(({ start, length, pitch, velocity }) => ({ start, length, pitch, velocity }));
      expect(got).toEqual(want);
    }
  });

  it("sets the bend range with RPN 0 before any note, then the null RPN", () => {
    for (const track of tracks.slice(1)) {
      const firstNote = track.findIndex((e) => e.type === "noteOn");
      const ccs = track.slice(0, firstNote).filter((e) => e.type === "controller").map((e) => [e.controllerType, e.value]);
      expect(ccs).toEqual([[101, 0], [100, 0], [6, 2], [38, 0], [101, 127], [100, 127]]);
    }
  });

  it("puts a bend before every note that decodes to its cents within 1 cent (±2 semitones)", () => {
    for (const [i, voice] of [1, 2, 3].entries()) {
      const want = notes.filter((n) => n.voice === voice);
      const got = notesOfTrack(tracks[i + 1]);
      expect(got).toHaveLength(want.length);
      got.forEach((n, k) => {
        expect(n.bend).toBeDefined();
        expect(n.bend!).toBeGreaterThanOrEqual(-8192);
        expect(n.bend!).toBeLessThanOrEqual(8191);
        expect(Math.abs((n.bend! / 8192) * 200 - want[k].cents)).toBeLessThan(1);
      });
      // and the bend sits on the note's own tick, not on the previous note
      const track = tracks[i + 1];
      for (const [j, e] of track.entries()) if (e.type === "noteOn") expect(track[j - 1]).toMatchObject({ type: "pitchBend", tick: e.tick });
    }
  });

  it("decodes with a wider bend range too (±12 semitones)", () => {
    const wide = readWithMidiFile(notesToSmf(notes, { tempoBpm: 96, pitchBend: true, bendRangeSemitones: 12 }));
    const rpn = wide.tracks[1].filter((e) => e.type === "controller" && e.controllerType === 6);
    expect(rpn[0].value).toBe(12);
    const got = notesOfTrack(wide.tracks[1]);
    const want = notes.filter((n) => n.voice === 1);
    got.forEach((n, k) => expect(Math.abs((n.bend! / 8192) * 1200 - want[k].cents)).toBeLessThan(1));
  });

  it("clamps a bend at the top of the 14-bit range", () => {
    const one = [{ onsetSec: 0, offsetSec: 1, pitch: 60, cents: 100, velocity: 80, voice: 1 }];
    const t = readWithMidiFile(notesToSmf(one, { tempoBpm: 120, pitchBend: true, bendRangeSemitones: 1 })).tracks[1];
    expect(t.find((e) => e.type === "pitchBend")?.value).toBe(8191);
  });
});

describe("MIDI options", () => {
  it("writes no bends or RPN without pitchBend", () => {
    const { tracks } = readWithMidiFile(notesToSmf(takeNotes(3), { tempoBpm: 120 }));
    expect(tracks.flat().filter((e) => e.type === "pitchBend" || e.type === "controller")).toHaveLength(0);
  });

  it("skips channel 10 (index 9) when there are ten or more voices", () => {
    const voices = Array.from({ length: 12 }, (_, k) => k + 1);
    const { tracks } = readWithMidiFile(notesToSmf(takeNotes(5, voices), { tempoBpm: 120, pitchBend: true }));
    const channels = tracks.slice(1).map((t) => t.find((e) => e.type === "noteOn")!.channel);
    expect(channels).toEqual([0, 1, 2, 3, 4, 5, 6, 7, 8, 10, 11, 12]);
  });

  it("quantises onsets and offsets to 1/16 at the tempo and never to zero length", () => {
    const notes = takeNotes(11);
    notes.push({ onsetSec: 30.01, offsetSec: 30.02, pitch: 70, cents: 0, velocity: 64, voice: 1 }); // shorter than the grid
    const { tracks } = readWithMidiFile(notesToSmf(notes, { tempoBpm: 120, quantize: "1/16" }));
    const step = 120; // 480 / 4
    for (const [i, voice] of [1, 2, 3].entries()) {
      const got = notesOfTrack(tracks[i + 1]).map((n) => [n.start, n.length, n.pitch]);
      const want = notes
        .filter((n) => n.voice === voice)
        .map((n) => {
          const on = Math.round(expectedTick(n.onsetSec, 500_000, 480) / step) * step;
          let off = Math.round(expectedTick(n.offsetSec, 500_000, 480) / step) * step;
          if (off <= on) off = on + step;
          return [on, off - on, n.pitch];
        })
        // notes that snap to one tick come out lowest first
        .sort((a, b) => a[0] - b[0] || a[2] - b[2]);
      expect(got).toEqual(want);
      expect(got.every(([, length]) => length >= step)).toBe(true);
    }
  });

  it("estimates the tempo from the onsets when none is given", () => {
    const beatSec = 60 / 150;
    const notes = Array.from({ length: 32 }, (_, k) => ({ onsetSec: k * beatSec, offsetSec: k * beatSec + 0.2, pitch: 60 + (k % 5), cents: 0, velocity: 90, voice: 1 }));
    const { tracks } = readWithMidiFile(notesToSmf(notes));
    const us = tracks[0].find((e) => e.type === "setTempo")!.microsecondsPerBeat;
    expect(us).toBe(Math.round(60e6 / estimateTempoBpm(notes.map((n) => n.onsetSec))));
    expect(Math.abs(60e6 / us - 150)).toBeLessThan(1);
  });

  it("writes a header track only for an empty note list", () => {
    const { header, tracks } = readWithMidiFile(notesToSmf([]));
    expect(header.numTracks).toBe(1);
    expect(tracks[0].find((e) => e.type === "setTempo")!.microsecondsPerBeat).toBe(500_000);
  });

  it("ends an earlier note of the same pitch in one voice where the later one starts", () => {
    const notes = [
      { onsetSec: 0, offsetSec: 1, pitch: 60, cents: 0, velocity: 90, voice: 1 },
      { onsetSec: 0.5, offsetSec: 1.5, pitch: 60, cents: 0, velocity: 90, voice: 1 },
    ];
    const got = notesOfTrack(readWithMidiFile(notesToSmf(notes, { tempoBpm: 120 })).tracks[1]);
    expect(got.map((n) => [n.start, n.length])).toEqual([[0, 480], [480, 960]]);
  });

  it("gives notes of one voice that start on one tick one bend with their mean cents", () => {
    const chord = [
      { onsetSec: 0, offsetSec: 1, pitch: 60, cents: 10, velocity: 90, voice: 1 },
      { onsetSec: 0, offsetSec: 1, pitch: 64, cents: -20, velocity: 90, voice: 1 },
    ];
    const t = readWithMidiFile(notesToSmf(chord, { tempoBpm: 120, pitchBend: true })).tracks[1];
    const bends = t.filter((e) => e.type === "pitchBend");
    expect(bends).toHaveLength(1);
    expect(bends[0].value).toBe(Math.round((-5 / 200) * 8192));
    expect(t.findIndex((e) => e.type === "pitchBend")).toBeLessThan(t.findIndex((e) => e.type === "noteOn"));
  });

  it("writes a long take in linear time (20 000 notes well under 5 s)", () => {
    const notes = Array.from({ length: 20_000 }, (_, k) => ({ onsetSec: k * 0.3, offsetSec: k * 0.3 + 0.25, pitch: 40 + (k % 40), cents: (k % 21) - 10, velocity: 90, voice: 1 + (k % 4) }));
    const started = performance.now();
    const bytes = notesToSmf(notes, { tempoBpm: 100, pitchBend: true });
    expect(performance.now() - started).toBeLessThan(5000);
    const { tracks } = readWithMidiFile(bytes);
    expect(tracks.slice(1).reduce((sum, t) => sum + notesOfTrack(t).length, 0)).toBe(20_000);
  });

  it("refuses options out of range", () => {
    expect(() => notesToSmf([], { ticksPerQuarter: 0 })).toThrow(RangeError);
    expect(() => notesToSmf([], { timeSignature: [4, 3] })).toThrow(RangeError);
    expect(() => notesToSmf([], { bendRangeSemitones: 0.5 })).toThrow(RangeError);
    expect(() => notesToSmf([], { quantize: "1/0" })).toThrow(RangeError);
  });
});

// mido (Debian's python3-mido) through tests/unit/export/mido_dump.py. Debian installs it for its
// own interpreter, which another python3 (pyenv, a venv) may shadow on PATH.
const DUMP = fileURLToPath(new URL("./mido_dump.py", import.meta.url));
const python = ["python3", "/usr/bin/python3"].find((py) => {
  try {
    execFileSync(py, ["-c", "import mido"], { stdio: "ignore" });
    return true;
  } catch {
    return false;
  }
});
if (!python) console.warn("mido check skipped: no python3 here can `import mido` (apt-get install python3-mido)");

describe.skipIf(!python)("Standard MIDI File read back by mido (python3-mido)", () => {
  const dir = mkdtempSync(join(tmpdir(), "tapernote-export-"));
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  it("gives the same header, tempo, notes to the tick and bends within 1 cent", () => {
    const notes = takeNotes(21);
    const path = join(dir, "take.mid");
    writeFileSync(path, notesToSmf(notes, { tempoBpm: 132, timeSignature: [6, 8], ticksPerQuarter: 960, pitchBend: true }));
    const dump = JSON.parse(execFileSync(python!, [DUMP, path], { encoding: "utf8" }));
    expect(dump.type).toBe(1);
    expect(dump.ticks_per_beat).toBe(960);
    expect(dump.tracks).toHaveLength(4);
    const us = Math.round(60e6 / 132);
    expect(dump.tracks[0].find((m: any) => m.type === "set_tempo").tempo).toBe(us);
    const ts = dump.tracks[0].find((m: any) => m.type === "time_signature");
    expect([ts.numerator, ts.denominator]).toEqual([6, 8]);

    for (const [i, voice] of [1, 2, 3].entries()) {
      const msgs = dump.tracks[i + 1];
      expect(msgs.find((m: any) => m.type === "track_name").name).toBe(`Voice ${voice}`);
      const rpn = msgs.filter((m: any) => m.type === "control_change").map((m: any) => [m.control, m.value]);
      expect(rpn).toEqual([[101, 0], [100, 0], [6, 2], [38, 0], [101, 127], [100, 127]]);
      const got: { start: number; length: number; note: number; velocity: number; bend: number }[] = [];
      let bend = NaN;
      for (const m of msgs) {
        if (m.type === "pitchwheel") bend = m.pitch;
        if (m.type === "note_on" && m.velocity > 0) got.push({ start: m.time, length: -1, note: m.note, velocity: m.velocity, bend });
        if (m.type === "note_off" || (m.type === "note_on" && m.velocity === 0)) {
          const open = got.find((n) => n.note === m.note && n.length < 0)!;
          open.length = m.time - open.start;
        }
      }
      const want = notes.filter((n) => n.voice === voice);
      expect(got).toHaveLength(want.length);
      got.forEach((n, k) => {
        const start = expectedTick(want[k].onsetSec, us, 960);
        expect(n.start).toBe(start);
        expect(n.length).toBe(Math.max(1, expectedTick(want[k].offsetSec, us, 960) - start));
        expect(n.note).toBe(want[k].pitch);
        expect(n.velocity).toBe(want[k].velocity);
        expect(Math.abs((n.bend / 8192) * 200 - want[k].cents)).toBeLessThan(1);
      });
    }
  });
});
