/**
 * Render Tapernote's engine test fixtures (committed under tests/fixtures/engine, so tests
 * need no synthesiser):
 *   1. write each piece as MIDI with @tonejs/midi (one voice per channel, RPN 0 = ±2 semitones,
 *      mistuning and the take's reference pitch as a pitch bend before each note);
 *   2. render it with Debian's `fluidsynth` and the FluidR3 GM SoundFont (`fluid-soundfont-gm`,
 *      MIT licence), dry (reverb and chorus off), at 22.05 kHz;
 *   3. mix to mono 16-bit with `sox`; write the ground truth next to it;
 *   4. compute MIREX note-metric references with Debian's python3-mir-eval for the metric test.
 * Usage: npm run fixtures   (needs: apt-get install fluidsynth fluid-soundfont-gm sox python3-mir-eval)
 */
import { execFileSync } from "node:child_process";
import { mkdtempSync, writeFileSync, rmSync, existsSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import m from "@tonejs/midi";

const { Midi } = m;
const OUT = join(import.meta.dirname, "..", "tests", "fixtures", "engine");
const SOUNDFONT = "/usr/share/sounds/sf2/FluidR3_GM.sf2";
const RATE_HZ = 22050;
const PROGRAM: Record<string, number> = { piano: 0, vibraphone: 11, clarinet: 71, trumpet: 56, bassoon: 70, horn: 60 };

interface PieceNote {
  voice: number;
  instrument: keyof typeof PROGRAM;
  key: number; // MIDI key sent
  onsetSec: number;
  durSec: number;
  bendCents?: number; // mistuning of this note
}
interface Piece {
  name: string;
  description: string;
  a4Hz: number;
  notes: PieceNote[];
}

const centsOfA4 = (a4Hz: number) => 1200 * Math.log2(a4Hz / 440);

function pieces(): Piece[] {
  const P: Piece[] = [];
  // single notes of instruments whose FluidR3 samples are in tune within ~3 cents
  const singles: Array<[PieceNote["instrument"], number]> = [["clarinet", 55], ["clarinet", 70], ["trumpet", 69], ["piano", 66], ["vibraphone", 71], ["bassoon", 46]];
  P.push({
    name: "single",
    description: "single sustained notes: clarinet G3 B♭4, trumpet A4, piano F♯4, vibraphone B4, bassoon B♭2",
    a4Hz: 440,
    notes: singles.map(([instrument, key], i) => ({ voice: 0, instrument, key, onsetSec: 0.3 + i * 1.0, durSec: 0.75 })),
  });
  // mistuned voices within two-voice chords (bends)
  const mis: Array<[number, number, number, number]> = [[62, 15, 69, -30], [60, -8, 67, 8], [57, 30, 64, -15]];
  P.push({
    name: "mistuned",
    description: "clarinet + trumpet dyads, each voice bent by ±8/15/30 cents",
    a4Hz: 440,
    notes: mis.flatMap(([lo, cl, hi, ch], i) => [
      { voice: 0, instrument: "clarinet" as const, key: lo, onsetSec: 0.3 + i * 1.4, durSec: 1.1, bendCents: cl },
      { voice: 1, instrument: "trumpet" as const, key: hi, onsetSec: 0.3 + i * 1.4, durSec: 1.1, bendCents: ch },
    ]),
  });
  // the same dyads without bends: the sound set's own tuning of each note, which the bends add to
  P.push({
    name: "dyads",
    description: "the mistuned piece's clarinet + trumpet dyads, without bends",
    a4Hz: 440,
    notes: mis.flatMap(([lo, , hi], i) => [
      { voice: 0, instrument: "clarinet" as const, key: lo, onsetSec: 0.3 + i * 1.4, durSec: 1.1 },
      { voice: 1, instrument: "trumpet" as const, key: hi, onsetSec: 0.3 + i * 1.4, durSec: 1.1 },
    ]),
  });
  // whole takes tuned to A4 = 442 and 415 Hz, and the same take at 440 Hz: the sound set's
  // own tuning (its samples sit a few cents off 12-TET) is the same in all three, so the
  // estimate's error is its estimate at 442 or 415 against its estimate at 440
  const chords = [[50, 57, 66], [55, 62, 71], [52, 59, 67], [57, 64, 73]];
  for (const a4Hz of [440, 442, 415]) {
    P.push({
      name: `a${a4Hz}`,
      description: `bassoon, clarinet, trumpet chords tuned to A4 = ${a4Hz} Hz`,
      a4Hz,
      notes: chords.flatMap((ch, i) =>
        ch.map((key, v) => ({ voice: v, instrument: (["bassoon", "clarinet", "trumpet"] as const)[v], key, onsetSec: 0.3 + i * 1.2, durSec: 1.0 })),
      ),
    });
  }
  // re-articulated repeated notes
  P.push({
    name: "repeated",
    description: "piano G4 struck 6 times (0.25 s apart, 30 ms gaps), then clarinet D5 4 times",
    a4Hz: 440,
    notes: [
      ...Array.from({ length: 6 }, (_, i) => ({ voice: 0, instrument: "piano" as const, key: 67, onsetSec: 0.3 + i * 0.25, durSec: 0.22 })),
      ...Array.from({ length: 4 }, (_, i) => ({ voice: 1, instrument: "clarinet" as const, key: 74, onsetSec: 2.2 + i * 0.4, durSec: 0.33 })),
    ],
  });
  // piano triads
  const triads = [[60, 64, 67], [57, 60, 64], [53, 57, 60], [55, 59, 62]];
  P.push({
    name: "triads",
    description: "piano triads C, Am, F, G (root position)",
    a4Hz: 440,
    notes: triads.flatMap((ch, i) => ch.map((key, v) => ({ voice: v, instrument: "piano" as const, key, onsetSec: 0.3 + i * 1.0, durSec: 0.85 }))),
  });
  return P;
}

function writeMidi(p: Piece, path: string): void {
  const midi = new Midi();
  midi.header.setTempo(120);
  const voices = [...new Set(p.notes.map((n) => n.voice))];
  voices.forEach((v, ch) => {
    const track = midi.addTrack();
    const notes = p.notes.filter((n) => n.voice === v);
    track.channel = ch;
    track.instrument.number = PROGRAM[notes[0].instrument];
    // RPN 0 (pitch-bend sensitivity) = 2 semitones, 0 cents; then RPN null
    for (const [cc, val] of [[101, 0], [100, 0], [6, 2], [38, 0], [101, 127], [100, 127]]) track.addCC({ number: cc, value: val / 127, time: 0 });
    for (const n of notes) {
      const cents = centsOfA4(p.a4Hz) + (n.bendCents ?? 0);
      // @tonejs/midi writes the bend value raw: round(v·8192), v = cents / 200
      const raw = Math.max(-8192, Math.min(8191, Math.round((cents / 200) * 8192)));
      track.addPitchBend({ time: Math.max(0, n.onsetSec - 0.01), value: raw });
      track.addNote({ midi: n.key, time: n.onsetSec, duration: n.durSec, velocity: 90 / 127 });
    }
  });
  writeFileSync(path, midi.toArray());
}

function groundTruth(p: Piece) {
  return p.notes
    .map((n) => {
      const raw = Math.max(-8192, Math.min(8191, Math.round(((centsOfA4(p.a4Hz) + (n.bendCents ?? 0)) / 200) * 8192)));
      const sounding = n.key + (raw * 200) / 8192 / 100;
      const pitch = Math.floor(sounding + 0.5);
      return { onsetSec: n.onsetSec, offsetSec: n.onsetSec + n.durSec, pitch, cents: +((sounding - pitch) * 100).toFixed(3), instrument: n.instrument, voice: n.voice };
    })
    .sort((a, b) => a.onsetSec - b.onsetSec || a.pitch - b.pitch);
}

function main(): void {
  if (!existsSync(SOUNDFONT)) throw new Error(`SoundFont missing: apt-get install fluid-soundfont-gm (${SOUNDFONT})`);
  const tmp = mkdtempSync(join(tmpdir(), "tapernote-fixtures-"));
  try {
    for (const p of pieces()) {
      const mid = join(tmp, `${p.name}.mid`);
      const raw = join(tmp, `${p.name}.raw.wav`);
      writeMidi(p, mid);
      execFileSync("fluidsynth", ["-ni", "-q", "-R", "0", "-C", "0", "-g", "0.5", "-r", String(RATE_HZ), "-T", "wav", "-F", raw, SOUNDFONT, mid]);
      const end = Math.max(...p.notes.map((n) => n.onsetSec + n.durSec)) + 0.5;
      execFileSync("sox", ["-V1", raw, "-c", "1", "-b", "16", join(OUT, `${p.name}.wav`), "trim", "0", end.toFixed(2), "gain", "-n", "-3"]);
      writeFileSync(join(OUT, `${p.name}.json`), JSON.stringify({ description: p.description, a4Hz: p.a4Hz, sampleRateHz: RATE_HZ, notes: groundTruth(p) }, null, 1) + "\n");
      console.log(`${p.name}: ${p.notes.length} notes`);
    }
    // decoder fixtures: a 1 s excerpt as WAV and FLAC (sox, libFLAC), and a 24-bit stereo FLAC
    const single = join(OUT, "single.wav");
    execFileSync("sox", ["-V1", single, join(OUT, "short.wav"), "trim", "0.3", "1.0"]);
    execFileSync("sox", ["-V1", join(OUT, "short.wav"), join(OUT, "short.flac")]);
    execFileSync("sox", ["-V1", join(OUT, "short.wav"), "-b", "24", "-c", "2", join(OUT, "short-stereo24.flac")]);
    // MIREX note-metric references from mir_eval for random note lists
    const py = `
import json, random, numpy as np, mir_eval, warnings
warnings.filterwarnings("ignore")
random.seed(7); cases = []
for c in range(40):
    n = random.randint(1, 25)
    ref = []
    for i in range(n):
        on = random.uniform(0, 10); ref.append([on, on + random.uniform(0.05, 2.0), random.uniform(40, 90)])
    est = []
    for r in ref:
        if random.random() < 0.8:
            on = max(0.0, r[0] + random.gauss(0, 0.04)); off = r[1] + random.gauss(0, 0.15)
            est.append([on, max(on + 0.01, off), r[2] + random.gauss(0, 0.3)])
    for i in range(random.randint(0, 6)):
        on = random.uniform(0, 10); est.append([on, on + random.uniform(0.05, 1.0), random.uniform(40, 90)])
    if not est: est.append([0.0, 0.1, 60.0])
    R, E = np.array(ref), np.array(est)
    hz = lambda m: 440.0 * 2 ** ((m - 69) / 12.0)
    on = mir_eval.transcription.precision_recall_f1_overlap(R[:, :2], hz(R[:, 2]), E[:, :2], hz(E[:, 2]), onset_tolerance=0.05, pitch_tolerance=50.0, offset_ratio=None)
    oo = mir_eval.transcription.precision_recall_f1_overlap(R[:, :2], hz(R[:, 2]), E[:, :2], hz(E[:, 2]), onset_tolerance=0.05, pitch_tolerance=50.0, offset_ratio=0.2, offset_min_tolerance=0.05)
    cases.append({"ref": ref, "est": est, "onset": list(on[:3]), "onoff": list(oo[:3])})
print(json.dumps({"source": "mir_eval %s (Debian python3-mir-eval)" % mir_eval.__version__, "cases": cases}))
`;
    const out = execFileSync("/usr/bin/python3", ["-c", py], { maxBuffer: 1 << 24 }).toString();
    writeFileSync(join(OUT, "mireval-notes.json"), out);
    console.log("mireval-notes.json: 40 cases");
  } finally {
    rmSync(tmp, { recursive: true, force: true });
  }
}

main();
