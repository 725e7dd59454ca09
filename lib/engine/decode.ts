import wf from "wavefile";
import { FLACDecoder } from "@wasm-audio-decoders/flac";
import { EngineError } from "./errors";
import { StreamResampler, resample } from "./resample";

const { WaveFile } = wf;

export interface DecodeOptions {
  /** Longest take accepted (s); longer input raises EngineError("too_long"). Default 3600. */
  maxDurationSec?: number;
  /**
   * Resample to this rate while decoding (block by block, so the full-rate mix never exists;
   * the command line uses it to keep memory low). `sampleRateHz` of the result is then this rate.
   */
  resampleToHz?: number;
}

export interface DecodedAudio {
  /** Mono mix (mean of the channels), full scale ±1. */
  samples: Float32Array;
  sampleRateHz: number;
  /** Sample rate of the file. */
  sourceRateHz: number;
  /** Channels in the file (before the mix). */
  channels: number;
  durationSec: number;
  format: "wav" | "flac";
}

const DEFAULT_MAX_SEC = 3600;

/**
 * Decode a WAV (PCM 8/16/24/32-bit integer, IEEE float 32/64-bit, plain or
 * WAVE_FORMAT_EXTENSIBLE, RIFF/RF64; container parsed by `wavefile`) or FLAC
 * (`@wasm-audio-decoders/flac`, libFLAC) file and mix it to mono.
 * Every bad input raises EngineError with a code; nothing else escapes.
 */
export async function decodeAudio(bytes: Uint8Array, opts: DecodeOptions = {}): Promise<DecodedAudio> {
  if (!(bytes instanceof Uint8Array)) throw new EngineError("bad_argument", "audio bytes must be a Uint8Array");
  const maxSec = opts.maxDurationSec ?? DEFAULT_MAX_SEC;
  if (bytes.length < 4) throw new EngineError(bytes.length === 0 ? "empty" : "not_audio", bytes.length === 0 ? "the file is empty" : "not an audio file (too short to be WAV or FLAC)");
  const tag = String.fromCharCode(bytes[0], bytes[1], bytes[2], bytes[3]);
  if (tag === "RIFF" || tag === "RIFX" || tag === "RF64") return decodeWav(bytes, maxSec, opts.resampleToHz);
  if (tag === "fLaC") return decodeFlac(bytes, maxSec, opts.resampleToHz);
  throw new EngineError("not_audio", "not a WAV or FLAC file");
}

function checkLength(frames: number, sampleRateHz: number, maxSec: number): void {
  if (frames <= 0) throw new EngineError("empty", "the file holds no audio samples");
  if (frames / sampleRateHz > maxSec)
    throw new EngineError("too_long", `the take is ${(frames / sampleRateHz).toFixed(0)} s long; the limit is ${maxSec} s`);
}

