import lsr from "@alexanderolsen/libsamplerate-js";

const { create, ConverterType } = lsr;
import { EngineError } from "./errors";

/**
 * Sample-rate conversion with libsamplerate (Secret Rabbit Code, band-limited sinc
 * interpolation; E. de Castro Lopo), WebAssembly build `@alexanderolsen/libsamplerate-js`.
 * Mono in, mono out; output length ≈ round(n · toHz / fromHz).
 *
 * quality "fast" = SRC_SINC_FASTEST (≈ 97 dB SNR, 80 % bandwidth), "medium" = SRC_SINC_MEDIUM_QUALITY.
 */
export async function resample(
  samples: Float32Array,
  fromHz: number,
  toHz: number,
  quality: "fast" | "medium" = "fast",
): Promise<Float32Array> {
  if (!(fromHz > 0 && toHz > 0)) throw new EngineError("bad_argument", "sample rates must be positive");
  if (fromHz === toHz) return samples;
  if (toHz / fromHz > 256 || fromHz / toHz > 256) throw new EngineError("bad_argument", "resampling ratio beyond 1:256");
  const src = await create(1, fromHz, toHz, {
    converterType: quality === "fast" ? ConverterType.SRC_SINC_FASTEST : ConverterType.SRC_SINC_MEDIUM_QUALITY,
  });
  try {
    const out = src.simple(samples);
    // the wasm glue may hand back a view on its own heap: copy out before destroy
    return out.buffer === samples.buffer ? out : Float32Array.from(out);
  } finally {
    src.destroy();
  }
}
