/**
 * Renders the demo studio's takes (invented pieces, committed under demo/ as FLAC with their
 * ground truth), so the run command can seed and analyse them on first start:
 *   1. each piece is written as MIDI with @tonejs/midi (one voice per channel; pitch bend
 *      range ±2 semitones via RPN 0; a voice's mistuning as a bend before each note);
 *   2. Debian's `fluidsynth` renders it with the FluidR3 GM SoundFont (MIT licence), with
 *      reverb and chorus on, like a room;
 *   3. `sox` mixes to mono 22.05 kHz 16-bit FLAC.
 * Usage: npm run demo:render   (needs: apt-get install fluidsynth fluid-soundfont-gm sox)
 */
import { execFileSync } from "node:child_process";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import m from "@tonejs/midi";

const { Midi } = m;
const OUT = path.join(process.cwd(), "demo");
const SOUNDFONT = "/usr/share/sounds/sf2/FluidR3_GM.sf2";

type Voice = { program: number; name: string; bendCents?: number };
type DemoNote = { voice: number; key: number; onsetSec: number; durSec: number; velocity?: number };
type Piece = { file: string; title: string; description: string; voices: Voice[]; notes: DemoNote[] };

const beat = (b: number, bpm: number) => (b * 60) / bpm;

function chordExercise(): Piece {
  // I – IV – V7 – I in C, each chord held for two beats at 72 bpm, then arpeggiated; the
  // middle voice (the student's) is 14 cents flat throughout.
  const bpm = 72;
  const chords = [
    [48, 64, 67, 72],
    [53, 65, 69, 72],
    [55, 65, 71, 74],
    [48, 64, 67, 72],
  ];
  const notes: DemoNote[] = [];
  chords.forEach((ch, i) => ch.forEach((key, v) => notes.push({ voice: v, key, onsetSec: 0.4 + beat(i * 2, bpm), durSec: beat(1.8, bpm), velocity: 80 })));
  chords.forEach((ch, i) =>
    ch.forEach((key, v) => notes.push({ voice: v, key, onsetSec: 0.4 + beat(8 + i * 2 + v * 0.5, bpm), durSec: beat(2 - v * 0.5 - 0.1, bpm), velocity: 72 })),
  );
  return {
    file: "chord-exercise",
    title: "Chord exercise in C (alto a little flat)",
    description: "I–IV–V7–I held, then arpeggiated; the second voice sits about 14 cents flat.",
    voices: [
      { program: 0, name: "piano bass" },
      { program: 71, name: "clarinet", bendCents: -14 },
      { program: 68, name: "oboe" },
      { program: 73, name: "flute" },
    ],
    notes,
  };
}

function twoHandStudy(): Piece {
  // A short invented study: right hand in eighths over a left-hand crotchet bass, 96 bpm.
  const bpm = 96;
  const rh = [76, 74, 72, 74, 76, 76, 76, 79, 77, 76, 74, 72, 74, 76, 72, 67, 69, 71, 72, 74, 76, 74, 72, 72];
  const lh = [48, 55, 52, 55, 53, 57, 55, 59, 48, 52, 55, 48];
  const notes: DemoNote[] = [];
  rh.forEach((key, i) => notes.push({ voice: 0, key, onsetSec: 0.3 + beat(i * 0.5, bpm), durSec: beat(0.45, bpm), velocity: 84 }));
  lh.forEach((key, i) => notes.push({ voice: 1, key, onsetSec: 0.3 + beat(i, bpm), durSec: beat(0.9, bpm), velocity: 66 }));
  return {
    file: "two-hand-study",
    title: "Two-hand study in C",
    description: "Right-hand eighths over a left-hand bass, piano.",
    voices: [
      { program: 0, name: "piano right hand" },
      { program: 0, name: "piano left hand" },
    ],
    notes,
  };
}

