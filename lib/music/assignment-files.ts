/**
 * Expected notes of an assignment from a Standard MIDI File or a MusicXML file (pure).
 *
 * - MIDI: read with @tonejs/midi, which applies the file's tempo map (120 bpm when it has
 *   none, as the MIDI 1.0 specification's default). One voice per track that has notes;
 *   percussion (channel 10) is left out.
 * - MusicXML (uncompressed, `score-partwise`, MusicXML 4.0): read with fast-xml-parser in
 *   document order, which `<backup>`/`<forward>` need. Pitch = 12·(octave + 1) + step +
 *   round(alter) (MIDI 60 = C4). Time in quarter notes = duration / divisions (divisions may
 *   change at any `<attributes>`); seconds through the tempo map of `<sound tempo>` (quarter
 *   notes per minute), else `<metronome>` (beat unit converted to quarters), else 120 bpm.
 *   `<chord/>` notes start with the previous note; rests and `<forward>` advance time,
 *   `<backup>` goes back; grace notes are left out; tied notes (`<tie type="start|stop">`)
 *   become one note. A measure lasts as long as its furthest point. Repeats are not unfolded
 *   (written order). Voices are numbered 1, 2 … by first appearance of each (part, `<voice>`).
 *
 * Every failure is an AssignmentFileError with a code and a message meant for the person who
 * uploaded the file.
 */
import m from "@tonejs/midi";
import { XMLParser, XMLValidator } from "fast-xml-parser";

const { Midi } = m;

export interface ExpectedNote {
  onsetSec: number;
  offsetSec: number;
  /** MIDI note number. */
  pitch: number;
  voice: number;
}

export type AssignmentFileErrorCode =
  | "unrecognised_format"
  | "invalid_midi"
  | "invalid_musicxml"
  | "unsupported_musicxml"
  | "no_notes"
  | "too_many_notes";

/** The one error type of assignment parsing. */
export class AssignmentFileError extends Error {
  readonly code: AssignmentFileErrorCode;
  constructor(code: AssignmentFileErrorCode, message: string) {
    super(message);
    this.name = "AssignmentFileError";
    this.code = code;
  }
}

/** Most notes an assignment may have. */
export const MAX_ASSIGNMENT_NOTES = 50_000;
/** Tempo when a file gives none (MIDI 1.0 default; MusicXML likewise). */
export const DEFAULT_TEMPO_BPM = 120;

const round6 = (x: number) => Math.round(x * 1e6) / 1e6;

function finish(notes: ExpectedNote[], what: string): ExpectedNote[] {
  if (notes.length === 0) throw new AssignmentFileError("no_notes", `The ${what} has no notes.`);
  if (notes.length > MAX_ASSIGNMENT_NOTES)
    throw new AssignmentFileError("too_many_notes", `The ${what} has ${notes.length} notes; at most ${MAX_ASSIGNMENT_NOTES} are allowed.`);
  return notes
    .map((n) => ({ ...n, onsetSec: round6(n.onsetSec), offsetSec: round6(n.offsetSec) }))
    .sort((a, b) => a.onsetSec - b.onsetSec || a.pitch - b.pitch || a.voice - b.voice);
}

export type AssignmentFormat = "midi" | "musicxml";

/** Which kind of assignment file the bytes are, from their content (not their name). */
export function detectAssignmentFormat(bytes: Uint8Array): AssignmentFormat {
  if (bytes.length >= 4 && bytes[0] === 0x4d && bytes[1] === 0x54 && bytes[2] === 0x68 && bytes[3] === 0x64) return "midi"; // "MThd"
  if (bytes.length >= 4 && bytes[0] === 0x50 && bytes[1] === 0x4b && bytes[2] === 0x03 && bytes[3] === 0x04)
    throw new AssignmentFileError(
      "unsupported_musicxml",
      "This looks like a compressed MusicXML file (.mxl). Export the score as uncompressed MusicXML (.musicxml or .xml).",
    );
  const head = decodeText(bytes.subarray(0, 512)).trimStart();
  if (head.startsWith("<")) return "musicxml";
  throw new AssignmentFileError("unrecognised_format", "The file is neither a Standard MIDI File nor a MusicXML file.");
}

/** Expected notes of a MIDI or MusicXML file, told apart by content. */
export function parseAssignmentFile(bytes: Uint8Array): ExpectedNote[] {
  return detectAssignmentFormat(bytes) === "midi" ? parseMidiAssignment(bytes) : parseMusicXmlAssignment(bytes);
}

