import { describe, expect, it } from "vitest";
import { DEFAULT_TEMPO_BPM, estimateTempoBpm, TEMPO_MAX_BPM, TEMPO_MIN_BPM } from "@/lib/export";
import { rng } from "../../support/random";

// A melody-and-chords rhythm in beats: mostly quarters, some eighths, halves and a dotted quarter;
// every fourth event is a three-note chord.
const RHYTHM_BEATS = [1, 1, 0.5, 0.5, 1, 2, 1, 1, 1.5, 0.5, 1, 1, 0.5, 0.5, 0.5, 0.5, 2, 1, 1, 1, 1];

function onsetsAt(bpm: number, seed: number, jitterSec = 0.01, startSec = 0.37): number[] {
  const rand = rng(seed);
  const beatSec = 60 / bpm;
  const onsets: number[] = [];
  let beat = 0;
  for (let rep = 0; rep < 4; rep++) {
    for (const [k, len] of RHYTHM_BEATS.entries()) {
      const t = startSec + beat * beatSec;
      const chord = k % 4 === 0 ? 3 : 1;
      for (let c = 0; c < chord; c++) onsets.push(t + (rand() * 2 - 1) * jitterSec);
      beat += len;
    }
  }
  return onsets;
}

describe("tempo estimate from onsets", () => {
  // Known tempos, timing spread ±10 ms (uniform), several seeds; within 2 % of the true tempo.
  for (const bpm of [60, 96, 120, 150]) {
    it(`${bpm} bpm with ±10 ms jitter is found within 2 %`, () => {
      for (const seed of [1, 2, 3, 4, 5]) {
        const est = estimateTempoBpm(onsetsAt(bpm, seed));
        expect(Math.abs(est - bpm) / bpm).toBeLessThan(0.02);
      }
    });
  }

  it("does not depend on the order of the onsets", () => {
    const onsets = onsetsAt(96, 9);
    const shuffled = [...onsets].reverse();
    expect(estimateTempoBpm(shuffled)).toBe(estimateTempoBpm(onsets));
  });

  it("folds into 40 … 240 bpm", () => {
    // onsets 4 s apart (15 bpm) fold twice, to 60 bpm; 0.1 s apart (600 bpm) fold twice, to 150
    const slow = Array.from({ length: 12 }, (_, k) => k * 4);
    const est = estimateTempoBpm(slow);
    expect(est).toBeGreaterThanOrEqual(TEMPO_MIN_BPM);
    expect(est).toBeLessThanOrEqual(TEMPO_MAX_BPM);
    expect(Math.abs(est - 60) / 60).toBeLessThan(0.02);
    const fast = Array.from({ length: 64 }, (_, k) => k * 0.1);
    expect(Math.abs(estimateTempoBpm(fast) - 150) / 150).toBeLessThan(0.02);
  });

  it("falls back to the MIDI default for fewer than three events", () => {
    expect(estimateTempoBpm([])).toBe(DEFAULT_TEMPO_BPM);
    expect(estimateTempoBpm([1])).toBe(DEFAULT_TEMPO_BPM);
    expect(estimateTempoBpm([1, 1.01, 2])).toBe(DEFAULT_TEMPO_BPM); // a chord and one note
  });
});