function chorale(): Piece {
  // Four-part invented chorale phrase, 60 bpm: violin, violin, viola, cello.
  const bpm = 60;
  const satb = [
    [72, 67, 64, 48],
    [71, 67, 62, 55],
    [72, 69, 64, 57],
    [74, 67, 65, 53],
    [72, 67, 64, 55],
    [71, 65, 62, 43],
    [72, 64, 60, 48],
  ];
  const notes: DemoNote[] = [];
  satb.forEach((ch, i) => ch.forEach((key, v) => notes.push({ voice: v, key, onsetSec: 0.4 + beat(i * 1.5, bpm), durSec: beat(i === satb.length - 1 ? 2.5 : 1.4, bpm), velocity: 76 })));
  return {
    file: "string-chorale",
    title: "Chorale for string quartet",
    description: "A four-part chorale phrase: two violins, viola and cello.",
    voices: [
      { program: 40, name: "violin I" },
      { program: 40, name: "violin II" },
      { program: 41, name: "viola" },
      { program: 42, name: "cello" },
    ],
    notes,
  };
}

function writeMidi(piece: Piece): Uint8Array {
  const midi = new Midi();
  midi.header.setTempo(120);
  piece.voices.forEach((voice, v) => {
    const track = midi.addTrack();
    const channel = v >= 9 ? v + 1 : v; // never the GM drum channel
    track.channel = channel;
    track.instrument.number = voice.program;
    // RPN 0: pitch-bend range ±2 semitones (General MIDI default, set explicitly)
    track.addCC({ number: 101, value: 0, time: 0 });
    track.addCC({ number: 100, value: 0, time: 0 });
    track.addCC({ number: 6, value: 2, time: 0 });
    track.addCC({ number: 38, value: 0, time: 0 });
    const bend = (voice.bendCents ?? 0) / 200;
    track.addPitchBend({ time: 0.01, value: Math.max(-8192, Math.min(8191, Math.round(bend * 8192))) });
    for (const n of piece.notes.filter((x) => x.voice === v)) {
      track.addNote({ midi: n.key, time: n.onsetSec, duration: n.durSec, velocity: (n.velocity ?? 80) / 127 });
    }
  });
  return midi.toArray();
}

const work = mkdtempSync(path.join(tmpdir(), "tapernote-demo-"));
try {
  for (const piece of [chordExercise(), twoHandStudy(), chorale()]) {
    const mid = path.join(work, `${piece.file}.mid`);
    const wav = path.join(work, `${piece.file}.wav`);
    writeFileSync(mid, writeMidi(piece));
    execFileSync("fluidsynth", ["-ni", "-q", "-g", "0.6", "-r", "44100", "-F", wav, SOUNDFONT, mid], { stdio: "inherit" });
    const flac = path.join(OUT, `${piece.file}.flac`);
    execFileSync("sox", [wav, "-r", "22050", "-c", "1", "-b", "16", flac, "trim", "0", String(Math.max(...piece.notes.map((n) => n.onsetSec + n.durSec)) + 1.5)]);
    const truth = {
      title: piece.title,
      description: piece.description,
      note: "Ground truth as written to MIDI: pitch is the MIDI key, cents the voice's pitch bend (A4 = 440 Hz).",
      voices: piece.voices.map((v) => v.name),
      notes: piece.notes.map((n) => ({
        onsetSec: Number(n.onsetSec.toFixed(4)),
        offsetSec: Number((n.onsetSec + n.durSec).toFixed(4)),
        pitch: n.key,
        cents: piece.voices[n.voice]!.bendCents ?? 0,
        velocity: n.velocity ?? 80,
        voice: n.voice + 1,
      })),
    };
    writeFileSync(path.join(OUT, `${piece.file}.json`), `${JSON.stringify(truth, null, 1)}\n`);
    console.log(`demo/${piece.file}.flac  ${piece.notes.length} notes`);
  }
} finally {
  rmSync(work, { recursive: true, force: true });
}
