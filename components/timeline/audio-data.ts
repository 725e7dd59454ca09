"use client";
/**
 * The take's recording as data for the waveform and the spectrogram: fetched once, decoded with
 * wavesurfer.js's decoder at 22 050 Hz (enough for the spectrogram's E1…C8, and a quarter of the
 * memory of 44.1 kHz stereo), mixed to mono, with min/max peaks for the waveform at several
 * block sizes. Cached per URL for the page's lifetime, so a remount (or the replay page after
 * the take page) does not fetch again. Playback does not wait for any of this: the <audio>
 * element streams the recording itself.
 */
import { useEffect, useState } from "react";
import { ColumnMaker, defaultSpec, frameCount, type SpectrogramSpec } from "./spectrogram-columns";

export const DECODE_RATE_HZ = 22050;
const FIRST_BLOCK = 16;

export type PeakLevel = { block: number; min: Float32Array; max: Float32Array };
export type DecodedTake = { sampleRateHz: number; durationSec: number; mono: Float32Array; peaks: PeakLevel[] };

const decoded = new Map<string, Promise<DecodedTake>>();

export class AudioLoadError extends Error {
  constructor(
    message: string,
    readonly kind: "fetch" | "decode",
  ) {
    super(message);
  }
}

async function fetchAndDecode(url: string): Promise<DecodedTake> {
  let bytes: ArrayBuffer;
  try {
    const res = await fetch(url, { credentials: "same-origin" });
    if (!res.ok) throw new Error(`HTTP ${res.status}`);
    bytes = await res.arrayBuffer();
  } catch {
    throw new AudioLoadError("The recording could not be loaded.", "fetch");
  }
  let buffer: AudioBuffer;
  try {
    const { default: Decoder } = await import("wavesurfer.js/dist/decoder.js");
    buffer = await Decoder.decode(bytes, DECODE_RATE_HZ);
  } catch {
    throw new AudioLoadError("The recording could not be decoded in this browser.", "decode");
  }
  const mono = mixToMono(buffer);
  return { sampleRateHz: buffer.sampleRate, durationSec: buffer.duration, mono, peaks: makePeaks(mono) };
}

export function mixToMono(buffer: Pick<AudioBuffer, "numberOfChannels" | "length" | "getChannelData">): Float32Array {
  if (buffer.numberOfChannels === 1) return buffer.getChannelData(0);
  const out = new Float32Array(buffer.length);
  for (let c = 0; c < buffer.numberOfChannels; c++) {
    const d = buffer.getChannelData(c);
    for (let i = 0; i < out.length; i++) out[i]! += d[i]! / buffer.numberOfChannels;
  }
  return out;
}

/** Min/max of each block of 16, 32, 64 … samples, until one block holds the whole take. */
export function makePeaks(x: Float32Array): PeakLevel[] {
  const levels: PeakLevel[] = [];
  let n = Math.ceil(x.length / FIRST_BLOCK);
  let min = new Float32Array(n);
  let max = new Float32Array(n);
  for (let b = 0; b < n; b++) {
    let lo = Infinity;
    let hi = -Infinity;
    const end = Math.min(x.length, (b + 1) * FIRST_BLOCK);
    for (let i = b * FIRST_BLOCK; i < end; i++) {
      const v = x[i]!;
      if (v < lo) lo = v;
      if (v > hi) hi = v;
    }
    min[b] = lo;
    max[b] = hi;
  }
  let block = FIRST_BLOCK;
  levels.push({ block, min, max });
  while (n > 1) {
    const m = Math.ceil(n / 2);
    const nmin = new Float32Array(m);
    const nmax = new Float32Array(m);
    for (let b = 0; b < m; b++) {
      const j = 2 * b;
      nmin[b] = j + 1 < n ? Math.min(min[j]!, min[j + 1]!) : min[j]!;
      nmax[b] = j + 1 < n ? Math.max(max[j]!, max[j + 1]!) : max[j]!;
    }
    n = m;
    min = nmin;
    max = nmax;
    block *= 2;
    levels.push({ block, min, max });
  }
  return levels;
}

