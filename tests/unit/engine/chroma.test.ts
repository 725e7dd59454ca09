import { describe, it, expect } from "vitest";
import { chromaFrames } from "@/lib/engine/chroma";

// 12-TET pitch classes (REFERENCES.md §4): A4 = 440 Hz is class 9 (C = 0), middle C
// 261.626 Hz class 0; a C-major triad (C E G) lights classes 0, 4, 7.
function tones(freqs: number[], fs: number, sec = 1) {
  const x = new Float32Array(Math.round(fs * sec));
  for (const f of freqs) for (let i = 0; i < x.length; i++) x[i] += 0.2 * Math.sin((2 * Math.PI * f * i) / fs);
  return x;
}
const argsort = (row: Float32Array) => Array.from(row.keys()).sort((a, b) => row[b] - row[a]);

describe("chroma per frame (meyda's chroma extractor on Tapernote's tapered frames)", () => {
  for (const fs of [16000, 44100]) {
    it(`pitch classes of single tones at ${fs} Hz`, () => {
      for (const [f, pc] of [[440, 9], [261.626, 0], [392, 7], [311.13, 3]] as const) {
        const { chroma, frames } = chromaFrames(tones([f], fs), fs, { frameLength: 4096 });
        const mid = Math.floor(frames / 2);
        expect(argsort(chroma.subarray(mid * 12, mid * 12 + 12))[0]).toBe(pc);
      }
    });
  }
  it("a C-major triad lights C, E and G", () => {
    const fs = 22050;
    const { chroma, frames } = chromaFrames(tones([261.626, 329.628, 391.995], fs), fs, { frameLength: 8192 });
    const mid = Math.floor(frames / 2);
    expect(argsort(chroma.subarray(mid * 12, mid * 12 + 12)).slice(0, 3).sort((a, b) => a - b)).toEqual([0, 4, 7]);
  });
});
