import Meyda from "meyda";
import { makeTaper, type TaperName } from "./tapers";
import { EngineError } from "./errors";

/**
 * Chroma (12 pitch classes, C first) per frame with meyda's `chroma` extractor (Gaussian
 * filter bank over log-frequency; D. Ellis' chroma, as in meyda), for aligning a take with an
 * assignment later. The frame is tapered here with Tapernote's own taper and handed to meyda
 * with its window set to "rect", so meyda's default Hann is not applied twice. meyda keeps its
 * settings on one shared object: they are set for this call and restored afterwards.
 *
 * Returns a Float32Array of frames × 12, frame t centred on t · hopSec.
 */
export function chromaFrames(
  samples: Float32Array,
  sampleRateHz: number,
  opts: { frameLength?: number; hopSec?: number; taper?: TaperName } = {},
): { frames: number; hopSec: number; chroma: Float32Array } {
  const N = opts.frameLength ?? 4096;
  const hopSec = opts.hopSec ?? 0.05;
  if ((N & (N - 1)) !== 0 || N < 64) throw new EngineError("bad_argument", "chroma frame length must be a power of two ≥ 64");
  if (!(sampleRateHz > 0) || !(hopSec > 0)) throw new EngineError("bad_argument", "sample rate and hop must be positive");
  const w = makeTaper(opts.taper ?? "hann", N);
  const frames = Math.floor(samples.length / sampleRateHz / hopSec) + 1;
  const out = new Float32Array(frames * 12);
  const m = Meyda as unknown as Record<string, unknown>;
  const saved = { bufferSize: m.bufferSize, sampleRate: m.sampleRate, windowingFunction: m.windowingFunction, chromaFilterBank: m.chromaFilterBank };
  try {
    m.bufferSize = N;
    m.sampleRate = sampleRateHz;
    m.windowingFunction = "rect";
    m.chromaFilterBank = undefined; // meyda rebuilds it only when the band count changes
    const frame = new Float32Array(N);
    for (let t = 0; t < frames; t++) {
      const start = Math.round(t * hopSec * sampleRateHz) - N / 2;
      for (let n = 0; n < N; n++) {
        const j = start + n;
        frame[n] = j >= 0 && j < samples.length ? w[n] * samples[j] : 0;
      }
      const c = Meyda.extract("chroma", frame) as unknown as number[] | null;
      if (c) for (let k = 0; k < 12; k++) out[t * 12 + k] = Number.isFinite(c[k]) ? c[k] : 0;
    }
  } finally {
    Object.assign(m, saved);
  }
  return { frames, hopSec, chroma: out };
}
