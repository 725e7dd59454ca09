/**
 * Tapernote command line: transcribe a WAV or FLAC take into notes.
 *   npm run transcribe -- IN.wav --json OUT.json [--midi OUT.mid] [options]
 */
import { readFileSync, writeFileSync } from "node:fs";
import { decodeAudio, transcribe, notesToMidi, EngineError, TAPER_NAMES, ANALYSIS_RATE_HZ, type SettingsInput } from "../lib/engine/index";

const HELP = `usage: npm run transcribe -- IN.(wav|flac) --json OUT.json [options]

Transcribes a take into note events. Progress goes to stderr.

options
  --json FILE            write {durationSec, sampleRateHz, referenceHz, settings, notes} (required
                         unless --midi is given); notes: onsetSec, offsetSec, pitch (MIDI at
                         A4 = 440 Hz), cents (deviation from it), velocity, voice, pitchCurve
  --midi FILE            also write a Standard MIDI File (one track per voice)
  --bend                 put each note's cents into the MIDI file as a pitch bend (±2 semitones)
  --taper NAME           analysis taper: ${TAPER_NAMES.join(", ")} (default hann)
  --kaiser-beta B        Kaiser β (default 9.42)
  --gaussian-alpha A     Gaussian α (default 2.5)
  --a4 HZ|estimate       the take's reference pitch A4 (default estimate); only reported, pitch
                         and cents are always against A4 = 440 Hz
  --frame-low MS         frame length of the low register, below 250 Hz (default 256)
  --frame-mid MS         frame length of the middle register, 250-800 Hz (default 128)
  --frame-high MS        frame length of the high register, above 800 Hz (default 64)
  --hop MS               hop between frames (default 10)
  --voices N             voice limit: most notes at once (default 8)
  --shortest MS          shortest note kept (default 70)
  --sensitivity DB       how far below the loudest voice a voice is still reported (default 30)
  --low MIDI             lowest pitch searched (default 28)
  --high MIDI            highest pitch searched (default 100)
  --no-curves            leave out the per-note pitch curves
  --max-sec S            longest take accepted (default 3600)
  --stats                print time and peak memory to stderr at the end
  --quiet                no progress
  -h, --help             this text
exit status: 0 on success, 1 on bad input (one line on stderr), 2 on bad usage`;

class UsageError extends Error {}

function num(v: string | undefined, name: string): number {
  const x = Number(v);
  if (v === undefined || !Number.isFinite(x)) throw new UsageError(`${name} needs a number`);
  return x;
}

async function main(argv: string[]): Promise<number> {
  const t0 = performance.now();
  let input: string | undefined;
  let jsonOut: string | undefined;
  let midiOut: string | undefined;
  let bend = false;
  let stats = false;
  let quiet = false;
  let maxSec = 3600;
  const s: SettingsInput & { frameLengthsMs: Record<string, number>; pitchRange: Record<string, number> } = { frameLengthsMs: {}, pitchRange: {} };
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    const next = () => {
      if (i + 1 >= argv.length) throw new UsageError(`${a} needs a value`);
      return argv[++i];
    };
    switch (a) {
      case "-h":
      case "--help":
        process.stdout.write(HELP + "\n");
        return 0;
      case "--json": jsonOut = next(); break;
      case "--midi": midiOut = next(); break;
      case "--bend": bend = true; break;
      case "--taper": s.taper = next() as SettingsInput["taper"]; break;
      case "--kaiser-beta": s.kaiserBeta = num(next(), a); break;
      case "--gaussian-alpha": s.gaussianAlpha = num(next(), a); break;
      case "--a4": { const v = next(); s.referenceHz = v === "estimate" ? "estimate" : num(v, a); break; }
      case "--frame-low": s.frameLengthsMs.low = num(next(), a); break;
      case "--frame-mid": s.frameLengthsMs.mid = num(next(), a); break;
      case "--frame-high": s.frameLengthsMs.high = num(next(), a); break;
      case "--hop": s.hopMs = num(next(), a); break;
      case "--voices": s.voiceLimit = num(next(), a); break;
      case "--shortest": s.shortestNoteMs = num(next(), a); break;
      case "--sensitivity": s.sensitivityDb = num(next(), a); break;
      case "--low": s.pitchRange.lowMidi = num(next(), a); break;
      case "--high": s.pitchRange.highMidi = num(next(), a); break;
      case "--no-curves": s.pitchCurves = false; break;
      case "--max-sec": maxSec = num(next(), a); break;
      case "--stats": stats = true; break;
      case "--quiet": quiet = true; break;
      default:
        if (a.startsWith("-")) throw new UsageError(`unknown option ${a} (see --help)`);
        if (input) throw new UsageError("only one input file");
        input = a;
    }
  }
  if (!input) throw new UsageError("no input file (see --help)");
  if (!jsonOut && !midiOut) throw new UsageError("give --json OUT.json and/or --midi OUT.mid");
  let bytes: Uint8Array;
  try {
    bytes = readFileSync(input);
  } catch (e) {
    throw new EngineError("bad_argument", `cannot read ${input}: ${(e as NodeJS.ErrnoException).code ?? "error"}`);
  }
  // decode straight to the analysis rate: the full-rate mix is never held in memory
  const audio = await decodeAudio(bytes, { maxDurationSec: maxSec, resampleToHz: ANALYSIS_RATE_HZ });
  bytes = new Uint8Array(0);
  let lastPct = -1;
  const result = await transcribe(audio.samples, audio.sampleRateHz, s, (f) => {
    const pct = Math.floor(f * 100);
    if (!quiet && pct >= lastPct + 5) {
      lastPct = pct;
      process.stderr.write(`\ranalysing ${pct}%`);
    }
  });
  if (!quiet) process.stderr.write(`\ranalysing 100%: ${result.notes.length} notes, A4 ≈ ${result.referenceHz} Hz\n`);
  // report the file's own rate, not the analysis rate it was decoded to
  result.sampleRateHz = audio.sourceRateHz;
  if (jsonOut) writeFileSync(jsonOut, JSON.stringify(result) + "\n");
  if (midiOut) writeFileSync(midiOut, notesToMidi(result.notes, { pitchBend: bend }));
  if (stats) {
    const ms = performance.now() - t0;
    const rssMb = process.resourceUsage().maxRSS / 1024;
    process.stderr.write(`stats: audio ${audio.durationSec.toFixed(1)} s, main ${(ms / 1000).toFixed(2)} s, peak RSS ${rssMb.toFixed(0)} MB\n`);
  }
  return 0;
}

main(process.argv.slice(2)).then(
  (code) => process.exit(code),
  (e) => {
    if (e instanceof UsageError) {
      process.stderr.write(`transcribe: ${e.message}\n`);
      process.exit(2);
    }
    if (e instanceof EngineError) {
      process.stderr.write(`transcribe: ${e.message} [${e.code}]\n`);
      process.exit(1);
    }
    process.stderr.write(`transcribe: internal error: ${e instanceof Error ? e.message : String(e)}\n`);
    process.exit(1);
  },
);
