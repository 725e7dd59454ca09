import m from "@tonejs/midi";
import { parseGrid, snapInterval } from "./grid";
import { encodeVlq } from "./vlq";
import { clampTempoBpm, estimateTempoBpm } from "./tempo";
import { checkTimeSignature, DEFAULT_TIME_SIGNATURE, voicesOf, type ExportNote, type TimeSignature } from "./types";

const { Midi } = m;

export interface SmfOptions {
  /** Quarter notes per minute; clamped to 40 … 240. Default: estimated from the onsets (tempo.ts). */
  tempoBpm?: number;
  /** Default [4, 4]. */
  timeSignature?: TimeSignature;
  /** Division of the header (ticks per quarter note), 24 … 32767. Default 480. */
  ticksPerQuarter?: number;
  /** A pitch bend before each note carrying its cents; each voice on its own channel. Default false. */
  pitchBend?: boolean;
  /** Bend range set with RPN 0 when `pitchBend` is on, whole semitones 1 … 24. Default 2 (General MIDI). */
  bendRangeSemitones?: number;
  /** Snap onsets and offsets to this note value ("1/16", "1/8", "1/12" …) at the tempo. Default: none. */
  quantize?: string | null;
  /** General MIDI program (0 … 127) of every track. Default 0 (acoustic grand piano). */
  program?: number;
  /** Name of the header track (sequence name). Default "Tapernote". */
  title?: string;
}

/** What the writer decided, for callers that show it (and for tests). */
export interface SmfLayout {
  tempoBpm: number;
  microsecondsPerQuarter: number;
  ticksPerQuarter: number;
  /** Voice number → MIDI channel (0-based; channel index 9, "channel 10", is never used). */
  channels: Map<number, number>;
}

/** MIDI channels for voices in order: 0 … 15 without 9, the General MIDI percussion channel. */
export const VOICE_CHANNELS = [0, 1, 2, 3, 4, 5, 6, 7, 8, 10, 11, 12, 13, 14, 15];

/** Seconds → ticks at a constant tempo: round(sec · 10⁶ / µsPerQuarter · ticksPerQuarter). */
export function secToTicks(sec: number, microsecondsPerQuarter: number, ticksPerQuarter: number): number {
  return Math.round(((sec * 1e6) / microsecondsPerQuarter) * ticksPerQuarter);
}

/**
 * 14-bit pitch-bend value (signed, −8192 … 8191 around the centre 8192) that raises a note by
 * `cents` when the bend range is ±rangeSemitones: round(cents / 100 / range · 8192), clamped
 * (MIDI 1.0: pitch bend change, En ll mm; RPN 0 = pitch-bend sensitivity).
 */
export function centsToBend(cents: number, rangeSemitones: number): number {
  return Math.max(-8192, Math.min(8191, Math.round((cents / 100 / rangeSemitones) * 8192)));
}

/** Inverse of centsToBend (to the bend's resolution). */
export function bendToCents(bend: number, rangeSemitones: number): number {
  return (bend / 8192) * rangeSemitones * 100;
}

/**
 * Standard MIDI File, format 1, of a note list, written with @tonejs/midi.
 *
 * Track 0 holds the sequence name, the tempo (FF 51) and the time signature (FF 58); then one track
 * per voice, ascending, named "Voice N", with a program change and the voice's notes at their
 * velocities. Times become ticks at the one tempo of the file (`secToTicks`); a note lasts at least
 * one tick. Two notes of one pitch that overlap in one voice would share a key on one channel: the
 * earlier one is cut at the later onset.
 *
 * With `pitchBend`, each voice has its own channel (channel 10 skipped; past 15 voices channels
 * repeat and their bends collide), the bend range is set at tick 0 with RPN 0 (CC101 0, CC100 0,
 * CC6 range, CC38 0, then the null RPN CC101 127, CC100 127) and each onset gets a pitch bend
 * `centsToBend(cents, range)` just before its note-on. Notes of one voice starting on the same tick
 * share the channel's bend: it carries their mean cents.
 *
 * The file is built as a @tonejs/midi model (header tempo and time signature, tracks, notes, pitch
 * bends in the model's −1 … 1 convention) and serialised here (`encodeSmf`) rather than with the
 * model's own `toArray()`, which in @tonejs/midi 2.0.28 (through midi-file 1.2.4's writer):
 * takes time quadratic in the file's length (each delta time of two or more bytes copies the whole
 * buffer: 10 000 notes took 16 s); writes a bend's `value` as 8192 + value, so the model's own
 * −1 … 1 values come out as the centre; and orders a tick's events as notes, then controllers by
 * controller number, then bends, which puts a bend after its note-on and RPN 0 out of order.
 * `encodeSmf` orders each tick's events as a player needs them: meta events, program change,
 * RPN set-up, note-offs, pitch bend, note-ons.
 */
