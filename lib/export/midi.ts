import m from "@tonejs/midi";
import mf from "midi-file";
import type { MidiEvent } from "midi-file";
import { parseGrid, snapInterval } from "./grid";
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
 * @tonejs/midi 2.0.28 writes a pitch bend's `value` unchanged as 8192 + value, so it is given the
 * signed 14-bit integer (a fraction −1 … 1 would be written as the centre). It orders events that
 * share a tick as notes, then controllers by number, then bends; the file is therefore passed once
 * through midi-file (the reader and writer @tonejs/midi is built on) to put each tick's events in the
 * order a player needs: meta events, program change, RPN set-up, note-offs, pitch bend, note-ons.
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
  // @tonejs/midi writes floor(60e6 / bpm) µs; + 0.5 µs keeps the floor on the intended integer.
  midi.header.tempos = [{ ticks: 0, bpm: 60e6 / (usPerQuarter + 0.5) }];
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
      for (const n of placed) byTick.set(n.on, [...(byTick.get(n.on) ?? []), n.cents]);
      for (const [tick, cents] of byTick) {
        const mean = cents.reduce((a, b) => a + b, 0) / cents.length;
        track.addPitchBend({ ticks: tick, value: centsToBend(mean, range) });
      }
    }
  });

  const bytes = reorder(midi.toArray(), opts.pitchBend ? range : null);
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

type Ev = MidiEvent & { channel?: number; running?: boolean };

/** Rank of an event among those on the same tick. */
function rank(e: Ev): number {
  switch (e.type) {
    case "programChange":
      return 1;
    case "controller":
      return 2;
    case "noteOff":
      return 3;
    case "pitchBend":
      return 4;
    case "noteOn":
      return 5;
    case "endOfTrack":
      return 9;
    default:
      return 0; // meta events: names, tempo, time signature
  }
}

function reorder(smf: Uint8Array, bendRange: number | null): Uint8Array {
  const data = mf.parseMidi(smf);
  data.tracks = data.tracks.map((track, index) => {
    let tick = 0;
    let timed = track.map((e: Ev, order) => {
      tick += e.deltaTime;
      delete e.running;
      return { e, tick, order };
    });
    if (bendRange !== null && index > 0) {
      const channel = timed.find((t) => "channel" in t.e)?.e.channel ?? 0;
      const rpn: [number, number][] = [[101, 0], [100, 0], [6, bendRange], [38, 0], [101, 127], [100, 127]];
      timed = timed.concat(
        rpn.map(([controllerType, value], k) => ({
          e: { deltaTime: 0, type: "controller", channel, controllerType, value } as Ev,
          tick: 0,
          order: -rpn.length + k,
        })),
      );
    }
    timed.sort((a, b) => a.tick - b.tick || rank(a.e) - rank(b.e) || a.order - b.order);
    let last = 0;
    return timed.map(({ e, tick: t }) => {
      e.deltaTime = t - last;
      last = t;
      return e;
    });
  });
  return Uint8Array.from(mf.writeMidi(data, { running: false }));
}
