import { describe, it, expect } from "vitest";
import { readFileSync } from "node:fs";
import wf from "wavefile";
import { decodeAudio, checkSamples } from "@/lib/engine/decode";
import { EngineError } from "@/lib/engine/errors";

const { WaveFile } = wf;
const fixture = (name: string) => new Uint8Array(readFileSync(new URL(`../../fixtures/engine/${name}`, import.meta.url)));

/** A WAV written by wavefile (an independent encoder) from a 2-channel test signal. */
function makeWav(bitDepth: string, channels: number, rateHz: number, frames = 500) {
  const chans: number[][] = [];
  const truth: number[][] = [];
  for (let c = 0; c < channels; c++) {
    const v: number[] = [];
    const t: number[] = [];
    for (let i = 0; i < frames; i++) {
      const x = 0.8 * Math.sin((2 * Math.PI * (i + 1) * (c + 1)) / 37);
      t.push(x);
      if (bitDepth === "8") v.push(Math.round(x * 127) + 128);
      else if (bitDepth === "16") v.push(Math.round(x * 32767));
      else if (bitDepth === "24") v.push(Math.round(x * 8388607));
      else if (bitDepth === "32") v.push(Math.round(x * 2147483647));
      else v.push(x);
    }
    chans.push(v);
    truth.push(t);
  }
  const w = new WaveFile();
  w.fromScratch(channels, rateHz, bitDepth, channels === 1 ? chans[0] : chans);
  return { bytes: w.toBuffer(), truth };
}

async function expectCode(p: Promise<unknown>, code: string) {
  try {
    await p;
  } catch (e) {
    expect(e).toBeInstanceOf(EngineError);
    expect((e as EngineError).code).toBe(code);
    expect((e as EngineError).message).not.toMatch(/\n/);
    return;
  }
  throw new Error(`expected EngineError ${code}`);
}

describe("WAV decoding (files written by wavefile)", () => {
  const quant: Record<string, number> = { "8": 1 / 100, "16": 1e-4, "24": 1e-6, "32": 1e-7, "32f": 1e-7, "64": 1e-7 }; // output is Float32 (≈ 6e-8 relative)
  for (const bits of ["8", "16", "24", "32", "32f", "64"]) {
    for (const [channels, rate] of [[1, 8000], [2, 44100], [3, 96000]]) {
      it(`${bits}-bit, ${channels} channel(s), ${rate} Hz → mono mean`, async () => {
        const { bytes, truth } = makeWav(bits, channels, rate);
        const d = await decodeAudio(bytes);
        expect(d.sampleRateHz).toBe(rate);
        expect(d.channels).toBe(channels);
        expect(d.samples.length).toBe(500);
        expect(d.durationSec).toBeCloseTo(500 / rate, 9);
        for (let i = 0; i < 500; i += 7) {
          const mean = truth.reduce((s, ch) => s + ch[i], 0) / channels;
          expect(Math.abs(d.samples[i] - mean)).toBeLessThan(quant[bits]);
        }
      });
    }
  }
});

describe("FLAC decoding (@wasm-audio-decoders/flac; fixtures encoded by sox/libFLAC)", () => {
  it("16-bit mono FLAC equals the same audio as WAV, sample for sample", async () => {
    const a = await decodeAudio(fixture("short.wav"));
    const b = await decodeAudio(fixture("short.flac"));
    expect(b.format).toBe("flac");
    expect(b.sampleRateHz).toBe(a.sampleRateHz);
    expect(b.samples.length).toBe(a.samples.length);
    let maxErr = 0;
    for (let i = 0; i < a.samples.length; i++) maxErr = Math.max(maxErr, Math.abs(a.samples[i] - b.samples[i]));
    expect(maxErr).toBeLessThan(1e-7);
  });
  it("24-bit stereo FLAC mixes to the same mono signal (within 16-bit rounding)", async () => {
    const a = await decodeAudio(fixture("short.wav"));
    const b = await decodeAudio(fixture("short-stereo24.flac"));
    expect(b.channels).toBe(2);
    let maxErr = 0;
    for (let i = 0; i < a.samples.length; i++) maxErr = Math.max(maxErr, Math.abs(a.samples[i] - b.samples[i]));
    expect(maxErr).toBeLessThan(1e-4);
  });
});

