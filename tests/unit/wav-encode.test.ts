import { describe, expect, it } from "vitest";
import wf from "wavefile";
import { WAV_HEADER_BYTES, encodeWavPcm16Mono, floatToPcm16, mixToMono } from "@/lib/client/wav-encode";

const { WaveFile } = wf;

// The independent reference: the wavefile package parses what we write.
function parse(bytes: Uint8Array) {
  const wav = new WaveFile(bytes);
  const fmt = wav.fmt as {
    audioFormat: number;
    numChannels: number;
    sampleRate: number;
    byteRate: number;
    blockAlign: number;
    bitsPerSample: number;
  };
  return { wav, fmt, samples: wav.getSamples(false, Int16Array) as unknown as Int16Array };
}

describe("encodeWavPcm16Mono", () => {
  for (const sampleRateHz of [8000, 22050, 44100, 48000, 96000]) {
    it(`writes a PCM header wavefile reads back at ${sampleRateHz} Hz`, () => {
      const seconds = 0.05;
      const n = Math.round(sampleRateHz * seconds);
      const samples = new Float32Array(n);
      for (let i = 0; i < n; i++) samples[i] = 0.5 * Math.sin((2 * Math.PI * 440 * i) / sampleRateHz);
      const bytes = encodeWavPcm16Mono(samples, sampleRateHz);
      expect(bytes.length).toBe(WAV_HEADER_BYTES + 2 * n);

      const { wav, fmt, samples: read } = parse(bytes);
      expect(wav.container).toBe("RIFF");
      expect(wav.format).toBe("WAVE");
      expect(fmt.audioFormat).toBe(1);
      expect(fmt.numChannels).toBe(1);
      expect(fmt.sampleRate).toBe(sampleRateHz);
      expect(fmt.bitsPerSample).toBe(16);
      expect(fmt.blockAlign).toBe(2);
      expect(fmt.byteRate).toBe(2 * sampleRateHz);
      expect(read.length).toBe(n);
      for (let i = 0; i < n; i++) {
        // 16-bit quantisation: within half a step of the float value × 32767
        expect(Math.abs(read[i]! - samples[i]! * 32767)).toBeLessThanOrEqual(1);
      }
    });
  }

  it("clamps out-of-range samples and keeps the extremes", () => {
    const bytes = encodeWavPcm16Mono(Float32Array.from([0, 1, -1, 1.5, -2, 0.25, Number.NaN]), 44100);
    const { samples } = parse(bytes);
    expect(Array.from(samples)).toEqual([0, 32767, -32768, 32767, -32768, 8192, 0]);
  });

  it("writes an empty data chunk for no samples", () => {
    const { wav, samples } = parse(encodeWavPcm16Mono(new Float32Array(0), 44100));
    expect((wav.data as { chunkSize: number }).chunkSize).toBe(0);
    expect(samples.length).toBe(0);
  });

  it("refuses a sample rate that is not a positive integer", () => {
    expect(() => encodeWavPcm16Mono(new Float32Array(4), 0)).toThrow(RangeError);
    expect(() => encodeWavPcm16Mono(new Float32Array(4), 44100.5)).toThrow(RangeError);
  });
});

describe("floatToPcm16", () => {
  it("maps the ends and zero exactly", () => {
    expect(floatToPcm16(1)).toBe(32767);
    expect(floatToPcm16(-1)).toBe(-32768);
    expect(floatToPcm16(0)).toBe(0);
    expect(floatToPcm16(-0.5)).toBe(-16384);
  });
});

describe("mixToMono", () => {
  it("averages the channels sample by sample", () => {
    const left = Float32Array.from([1, 0.5, -1, 0]);
    const right = Float32Array.from([0, 0.5, 1, -0.5]);
    expect(Array.from(mixToMono([left, right]))).toEqual([0.5, 0.5, 0, -0.25]);
  });

  it("returns a single channel as it is and reads to the shortest channel", () => {
    const only = Float32Array.from([0.1, 0.2]);
    expect(mixToMono([only])).toBe(only);
    expect(mixToMono([Float32Array.from([1, 1, 1]), Float32Array.from([1, 1])]).length).toBe(2);
    expect(mixToMono([]).length).toBe(0);
  });

  it("a stereo file through mixToMono and the encoder reads back as the mean", () => {
    const sampleRateHz = 16000;
    const n = 1600;
    const left = new Float32Array(n);
    const right = new Float32Array(n);
    for (let i = 0; i < n; i++) {
      left[i] = 0.6 * Math.sin((2 * Math.PI * 261.63 * i) / sampleRateHz);
      right[i] = 0.2 * Math.sin((2 * Math.PI * 392 * i) / sampleRateHz);
    }
    const { samples } = parse(encodeWavPcm16Mono(mixToMono([left, right]), sampleRateHz));
    for (let i = 0; i < n; i += 37) {
      expect(Math.abs(samples[i]! - ((left[i]! + right[i]!) / 2) * 32767)).toBeLessThanOrEqual(1);
    }
  });
});