/** Expected notes of a Standard MIDI File (see the module comment). */
export function parseMidiAssignment(bytes: Uint8Array | ArrayBuffer): ExpectedNote[] {
  let midi: InstanceType<typeof Midi>;
  try {
    midi = new Midi(bytes instanceof Uint8Array ? bytes : new Uint8Array(bytes));
  } catch (e) {
    throw new AssignmentFileError("invalid_midi", `The file is not a readable Standard MIDI File (${(e as Error).message}).`);
  }
  const notes: ExpectedNote[] = [];
  let voice = 0;
  for (const track of midi.tracks) {
    if (track.channel === 9 || track.notes.length === 0) continue;
    voice++;
    for (const n of track.notes) {
      if (!Number.isFinite(n.time) || !Number.isFinite(n.duration)) continue;
      notes.push({ onsetSec: n.time, offsetSec: n.time + Math.max(0, n.duration), pitch: n.midi, voice });
    }
  }
  return finish(notes, "MIDI file");
}

function decodeText(bytes: Uint8Array): string {
  if (bytes.length >= 2 && bytes[0] === 0xff && bytes[1] === 0xfe) return new TextDecoder("utf-16le").decode(bytes.subarray(2));
  if (bytes.length >= 2 && bytes[0] === 0xfe && bytes[1] === 0xff) return new TextDecoder("utf-16be").decode(bytes.subarray(2));
  return new TextDecoder("utf-8").decode(bytes);
}

// fast-xml-parser's preserveOrder form: each element is { tagName: children[], ":@"?: attributes }
type XmlNode = Record<string, unknown>;
const tagOf = (el: XmlNode) => Object.keys(el).find((k) => k !== ":@")!;
const kids = (el: XmlNode): XmlNode[] => (el[tagOf(el)] as XmlNode[]) ?? [];
const attr = (el: XmlNode, name: string): string | undefined => (el[":@"] as Record<string, string> | undefined)?.[name];
const child = (el: XmlNode, tag: string) => kids(el).find((c) => tagOf(c) === tag);
const childrenNamed = (el: XmlNode, tag: string) => kids(el).filter((c) => tagOf(c) === tag);
function text(el: XmlNode | undefined): string | undefined {
  if (!el) return undefined;
  const t = kids(el).find((c) => tagOf(c) === "#text");
  return t === undefined ? undefined : String(t["#text"]).trim();
}
function numberIn(el: XmlNode | undefined, tag: string): number | undefined {
  const t = el ? text(child(el, tag)) : undefined;
  if (t === undefined || t === "") return undefined;
  const v = Number(t);
  return Number.isFinite(v) ? v : undefined;
}

const STEP_PC: Record<string, number> = { C: 0, D: 2, E: 4, F: 5, G: 7, A: 9, B: 11 };
const BEAT_UNIT_QUARTERS: Record<string, number> = {
  maxima: 32,
  long: 16,
  breve: 8,
  whole: 4,
  half: 2,
  quarter: 1,
  eighth: 0.5,
  "16th": 0.25,
  "32nd": 0.125,
  "64th": 0.0625,
};

interface TempoEvent {
  atQuarters: number;
  bpm: number;
}

/** Tempo (quarter notes per minute) a `<direction>` or `<sound>` sets, if any. */
function tempoOf(el: XmlNode): number | undefined {
  const tag = tagOf(el);
  if (tag === "sound") {
    const t = Number(attr(el, "tempo"));
    return t > 0 ? t : undefined;
  }
  if (tag !== "direction") return undefined;
  const sound = child(el, "sound");
  const fromSound = sound ? tempoOf(sound) : undefined;
  if (fromSound) return fromSound;
  for (const dt of childrenNamed(el, "direction-type")) {
    const met = child(dt, "metronome");
    if (!met) continue;
    const unit = BEAT_UNIT_QUARTERS[text(child(met, "beat-unit")) ?? ""];
    const perMinute = parseFloat((text(child(met, "per-minute")) ?? "").replace(/^[^0-9.]+/, ""));
    if (unit && perMinute > 0) {
      const dots = childrenNamed(met, "beat-unit-dot").length;
      return perMinute * unit * (2 - 1 / 2 ** dots);
    }
  }
  return undefined;
}

/** Seconds at a position in quarter notes through a sorted tempo map. */
function quartersToSec(q: number, tempi: TempoEvent[]): number {
  let sec = 0;
  let at = 0;
  let bpm = DEFAULT_TEMPO_BPM;
  for (const ev of tempi) {
    if (ev.atQuarters >= q) break;
    sec += ((ev.atQuarters - at) * 60) / bpm;
    at = ev.atQuarters;
    bpm = ev.bpm;
  }
  return sec + ((q - at) * 60) / bpm;
}