export function notesToSmf(notes: readonly ExportNote[], opts: SmfOptions = {}): Uint8Array {
  return writeSmf(notes, opts).bytes;
}

/** notesToSmf, also returning the tempo, division and channels it used. */
export function writeSmf(notes: readonly ExportNote[], opts: SmfOptions = {}): { bytes: Uint8Array; layout: SmfLayout } {
  const ppq = opts.ticksPerQuarter ?? 480;
  if (!Number.isInteger(ppq) || ppq < 24 || ppq > 0x7fff) throw new RangeError(`ticksPerQuarter ${ppq} is out of range 24 … 32767`);
  const timeSignature = opts.timeSignature ?? DEFAULT_TIME_SIGNATURE;
  checkTimeSignature(timeSignature);
  const range = opts.bendRangeSemitones ?? 2;
  if (!Number.isInteger(range) || range < 1 || range > 24) throw new RangeError(`bendRangeSemitones ${range} is not a whole number 1 … 24`);
  const program = opts.program ?? 0;

  const bpm = clampTempoBpm(opts.tempoBpm ?? estimateTempoBpm(notes.map((n) => n.onsetSec)));
  const usPerQuarter = Math.round(60e6 / bpm);
  const gridTicks = opts.quantize ? Math.max(1, Math.round(parseGrid(opts.quantize).quarters * ppq)) : 0;

  const midi = new Midi();
  midi.header.fromJSON({ ...midi.header.toJSON(), ppq, name: opts.title ?? "Tapernote" });
  midi.header.tempos = [{ ticks: 0, bpm: 60e6 / usPerQuarter }];
  midi.header.timeSignatures = [{ ticks: 0, timeSignature: [timeSignature[0], timeSignature[1]] }];
  midi.header.update();

  const channels = new Map<number, number>();
  voicesOf(notes).forEach((voice, i) => {
    const channel = VOICE_CHANNELS[i % VOICE_CHANNELS.length];
    channels.set(voice, channel);
    const track = midi.addTrack();
    track.name = `Voice ${voice}`;
    track.channel = channel;
    track.instrument.number = program;

    const placed = placeNotes(notes.filter((n) => n.voice === voice), usPerQuarter, ppq, gridTicks);
    for (const n of placed) {
      track.addNote({ midi: n.pitch, ticks: n.on, durationTicks: n.off - n.on, velocity: n.velocity / 127 });
    }
    if (opts.pitchBend) {
      const byTick = new Map<number, number[]>();
      for (const n of placed) {
        const list = byTick.get(n.on);
        if (list) list.push(n.cents);
        else byTick.set(n.on, [n.cents]);
      }
      for (const [tick, cents] of byTick) {
        const mean = cents.reduce((a, b) => a + b, 0) / cents.length;
        // the model's convention (as its reader gives it): value = bend / 8192, −1 … 1
        track.addPitchBend({ ticks: tick, value: centsToBend(mean, range) / 8192 });
      }
    }
  });

  const bytes = encodeSmf(midi, opts.pitchBend ? range : null);
  return { bytes, layout: { tempoBpm: 60e6 / usPerQuarter, microsecondsPerQuarter: usPerQuarter, ticksPerQuarter: ppq, channels } };
}

interface PlacedNote {
  on: number;
  off: number;
  pitch: number;
  cents: number;
  velocity: number;
}

function placeNotes(voiceNotes: readonly ExportNote[], usPerQuarter: number, ppq: number, gridTicks: number): PlacedNote[] {
  const placed = voiceNotes.map((n) => {
    let on = secToTicks(n.onsetSec, usPerQuarter, ppq);
    let off = secToTicks(n.offsetSec, usPerQuarter, ppq);
    if (gridTicks) [on, off] = snapInterval(on, off, gridTicks);
    if (off <= on) off = on + 1;
    const velocity = Math.max(1, Math.min(127, Math.round(n.velocity)));
    return { on, off, pitch: Math.round(n.pitch), cents: n.cents, velocity };
  });
  placed.sort((a, b) => a.on - b.on || a.pitch - b.pitch);
  // one key on one channel: a later note of the same pitch ends the earlier one
  const lastOfPitch = new Map<number, PlacedNote>();
  const kept: PlacedNote[] = [];
  for (const n of placed) {
    const prev = lastOfPitch.get(n.pitch);
    if (prev && prev.off > n.on) {
      if (prev.on === n.on) {
        prev.off = Math.max(prev.off, n.off);
        continue;
      }
      prev.off = n.on;
    }
    lastOfPitch.set(n.pitch, n);
    kept.push(n);
  }
  return kept;
}

