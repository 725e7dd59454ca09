import { describe, expect, it } from "vitest";
import { pitchToY, RULER_PX, type Viewport } from "@/components/piano-roll/geometry";
import { axisForRange, bandPitch, binToHz, hzToBin, hzToY, makeBands, pitchToBand, pitchToRowY, yToHz } from "@/components/timeline/freq-axis";
import { ColumnMaker, defaultSpec } from "@/components/timeline/spectrogram-columns";
import { makePeaks, rangeMinMax } from "@/components/timeline/audio-data";
import { midiToHz } from "@/lib/music/pitch";
import { rng } from "@/tests/support/random";

describe("the spectrogram's log-frequency axis", () => {
  it("puts each pitch's 12-TET frequency on the same row as the piano roll's geometry", () => {
    for (const [topPitch, rowPx] of [[84, 12], [96.5, 7], [72, 18]] as const) {
      const v: Viewport = { startSec: 0, pxPerSec: 100, topPitch, rowPx, widthPx: 800, heightPx: 400 };
      const axis = { topPitch, rowPx, topPx: RULER_PX };
      for (let p = 40; p <= 84; p++) {
        expect(pitchToRowY(axis, p)).toBeCloseTo(pitchToY(v, p), 9);
        // the frequency of p lies on the centre of p's row, inside it
        const y = hzToY(axis, midiToHz(p));
        expect(y).toBeCloseTo(pitchToY(v, p) + rowPx / 2, 9);
        expect(y).toBeGreaterThan(pitchToY(v, p));
        expect(y).toBeLessThan(pitchToY(v, p) + rowPx);
      }
    }
  });

  it("is logarithmic: an octave is always 12 rows, and y ↔ Hz are inverse", () => {
    const axis = axisForRange(28, 108, 162);
    expect(axis.rowPx).toBeCloseTo(2, 12);
    expect(hzToY(axis, 110) - hzToY(axis, 220)).toBeCloseTo(24, 9);
    expect(hzToY(axis, 1760) - hzToY(axis, 3520)).toBeCloseTo(24, 9);
    for (const f of [41.2, 100, 440, 1234.5, 4186]) expect(yToHz(axis, hzToY(axis, f))).toBeCloseTo(f, 6);
  });

  it("bins ↔ Hz: bin k is k·fs/N", () => {
    expect(binToHz(1, 4096, 22050)).toBeCloseTo(5.383, 3);
    expect(hzToBin(440, 4096, 22050)).toBeCloseTo(81.73, 2);
    expect(binToHz(hzToBin(1000, 2048, 48000), 2048, 48000)).toBeCloseTo(1000, 9);
  });

  it("bands tile the pitches: three per semitone, the middle one centred on the note", () => {
    const bands = makeBands(28, 108, 3, 4096, 22050);
    expect(bands.count).toBe(81 * 3);
    for (let p = 28; p <= 108; p++) {
      const b = pitchToBand(bands, p);
      expect(b).toBe((p - 28) * 3 + 1);
      expect(bandPitch(bands, b)).toBeCloseTo(p, 9);
      expect(binToHz(bands.binLo[b]!, 4096, 22050)).toBeLessThan(midiToHz(p));
      expect(binToHz(bands.binHi[b]!, 4096, 22050)).toBeGreaterThan(midiToHz(p));
    }
  });

  it("a sinusoid's energy lands in its own pitch's band, at its level in dB re full scale", () => {
    const spec = defaultSpec(22050);
    const maker = new ColumnMaker(spec);
    const bands = makeBands(spec.lowPitch, spec.highPitch, spec.bandsPerSemitone, spec.fftSize, spec.sampleRateHz);
    for (const [pitch, amp] of [[45, 0.1], [60, 0.1], [69, 0.1], [93, 0.1], [69, 0.01]] as const) {
      const f = midiToHz(pitch);
      const x = new Float32Array(22050);
      for (let i = 0; i < x.length; i++) x[i] = amp * Math.sin((2 * Math.PI * f * i) / 22050);
      const out = new Uint8Array(maker.bandCount);
      maker.columns(x, 40, 41, out);
      let best = 0;
      for (let b = 1; b < out.length; b++) if (out[b]! > out[best]!) best = b;
      expect(Math.abs(bandPitch(bands, best) - pitch)).toBeLessThan(0.5);
      const db = 20 * Math.log10(amp);
      const expected = ((db - spec.floorDb) * 255) / (spec.ceilDb - spec.floorDb);
      // off a bin centre the Hann taper reads up to 1.42 dB low (its scalloping loss, Harris 1978)
      const perDb = 255 / (spec.ceilDb - spec.floorDb);
      expect(out[best]!).toBeLessThanOrEqual(expected + 1);
      expect(out[best]!).toBeGreaterThanOrEqual(expected - 1.5 * perDb - 1);
    }
  });
});

describe("waveform peaks", () => {
  it("min/max of any range from the peak levels equal a plain scan (seeded ranges)", () => {
    const random = rng(21);
    const x = new Float32Array(100_003);
    for (let i = 0; i < x.length; i++) x[i] = Math.sin(i / 37) * (random() - 0.5) * 2;
    const take = { mono: x, peaks: makePeaks(x) };
    expect(take.peaks.at(-1)!.min.length).toBe(1);
    for (let k = 0; k < 300; k++) {
      const a = random() * x.length;
      const b = a + random() ** 3 * 40_000 + 1;
      let lo = Infinity;
      let hi = -Infinity;
      for (let i = Math.floor(a); i < Math.min(x.length, Math.ceil(b)); i++) {
        lo = Math.min(lo, x[i]!);
        hi = Math.max(hi, x[i]!);
      }
      expect(rangeMinMax(take, a, b)).toEqual([lo, hi]);
    }
  });
});
