/**
 * Tapernote engine benchmark: a 10-minute 44.1 kHz stereo take (synthesised: seeded random
 * chords and melody of harmonic tones with decaying envelopes) through the command line, on
 * one core (taskset -c 0 when present; the bare STFT runs pinned to the same core). Prints
 *   - real-time factor: audio seconds / wall seconds of the whole command-line process;
 *   - ratio of that wall time to a bare STFT of the same audio in this process: fft.js real
 *     transforms of 4096-point Hann frames at a 10 ms hop, with magnitudes;
 *   - peak memory (maximum resident set size) of the command-line process.
 * Usage: npm run bench [-- --minutes 10]
 */
import { spawnSync } from "node:child_process";
import { mkdtempSync, writeFileSync, readFileSync, rmSync, existsSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import FFT from "fft.js";
import wf from "wavefile";
import { decodeAudio, makeTaper } from "../lib/engine/index";

const { WaveFile } = wf;
const RATE_HZ = 44100;
const argMin = process.argv.indexOf("--minutes");
const minutes = argMin > 0 ? Number(process.argv[argMin + 1]) : 10;
const durationSec = minutes * 60;

function synthesiseTake(): Int16Array[] {
  let seed = 2026;
  const rnd = () => {
    seed = (Math.imul(seed, 1664525) + 1013904223) >>> 0;
    return seed / 4294967296;
  };
  const n = Math.round(durationSec * RATE_HZ);
  const mix = new Float32Array(n);
  const addTone = (midi: number, onSec: number, durSec: number, amp: number) => {
    const f0 = 440 * Math.pow(2, (midi - 69) / 12);
    const a = Math.floor(onSec * RATE_HZ);
    const b = Math.min(n, Math.floor((onSec + durSec + 0.2) * RATE_HZ));
    const harm = Math.max(1, Math.min(12, Math.floor(8000 / f0)));
    for (let h = 1; h <= harm; h++) {
      const w = (2 * Math.PI * f0 * h) / RATE_HZ;
      const ah = amp / h;
      for (let i = a; i < b; i++) {
        const t = (i - a) / RATE_HZ;
        const env = Math.exp(-1.5 * t) * (t < durSec ? 1 : Math.exp(-30 * (t - durSec)));
        mix[i] += ah * env * Math.sin(w * (i - a));
      }
    }
  };
  for (let t = 0; t < durationSec - 2; t += 2) {
    const root = 48 + Math.floor(rnd() * 12);
    for (const iv of [0, 4, 7]) addTone(root + iv, t, 1.9, 0.08);
    for (let k = 0; k < 8; k++) addTone(72 + Math.floor(rnd() * 12), t + k * 0.25, 0.22, 0.06);
  }
  let peak = 0;
  for (let i = 0; i < n; i++) peak = Math.max(peak, Math.abs(mix[i]));
  const L = new Int16Array(n);
  const R = new Int16Array(n);
  for (let i = 0; i < n; i++) {
    const v = Math.round((mix[i] / peak) * 0.7 * 32767);
    L[i] = v;
    R[i] = v;
  }
  return [L, R];
}

/** The bare STFT the issue compares against: 4096-point Hann frames, 10 ms hop, magnitudes. */
function bareStft(x: Float32Array): { seconds: number; frames: number } {
  const N = 4096;
  const hop = Math.round(0.01 * RATE_HZ);
  const fft = new FFT(N);
  const w = makeTaper("hann", N);
  const frame = new Float64Array(N);
  const out = fft.createComplexArray() as number[];
  const mag = new Float32Array(N / 2 + 1);
  let sink = 0;
  const t0 = performance.now();
  let frames = 0;
  for (let s = 0; s + N <= x.length; s += hop) {
    for (let i = 0; i < N; i++) frame[i] = w[i] * x[s + i];
    fft.realTransform(out, frame);
    for (let k = 0; k <= N / 2; k++) mag[k] = Math.sqrt(out[2 * k] * out[2 * k] + out[2 * k + 1] * out[2 * k + 1]);
    sink += mag[100];
    frames++;
  }
  const seconds = (performance.now() - t0) / 1000;
  if (sink === 42) console.log(""); // keep the work observable
  return { seconds, frames };
}

async function main(): Promise<void> {
  const tmp = mkdtempSync(join(tmpdir(), "tapernote-bench-"));
  try {
    process.stderr.write(`synthesising a ${minutes}-minute 44.1 kHz stereo take …\n`);
    const wav = new WaveFile();
    wav.fromScratch(2, RATE_HZ, "16", synthesiseTake());
    const inPath = join(tmp, "take.wav");
    writeFileSync(inPath, wav.toBuffer());
    const outPath = join(tmp, "take.json");
    // `npm run transcribe`'s launcher; its bundle is (re)built here, untimed, as on a first use
    const cli = join(import.meta.dirname, "transcribe-cli.mjs");
    const warm = spawnSync(process.execPath, [cli, "--help"], { encoding: "utf8" });
    if (warm.status !== 0) throw new Error(`the command line does not start: ${warm.stderr}`);
    const pin = process.env.TAPERNOTE_BENCH_PINNED ? ["/usr/bin/taskset", "-c", "0"] : [];
    const timeCmd = existsSync("/usr/bin/time") ? ["/usr/bin/time", "-f", "maxrss_kb %M"] : [];
    const cmd = [...pin, ...timeCmd, process.execPath, cli, inPath, "--json", outPath, "--quiet", "--stats"];
    process.stderr.write("running the command line …\n");
    const t0 = performance.now();
    const r = spawnSync(cmd[0], cmd.slice(1), { encoding: "utf8" });
    const wallSec = (performance.now() - t0) / 1000;
    if (r.status !== 0) throw new Error(`transcribe failed: ${r.stderr}`);
    const rss = /maxrss_kb (\d+)/.exec(r.stderr);
    const peakMb = rss ? Number(rss[1]) / 1024 : NaN;
    const notes = JSON.parse(readFileSync(outPath, "utf8")).notes.length;
    const audio = await decodeAudio(new Uint8Array(readFileSync(inPath)));
    const stft = bareStft(audio.samples);
    console.log(`audio            ${durationSec.toFixed(0)} s, 44.1 kHz stereo 16-bit, ${notes} notes found`);
    console.log(`command line     ${wallSec.toFixed(2)} s wall (whole process${pin.length ? ", one core" : ""})`);
    console.log(`real-time factor ${(durationSec / wallSec).toFixed(1)}×   (target ≥ 100×)`);
    console.log(`bare STFT        ${stft.seconds.toFixed(2)} s (${stft.frames} frames of 4096, Hann, 10 ms hop, magnitudes) = ${(durationSec / stft.seconds).toFixed(0)}× real time`);
    console.log(`ratio            ${(wallSec / stft.seconds).toFixed(2)}   (target ≤ 3)`);
    console.log(`peak memory      ${peakMb.toFixed(0)} MB   (target < 300 MB)`);
  } finally {
    rmSync(tmp, { recursive: true, force: true });
  }
}

// measure both the command line and the bare STFT on the same single core
if (existsSync("/usr/bin/taskset") && !process.env.TAPERNOTE_BENCH_PINNED) {
  const r = spawnSync("/usr/bin/taskset", ["-c", "0", process.execPath, ...process.execArgv, ...process.argv.slice(1)], {
    stdio: "inherit",
    env: { ...process.env, TAPERNOTE_BENCH_PINNED: "1" },
  });
  process.exit(r.status ?? 1);
}

main().catch((e) => {
  console.error(e instanceof Error ? e.message : e);
  process.exit(1);
});