describe("bad input raises one typed error", () => {
  it("not audio", () => expectCode(decodeAudio(new TextEncoder().encode("hello, this is not a recording at all")), "not_audio"));
  it("zero length", () => expectCode(decodeAudio(new Uint8Array(0)), "empty"));
  it("truncated WAV header", () => expectCode(decodeAudio(makeWav("16", 1, 8000).bytes.slice(0, 30)), "truncated"));
  it("truncated FLAC header", () => expectCode(decodeAudio(fixture("short.flac").slice(0, 20)), "truncated"));
  it("WAV with a data chunk of zero samples", () => expectCode(decodeAudio(makeWav("16", 1, 8000, 0).bytes), "empty"));
  it("NaN samples", async () => {
    const { bytes } = makeWav("32f", 1, 8000);
    const dv = new DataView(bytes.buffer, bytes.byteOffset);
    dv.setFloat32(44 + 4 * 10, NaN, true);
    await expectCode(decodeAudio(bytes), "bad_samples");
  });
  it("infinite samples", async () => {
    const { bytes } = makeWav("64", 2, 8000);
    new DataView(bytes.buffer, bytes.byteOffset).setFloat64(44 + 8 * 3, Infinity, true);
    await expectCode(decodeAudio(bytes), "bad_samples");
  });
  it("over the length limit", () => expectCode(decodeAudio(makeWav("16", 1, 8000, 8001).bytes, { maxDurationSec: 1 }), "too_long"));
  it("FLAC over the length limit", () => expectCode(decodeAudio(fixture("short.flac"), { maxDurationSec: 0.5 }), "too_long"));
  it("unsupported WAV format (μ-law, format 7)", async () => {
    const { bytes } = makeWav("16", 1, 8000);
    new DataView(bytes.buffer, bytes.byteOffset).setUint16(20, 7, true);
    await expectCode(decodeAudio(bytes), "unsupported_format");
  });
  it("sample arrays given directly are checked too", () => {
    expect(() => checkSamples(new Float32Array([0, NaN]), 44100)).toThrow(EngineError);
    expect(() => checkSamples(new Float32Array(0), 44100)).toThrow(EngineError);
    expect(() => checkSamples(new Float32Array(10), 0)).toThrow(EngineError);
  });
});

describe("decoder fuzz: ≥ 10 000 random and mutated inputs give audio or the typed error, nothing else", () => {
  let seed = 12345;
  const rnd = () => {
    seed = (Math.imul(seed, 1664525) + 1013904223) >>> 0;
    return seed / 4294967296;
  };
  const bases = [makeWav("16", 2, 22050, 200).bytes, makeWav("24", 1, 8000, 100).bytes, makeWav("32f", 1, 48000, 100).bytes, makeWav("8", 3, 11025, 50).bytes];
  const flac = fixture("short.flac").slice(0, 4000);
  function mutate(src: Uint8Array): Uint8Array {
    let b = src.slice();
    const kind = Math.floor(rnd() * 4);
    if (kind === 0) b = b.slice(0, Math.floor(rnd() * b.length));
    const flips = 1 + Math.floor(rnd() * 8);
    for (let i = 0; i < flips; i++) {
      // mostly in the header, where the parser works
      const at = rnd() < 0.8 ? Math.floor(rnd() * Math.min(64, b.length)) : Math.floor(rnd() * b.length);
      b[at] = Math.floor(rnd() * 256);
    }
    if (kind === 2 && b.length > 8) new DataView(b.buffer).setUint32(4 + 4 * Math.floor(rnd() * 10), Math.floor(rnd() * 2 ** 32), true);
    return b;
  }
  async function check(bytes: Uint8Array) {
    try {
      const d = await decodeAudio(bytes, { maxDurationSec: 600 });
      expect(d.samples.length).toBeGreaterThan(0);
      for (let i = 0; i < d.samples.length; i++) if (!Number.isFinite(d.samples[i])) throw new Error("non-finite sample returned");
    } catch (e) {
      if (!(e instanceof EngineError)) throw new Error(`untyped error: ${e instanceof Error ? e.message : e}`);
    }
  }
  it("9 000 WAV-based and random inputs", async () => {
    for (let i = 0; i < 9000; i++) {
      const r = rnd();
      let bytes: Uint8Array;
      if (r < 0.15) bytes = Uint8Array.from({ length: Math.floor(rnd() * 200) }, () => Math.floor(rnd() * 256));
      else if (r < 0.25) {
        // random bytes behind a valid-looking RIFF/WAVE signature
        bytes = Uint8Array.from({ length: 12 + Math.floor(rnd() * 300) }, () => Math.floor(rnd() * 256));
        bytes.set(new TextEncoder().encode("RIFF"), 0);
        bytes.set(new TextEncoder().encode("WAVE"), 8);
      } else bytes = mutate(bases[i % bases.length]);
      await check(bytes);
    }
  }, 60_000);
  it("1 000 FLAC-based inputs", async () => {
    for (let i = 0; i < 1000; i++) {
      const bytes = i % 10 === 0 ? Uint8Array.from([0x66, 0x4c, 0x61, 0x43, ...Array.from({ length: 100 }, () => Math.floor(rnd() * 256))]) : mutate(flac);
      await check(bytes);
    }
  }, 60_000);
});