async function decodeWav(bytes: Uint8Array, maxSec: number, toHz?: number): Promise<DecodedAudio> {
  if (bytes.length < 44) throw new EngineError("truncated", "the WAV header is truncated");
  const wav = new WaveFile();
  try {
    wav.fromBuffer(bytes, false);
  } catch (e) {
    throw new EngineError("truncated", `unreadable WAV header (${e instanceof Error ? e.message : "parse error"})`);
  }
  const fmt = wav.fmt as { audioFormat: number; numChannels: number; sampleRate: number; bitsPerSample: number; blockAlign: number; subformat?: number[] };
  let format = fmt.audioFormat;
  const channels = fmt.numChannels;
  const sampleRateHz = fmt.sampleRate;
  const bits = fmt.bitsPerSample;
  if (format === 0xfffe) {
    // WAVE_FORMAT_EXTENSIBLE: the sub-format GUID starts with the format code
    const sub = fmt.subformat;
    format = Array.isArray(sub) && sub.length > 0 ? sub[0] & 0xffff : bits === 64 ? 3 : 1;
  }
  if (!(channels >= 1 && channels <= 64)) throw new EngineError("unsupported_format", `WAV with ${channels} channels`);
  if (!(sampleRateHz >= 1000 && sampleRateHz <= 384000)) throw new EngineError("unsupported_format", `WAV sample rate ${sampleRateHz} Hz is outside 1 kHz … 384 kHz`);
  const isInt = format === 1 && (bits === 8 || bits === 16 || bits === 24 || bits === 32);
  const isFloat = format === 3 && (bits === 32 || bits === 64);
  if (!isInt && !isFloat) throw new EngineError("unsupported_format", `WAV format ${format} with ${bits}-bit samples is not supported`);
  const bytesPer = bits / 8;
  const frameBytes = bytesPer * channels;
  const loc = findDataChunk(bytes, wav.container === "RIFX");
  if (!loc) throw new EngineError("truncated", "the WAV file has no data chunk");
  const start = loc.start;
  let end = loc.end;
  // recorders that never finished the header leave size 0 or 0xFFFFFFFF: read what is there
  if (end > bytes.length || end <= start) end = bytes.length;
  const frames = Math.floor(Math.max(0, end - start) / frameBytes);
  checkLength(frames, sampleRateHz, maxSec);
  const dv = new DataView(bytes.buffer, bytes.byteOffset + start, frames * frameBytes);
  const le = wav.container !== "RIFX";
  const inv = 1 / channels;
  const BLOCK = 1 << 16;
  const block = new Float32Array(Math.min(BLOCK, frames));
  const resampler = toHz && toHz !== sampleRateHz ? await StreamResampler.create(sampleRateHz, toHz, frames) : null;
  const full = resampler ? null : new Float32Array(frames);
  for (let f0 = 0; f0 < frames; f0 += BLOCK) {
    const nb = Math.min(BLOCK, frames - f0);
    const out = full ? full.subarray(f0, f0 + nb) : block.subarray(0, nb);
    if (!full) out.fill(0);
    for (let c = 0; c < channels; c++) {
      let pos = f0 * frameBytes + c * bytesPer;
      if (isFloat && bits === 32) for (let i = 0; i < nb; i++, pos += frameBytes) out[i] += dv.getFloat32(pos, le) * inv;
      else if (isFloat) for (let i = 0; i < nb; i++, pos += frameBytes) out[i] += dv.getFloat64(pos, le) * inv;
      else if (bits === 16) for (let i = 0; i < nb; i++, pos += frameBytes) out[i] += dv.getInt16(pos, le) * (inv / 32768);
      else if (bits === 8) for (let i = 0; i < nb; i++, pos += frameBytes) out[i] += (dv.getUint8(pos) - 128) * (inv / 128);
      else if (bits === 24)
        for (let i = 0; i < nb; i++, pos += frameBytes) {
          const b0 = dv.getUint8(pos), b1 = dv.getUint8(pos + 1), b2 = dv.getUint8(pos + 2);
          let x = le ? b0 | (b1 << 8) | (b2 << 16) : b2 | (b1 << 8) | (b0 << 16);
          if (x & 0x800000) x -= 0x1000000;
          out[i] += x * (inv / 8388608);
        }
      else for (let i = 0; i < nb; i++, pos += frameBytes) out[i] += dv.getInt32(pos, le) * (inv / 2147483648);
    }
    if (isFloat) for (let i = 0; i < nb; i++) if (!Number.isFinite(out[i])) throw new EngineError("bad_samples", "the WAV file contains NaN or infinite samples");
    resampler?.push(out);
  }
  const samples = resampler ? resampler.finish() : (full as Float32Array);
  const rate = resampler ? (toHz as number) : sampleRateHz;
  return { samples, sampleRateHz: rate, sourceRateHz: sampleRateHz, channels, durationSec: frames / sampleRateHz, format: "wav" };
}

/** Walk the RIFF chunk list (each step advances ≥ 8 bytes, so it ends) to the "data" chunk. */
function findDataChunk(bytes: Uint8Array, bigEndian: boolean): { start: number; end: number } | null {
  const dv = new DataView(bytes.buffer, bytes.byteOffset, bytes.length);
  let off = 12;
  while (off + 8 <= bytes.length) {
    const id = String.fromCharCode(bytes[off], bytes[off + 1], bytes[off + 2], bytes[off + 3]);
    const size = dv.getUint32(off + 4, !bigEndian);
    if (id === "data") return { start: off + 8, end: size === 0xffffffff ? bytes.length : off + 8 + size };
    off += 8 + size + (size & 1);
  }
  return null;
}