/** Expected notes of an uncompressed partwise MusicXML file (see the module comment). */
export function parseMusicXmlAssignment(input: string | Uint8Array): ExpectedNote[] {
  const xml = typeof input === "string" ? input : decodeText(input);
  const valid = XMLValidator.validate(xml);
  if (valid !== true)
    throw new AssignmentFileError("invalid_musicxml", `The MusicXML file is not well-formed XML: ${valid.err.msg} (line ${valid.err.line}).`);
  let doc: XmlNode[];
  try {
    doc = new XMLParser({ preserveOrder: true, ignoreAttributes: false, attributeNamePrefix: "", parseTagValue: false, trimValues: true }).parse(xml);
  } catch (e) {
    throw new AssignmentFileError("invalid_musicxml", `The MusicXML file could not be read (${(e as Error).message}).`);
  }
  const root = doc.find((el) => !tagOf(el).startsWith("?") && !tagOf(el).startsWith("!") && tagOf(el) !== "#text" && tagOf(el) !== "#comment");
  const rootTag = root ? tagOf(root) : "";
  if (rootTag === "score-timewise")
    throw new AssignmentFileError("unsupported_musicxml", "Timewise MusicXML is not supported; export the score as partwise MusicXML.");
  if (rootTag !== "score-partwise")
    throw new AssignmentFileError("invalid_musicxml", `The file is XML but not a MusicXML score (its root element is <${rootTag || "?"}>).`);

  interface RawNote {
    onQ: number;
    offQ: number;
    pitch: number;
    voiceKey: string;
  }
  const raw: RawNote[] = [];
  const tempi: TempoEvent[] = [];
  const voiceNumbers = new Map<string, number>();

  childrenNamed(root!, "part").forEach((part, partIndex) => {
    let divisions = 1;
    let measureStartQ = 0;
    const openTies = new Map<string, RawNote>();
    for (const measure of childrenNamed(part, "measure")) {
      let cursorQ = 0;
      let furthestQ = 0;
      let chordOnQ = 0;
      for (const el of kids(measure)) {
        const tag = tagOf(el);
        if (tag === "attributes") {
          const d = numberIn(el, "divisions");
          if (d !== undefined) {
            if (!(d > 0)) throw new AssignmentFileError("invalid_musicxml", `Measure ${attr(measure, "number") ?? "?"} has divisions ${d}; it must be positive.`);
            divisions = d;
          }
        } else if (tag === "backup" || tag === "forward") {
          const dq = (numberIn(el, "duration") ?? 0) / divisions;
          cursorQ = Math.max(0, cursorQ + (tag === "backup" ? -dq : dq));
          furthestQ = Math.max(furthestQ, cursorQ);
        } else if (tag === "direction" || tag === "sound") {
          const bpm = tempoOf(el);
          if (bpm) tempi.push({ atQuarters: measureStartQ + cursorQ, bpm });
        } else if (tag === "note") {
          if (child(el, "grace")) continue;
          const durQ = (numberIn(el, "duration") ?? 0) / divisions;
          const isChord = child(el, "chord") !== undefined;
          const onQ = isChord ? chordOnQ : cursorQ;
          if (!isChord) {
            chordOnQ = cursorQ;
            cursorQ += durQ;
            furthestQ = Math.max(furthestQ, cursorQ);
          }
          const pitchEl = child(el, "pitch");
          if (!pitchEl || child(el, "rest") || child(el, "cue")) continue;
          const step = text(child(pitchEl, "step"))?.toUpperCase() ?? "";
          const octave = numberIn(pitchEl, "octave");
          if (!(step in STEP_PC) || octave === undefined)
            throw new AssignmentFileError("invalid_musicxml", `A note in measure ${attr(measure, "number") ?? "?"} has no valid step and octave.`);
          const pitch = 12 * (octave + 1) + STEP_PC[step] + Math.round(numberIn(pitchEl, "alter") ?? 0);
          if (pitch < 0 || pitch > 127) throw new AssignmentFileError("invalid_musicxml", `A note in measure ${attr(measure, "number") ?? "?"} is outside the MIDI range.`);
          const voiceKey = `${partIndex}:${text(child(el, "voice")) ?? "1"}`;
          if (!voiceNumbers.has(voiceKey)) voiceNumbers.set(voiceKey, voiceNumbers.size + 1);
          const ties = childrenNamed(el, "tie").map((t) => attr(t, "type"));
          const tieKey = `${voiceKey}:${pitch}`;
          const absOn = measureStartQ + onQ;
          const open = openTies.get(tieKey) ?? openTies.get(`${partIndex}:*:${pitch}`);
          if (ties.includes("stop") && open) {
            open.offQ = Math.max(open.offQ, absOn + durQ);
            if (!ties.includes("start")) {
              openTies.delete(tieKey);
              openTies.delete(`${partIndex}:*:${pitch}`);
            }
            continue;
          }
          const note: RawNote = { onQ: absOn, offQ: absOn + durQ, pitch, voiceKey };
          raw.push(note);
          if (ties.includes("start")) {
            openTies.set(tieKey, note);
            openTies.set(`${partIndex}:*:${pitch}`, note);
          }
        }
      }
      measureStartQ += furthestQ;
    }
  });

  tempi.sort((a, b) => a.atQuarters - b.atQuarters);
  const notes = raw.map((n) => ({
    onsetSec: quartersToSec(n.onQ, tempi),
    offsetSec: quartersToSec(n.offQ, tempi),
    pitch: n.pitch,
    voice: voiceNumbers.get(n.voiceKey)!,
  }));
  return finish(notes, "MusicXML file");
}