/** Min and max of samples [s0, s1) from the coarsest level that still resolves the range. */
export function rangeMinMax(take: Pick<DecodedTake, "mono" | "peaks">, s0: number, s1: number): [number, number] {
  const x = take.mono;
  const a = Math.max(0, Math.floor(s0));
  const b = Math.min(x.length, Math.ceil(s1));
  if (b <= a) return [0, 0];
  let lo = Infinity;
  let hi = -Infinity;
  const span = b - a;
  let level: PeakLevel | null = null;
  for (const l of take.peaks) if (l.block * 2 <= span) level = l;
  if (!level) {
    for (let i = a; i < b; i++) {
      const v = x[i]!;
      if (v < lo) lo = v;
      if (v > hi) hi = v;
    }
    return [lo, hi];
  }
  // whole blocks from the level, the ragged ends from the samples
  const k0 = Math.ceil(a / level.block);
  const k1 = Math.floor(b / level.block);
  for (let i = a; i < Math.min(b, k0 * level.block); i++) {
    const v = x[i]!;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  for (let k = k0; k < k1; k++) {
    if (level.min[k]! < lo) lo = level.min[k]!;
    if (level.max[k]! > hi) hi = level.max[k]!;
  }
  for (let i = Math.max(a, k1 * level.block); i < b; i++) {
    const v = x[i]!;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  return [lo, hi];
}

export function loadTakeAudio(url: string): Promise<DecodedTake> {
  let p = decoded.get(url);
  if (!p) {
    p = fetchAndDecode(url);
    decoded.set(url, p);
    p.catch(() => decoded.delete(url)); // a retry fetches again
  }
  return p;
}

export type TakeAudioState = { status: "loading" } | { status: "ready"; take: DecodedTake } | { status: "error"; message: string };

export function useTakeAudio(url: string): TakeAudioState & { retry: () => void } {
  const [attempt, setAttempt] = useState(0);
  const [state, setState] = useState<TakeAudioState>({ status: "loading" });
  useEffect(() => {
    let live = true;
    setState({ status: "loading" });
    loadTakeAudio(url).then(
      (take) => live && setState({ status: "ready", take }),
      (e: unknown) => live && setState({ status: "error", message: e instanceof Error ? e.message : "The recording could not be loaded." }),
    );
    return () => {
      live = false;
    };
  }, [url, attempt]);
  return { ...state, retry: () => setAttempt((a) => a + 1) };
}

// --- the spectrogram's columns ------------------------------------------------------------

/** Columns made so far (in a Web Worker), growing until `done`; listeners hear of each chunk. */
export class SpectrogramData {
  readonly spec: SpectrogramSpec;
  readonly total: number;
  bands = 0;
  data: Uint8Array = new Uint8Array(0);
  /** Columns [0, ready) are made (chunks arrive in order). */
  ready = 0;
  /** Where the columns are made: a Web Worker, or the page in small chunks when no worker starts. */
  via: "worker" | "page" = "worker";
  private listeners = new Set<() => void>();

  constructor(take: DecodedTake) {
    this.spec = defaultSpec(take.sampleRateHz);
    this.total = frameCount(take.mono.length, this.spec.hopSamples);
  }

  get done(): boolean {
    return this.ready >= this.total;
  }

  subscribe(l: () => void): () => void {
    this.listeners.add(l);
    return () => this.listeners.delete(l);
  }

  accept(from: number, to: number, bands: number, chunk: Uint8Array): void {
    if (this.bands === 0) {
      this.bands = bands;
      this.data = new Uint8Array(this.total * bands);
    }
    this.data.set(chunk, from * bands);
    this.ready = Math.max(this.ready, to);
    for (const l of this.listeners) l();
  }
}

const spectrograms = new Map<string, SpectrogramData>();
let nextId = 1;

export function spectrogramFor(url: string, take: DecodedTake): SpectrogramData {
  const cached = spectrograms.get(url);
  if (cached) return cached;
  const s = new SpectrogramData(take);
  spectrograms.set(url, s);
  const id = nextId++;
  let worker: Worker | null = null;
  try {
    worker = new Worker(new URL("./spectrogram.worker.ts", import.meta.url), { type: "module" });
  } catch {
    worker = null;
  }
  if (worker) {
    const w = worker;
    w.onmessage = (e: MessageEvent<{ id: number; from: number; to: number; bands: number; data: Uint8Array }>) => {
      if (e.data.id !== id) return;
      s.accept(e.data.from, e.data.to, e.data.bands, e.data.data);
      if (s.done) w.terminate();
    };
    w.onerror = () => {
      w.terminate();
      inChunks(s, take);
    };
    w.postMessage({ id, samples: take.mono.slice(), spec: s.spec });
  } else {
    inChunks(s, take);
  }
  return s;
}

/** Without a worker: 64 columns at a time between frames, so the page stays responsive. */
function inChunks(s: SpectrogramData, take: DecodedTake): void {
  s.via = "page";
  const maker = new ColumnMaker(s.spec);
  const step = () => {
    const from = s.ready;
    const to = Math.min(s.total, from + 64);
    const chunk = new Uint8Array((to - from) * maker.bandCount);
    maker.columns(take.mono, from, to, chunk);
    s.accept(from, to, maker.bandCount, chunk);
    if (!s.done) setTimeout(step, 0);
  };
  setTimeout(step, 0);
}
