/**
 * A 16-bit PCM mono WAV writer for the browser (pure: typed arrays in, bytes out).
 *
 * Used for takes the server cannot decode (MP3, OGG/Opus, M4A/AAC): the browser decodes
 * them with the Web Audio API, mixes to mono and sends this rendering alongside the
 * original. Layout: RIFF/WAVE with a 16-byte `fmt ` chunk (format 1 = PCM) and a `data`
 * chunk, little-endian (Microsoft/IBM "Multimedia Programming Interface and Data
 * Specifications 1.0", 1991, the RIFF WAVE chapter).
 */

/** Byte length of the header written by {@link encodeWavPcm16Mono}. */
export const WAV_HEADER_BYTES = 44;

/**
 * The mean of the channels, sample by sample: m[n] = (1/C) · Σ_c x_c[n].
 * Channels of different lengths are read up to the shortest one.
 */
export function mixToMono(channels: readonly Float32Array[]): Float32Array {
  if (channels.length === 0) return new Float32Array(0);
  if (channels.length === 1) return channels[0]!;
  const length = Math.min(...channels.map((c) => c.length));
  const out = new Float32Array(length);
  const gain = 1 / channels.length;
  for (const channel of channels) {
    for (let n = 0; n < length; n++) out[n] += channel[n]! * gain;
  }
  return out;
}

/**
 * Float sample in [−1, 1] to a signed 16-bit integer: clamp, then scale by 32767 for
 * positive and 32768 for negative values, rounded to the nearest integer, so ±1 map to
 * 32767 and −32768 and 0 stays 0. NaN becomes 0.
 */
export function floatToPcm16(sample: number): number {
  if (!(sample === sample)) return 0; // NaN
  const s = sample > 1 ? 1 : sample < -1 ? -1 : sample;
  return s < 0 ? Math.round(s * 32768) : Math.round(s * 32767);
}

/** Encodes mono float samples as a 16-bit PCM WAV file at `sampleRateHz`. */
export function encodeWavPcm16Mono(samples: Float32Array, sampleRateHz: number): Uint8Array {
  if (!Number.isInteger(sampleRateHz) || sampleRateHz <= 0) {
    throw new RangeError(`sample rate must be a positive integer (Hz), got ${sampleRateHz}`);
  }
  const channels = 1;
  const bytesPerSample = 2;
  const dataBytes = samples.length * bytesPerSample * channels;
  const bytes = new Uint8Array(WAV_HEADER_BYTES + dataBytes);
  const view = new DataView(bytes.buffer);
  const ascii = (offset: number, text: string) => {
    for (let i = 0; i < text.length; i++) view.setUint8(offset + i, text.charCodeAt(i));
  };
  ascii(0, "RIFF");
  view.setUint32(4, 36 + dataBytes, true); // RIFF size: everything after these 8 bytes
  ascii(8, "WAVE");
  ascii(12, "fmt ");
  view.setUint32(16, 16, true); // fmt chunk size
  view.setUint16(20, 1, true); // format tag 1 = PCM
  view.setUint16(22, channels, true);
  view.setUint32(24, sampleRateHz, true);
  view.setUint32(28, sampleRateHz * channels * bytesPerSample, true); // byte rate
  view.setUint16(32, channels * bytesPerSample, true); // block align
  view.setUint16(34, 8 * bytesPerSample, true); // bits per sample
  ascii(36, "data");
  view.setUint32(40, dataBytes, true);
  for (let n = 0; n < samples.length; n++) {
    view.setInt16(WAV_HEADER_BYTES + n * bytesPerSample, floatToPcm16(samples[n]!), true);
  }
  return bytes;
}