/** Rank of an event among those on the same tick: the order a player needs them in. */
const RANK = { meta: 0, program: 1, controller: 2, noteOff: 3, pitchBend: 4, noteOn: 5 } as const;

interface TimedEvent {
  tick: number;
  rank: number;
  order: number;
  bytes: number[];
}

const utf8 = new TextEncoder();

function metaEvent(type: number, data: ArrayLike<number>): number[] {
  return [0xff, type, ...encodeVlq(data.length), ...Array.from(data)];
}

/**
 * Serialises the @tonejs/midi model as a Standard MIDI File (MIDI 1.0, "Standard MIDI Files 1.0"):
 * MThd (format 1, track count, division), then one MTrk per track with delta times as
 * variable-length quantities (vlq.ts), every status byte written (no running status), and each
 * tick's events in RANK order; RPN 0 set-up at tick 0 of each voice track when `bendRange` is set.
 */
function encodeSmf(midi: InstanceType<typeof Midi>, bendRange: number | null): Uint8Array {
  const tracks: TimedEvent[][] = [];
  const header: TimedEvent[] = [];
  let order = 0;
  const push = (list: TimedEvent[], tick: number, rank: number, bytes: number[]) => list.push({ tick, rank, order: order++, bytes });

  push(header, 0, RANK.meta, metaEvent(0x03, utf8.encode(midi.header.name)));
  for (const t of midi.header.tempos) {
    const us = Math.round(60e6 / t.bpm);
    push(header, t.ticks, RANK.meta, metaEvent(0x51, [(us >> 16) & 0xff, (us >> 8) & 0xff, us & 0xff]));
  }
  for (const ts of midi.header.timeSignatures) {
    const [num, den] = ts.timeSignature;
    // clocks per metronome click: one beat of the denominator (24 MIDI clocks per quarter)
    push(header, ts.ticks, RANK.meta, metaEvent(0x58, [num, Math.log2(den), Math.round((24 * 4) / den), 8]));
  }
  tracks.push(header);

  for (const track of midi.tracks) {
    const events: TimedEvent[] = [];
    const ch = track.channel & 0x0f;
    push(events, 0, RANK.meta, metaEvent(0x03, utf8.encode(track.name)));
    push(events, 0, RANK.program, [0xc0 | ch, track.instrument.number & 0x7f]);
    if (bendRange !== null) {
      for (const [cc, value] of [[101, 0], [100, 0], [6, bendRange], [38, 0], [101, 127], [100, 127]]) push(events, 0, RANK.controller, [0xb0 | ch, cc, value]);
    }
    for (const pb of track.pitchBends) {
      const v = Math.max(-8192, Math.min(8191, Math.round(pb.value * 8192))) + 8192;
      push(events, pb.ticks, RANK.pitchBend, [0xe0 | ch, v & 0x7f, (v >> 7) & 0x7f]);
    }
    for (const n of track.notes) {
      const velocity = Math.max(1, Math.min(127, Math.round(n.velocity * 127)));
      push(events, n.ticks, RANK.noteOn, [0x90 | ch, n.midi, velocity]);
      push(events, n.ticks + n.durationTicks, RANK.noteOff, [0x80 | ch, n.midi, 0]);
    }
    tracks.push(events);
  }

  const out: number[] = [];
  const u32 = (v: number) => out.push((v >>> 24) & 0xff, (v >>> 16) & 0xff, (v >>> 8) & 0xff, v & 0xff);
  const ascii = (s: string) => out.push(...Array.from(s, (c) => c.charCodeAt(0)));
  ascii("MThd");
  u32(6);
  out.push(0, 1, (tracks.length >> 8) & 0xff, tracks.length & 0xff, (midi.header.ppq >> 8) & 0x7f, midi.header.ppq & 0xff);
  for (const events of tracks) {
    events.sort((a, b) => a.tick - b.tick || a.rank - b.rank || a.order - b.order);
    const body: number[] = [];
    let last = 0;
    for (const e of events) {
      for (const b of encodeVlq(e.tick - last)) body.push(b);
      for (const b of e.bytes) body.push(b);
      last = e.tick;
    }
    body.push(0x00, 0xff, 0x2f, 0x00); // end of track
    ascii("MTrk");
    u32(body.length);
    for (const b of body) out.push(b);
  }
  return Uint8Array.from(out);
}
