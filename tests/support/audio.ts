import wf from "wavefile";

const { WaveFile } = wf;

/**
 * A WAV of summed tones (equal level, 20 ms fades), for upload and job tests. Each tone has
 * `partials` harmonics at amplitude 1/k (default 6), like a bowed or blown note: pure sines
 * a major third apart are also the 4th and 5th harmonics of a note two octaves lower.
 * With `startSec`, the file is silent until then.
 */
export function toneWav(opts: {
  freqsHz: number[];
  durationSec: number;
  sampleRateHz?: number;
  channels?: number;
  bitDepth?: "16" | "32f";
  partials?: number;
  startSec?: number;
}): Uint8Array {
  const rate = opts.sampleRateHz ?? 22050;
  const channels = opts.channels ?? 1;
  const n = Math.round(opts.durationSec * rate);
  const fade = Math.round(0.02 * rate);
  const start = Math.round((opts.startSec ?? 0) * rate);
  const partials = opts.partials ?? 6;
  let norm = 0;
  for (let k = 1; k <= partials; k++) norm += 1 / k;
  const amp = 0.6 / Math.max(1, opts.freqsHz.length) / norm;
  const mono = new Float64Array(n);
  for (let i = start; i < n; i++) {
    let v = 0;
    for (const f of opts.freqsHz) {
      for (let k = 1; k <= partials && k * f < rate / 2; k++) v += Math.sin((2 * Math.PI * k * f * i) / rate) / k;
    }
    const env = Math.min(1, (i - start) / fade, (n - 1 - i) / fade);
    mono[i] = amp * v * env;
  }
  const wav = new WaveFile();
  if (opts.bitDepth === "32f") {
    wav.fromScratch(channels, rate, "32f", channels === 1 ? mono : Array.from({ length: channels }, () => mono));
  } else {
    const ints = Int16Array.from(mono, (v) => Math.round(v * 32767));
    wav.fromScratch(channels, rate, "16", channels === 1 ? ints : Array.from({ length: channels }, () => ints));
  }
  return wav.toBuffer();
}

export function uploadForm(fields: Record<string, Uint8Array | string>, fileName = "take.wav"): FormData {
  const form = new FormData();
  for (const [k, v] of Object.entries(fields)) {
    if (typeof v === "string") form.set(k, v);
    else form.set(k, new File([v as BlobPart], k === "file" ? fileName : `${k}.wav`));
  }
  return form;
}