async function decodeFlac(bytes: Uint8Array, maxSec: number, toHz?: number): Promise<DecodedAudio> {
  if (bytes.length < 42) throw new EngineError("truncated", "the FLAC header is truncated");
  // STREAMINFO (mandatory first metadata block): 4-byte block header, then 34 bytes
  const blockType = bytes[4] & 0x7f;
  if (blockType !== 0) throw new EngineError("truncated", "the FLAC file does not start with STREAMINFO");
  const si = 8;
  const sampleRateHz = (bytes[si + 10] << 12) | (bytes[si + 11] << 4) | (bytes[si + 12] >> 4);
  const totalFrames = (bytes[si + 13] & 0x0f) * 2 ** 32 + ((bytes[si + 14] << 24) >>> 0) + (bytes[si + 15] << 16) + (bytes[si + 16] << 8) + bytes[si + 17];
  if (!(sampleRateHz >= 1000 && sampleRateHz <= 655350)) throw new EngineError("unsupported_format", `FLAC sample rate ${sampleRateHz} Hz is not supported`);
  if (totalFrames > 0) checkLength(totalFrames, sampleRateHz, maxSec);
  const decoder = new FLACDecoder();
  let res;
  try {
    await decoder.ready;
    res = await decoder.decodeFile(bytes);
  } catch (e) {
    throw new EngineError("truncated", `unreadable FLAC data (${e instanceof Error ? e.message : "decode error"})`);
  } finally {
    try {
      decoder.free();
    } catch {
      /* already freed */
    }
  }
  const chans = res.channelData ?? [];
  const frames = res.samplesDecoded | 0;
  if (chans.length === 0 || frames <= 0) throw new EngineError(res.errors?.length ? "truncated" : "empty", "the FLAC file holds no decodable audio");
  checkLength(frames, res.sampleRate || sampleRateHz, maxSec);
  const out = new Float32Array(frames);
  // the decoder scales integers by 1/(2^(b−1) − 1); the WAV path (and common practice) uses
  // 1/2^(b−1), so the same audio decodes to the same numbers from either format
  const bits = res.bitDepth;
  const rescale = bits >= 8 && bits <= 32 ? (Math.pow(2, bits - 1) - 1) / Math.pow(2, bits - 1) : 1;
  const inv = rescale / chans.length;
  for (const ch of chans) for (let i = 0; i < frames; i++) out[i] += ch[i] * inv;
  for (let i = 0; i < frames; i++) if (!Number.isFinite(out[i])) throw new EngineError("bad_samples", "the FLAC file decodes to non-finite samples");
  const sr = res.sampleRate || sampleRateHz;
  const samples = toHz && toHz !== sr ? await resample(out, sr, toHz) : out;
  return { samples, sampleRateHz: toHz || sr, sourceRateHz: sr, channels: chans.length, durationSec: frames / sr, format: "flac" };
}

/**
 * Check a caller-supplied sample array (the engine's other entry point):
 * non-empty, finite, within the length limit.
 */
export function checkSamples(samples: Float32Array, sampleRateHz: number, maxDurationSec = DEFAULT_MAX_SEC): void {
  if (!(samples instanceof Float32Array)) throw new EngineError("bad_argument", "samples must be a Float32Array");
  if (!(Number.isFinite(sampleRateHz) && sampleRateHz >= 1000 && sampleRateHz <= 384000))
    throw new EngineError("bad_argument", `sample rate ${sampleRateHz} Hz is outside 1 kHz … 384 kHz`);
  checkLength(samples.length, sampleRateHz, maxDurationSec);
  for (let i = 0; i < samples.length; i++)
    if (!Number.isFinite(samples[i])) throw new EngineError("bad_samples", `sample ${i} is not a finite number`);
}
