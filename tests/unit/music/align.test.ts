import { describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import {
  alignToAssignment,
  mapAssignmentToPlayed,
  mapPlayedToAssignment,
  noteFeatureFrames,
  subsequenceDtw,
  type AlignNote,
} from "@/lib/music/align";
import { rng } from "../../support/random";

/** An invented exercise: four-part chords (I–vi–IV–V7 twice, each held 1 s) under a melody in eighths. */
function exercise(): AlignNote[] {
  const chords = [
    [48, 64, 67, 72],
    [45, 64, 69, 72],
    [41, 65, 69, 72],
    [43, 62, 65, 71],
  ];
  const melody = [76, 74, 72, 74, 76, 76, 76, 74, 74, 76, 79, 79, 76, 74, 72, 74];
  const notes: AlignNote[] = [];
  for (let bar = 0; bar < 8; bar++) {
    const t = bar * 1;
    chords[bar % 4].forEach((pitch, v) => notes.push({ onsetSec: t, offsetSec: t + 0.95, pitch, voice: v + 1 }));
  }
  for (let k = 0; k < melody.length * 1; k++) {
    const t = k * 0.5;
    notes.push({ onsetSec: t, offsetSec: t + 0.45, pitch: melody[k % melody.length] + 12, voice: 5 });
  }
  return notes.sort((a, b) => a.onsetSec - b.onsetSec || a.pitch - b.pitch);
}

/** A performance: times stretched by `stretch` and shifted by `delaySec`, onsets jittered ±jitterSec. */
function perform(notes: readonly AlignNote[], stretch: number, delaySec: number, jitterSec: number, seed = 3): AlignNote[] {
  const random = rng(seed);
  return notes.map((n) => {
    const j = (random() - 0.5) * 2 * jitterSec;
    return { ...n, onsetSec: n.onsetSec * stretch + delaySec + j, offsetSec: n.offsetSec * stretch + delaySec + j };
  });
}

const demo = (name: string): AlignNote[] =>
  JSON.parse(readFileSync(fileURLToPath(new URL(`../../../demo/${name}.json`, import.meta.url)), "utf8")).notes;

describe("alignToAssignment (subsequence DTW over chroma)", () => {
  it("a take 10 % slower and starting 2 s late matches ≥ 95 % of its notes", () => {
    const expected = exercise();
    const played = perform(expected, 1.1, 2, 0.02);
    const a = alignToAssignment(played, expected);
    expect(a.score!).toBeGreaterThanOrEqual(0.95);
    expect(a.fMeasure!).toBeGreaterThanOrEqual(0.95);
    expect(a.tempoRatio!).toBeCloseTo(1.1, 1);
    expect(a.offsetSec!).toBeCloseTo(2, 0);
    // the time map: the assignment's 4 s mark is played at about 2 + 4.4 s
    expect(Math.abs(mapAssignmentToPlayed(a.timeMap, 4) - 6.4)).toBeLessThan(0.1);
    expect(Math.abs(mapPlayedToAssignment(a.timeMap, 6.4) - 4)).toBeLessThan(0.1);
  });

  it("over a grid of tempi and starts", () => {
    const expected = exercise();
    for (const stretch of [0.8, 0.9, 1, 1.1, 1.25]) {
      for (const delaySec of [0, 0.7, 2, 5]) {
        const a = alignToAssignment(perform(expected, stretch, delaySec, 0.02, 5), expected);
        expect(a.score!, `×${stretch}, +${delaySec} s`).toBeGreaterThanOrEqual(0.95);
      }
    }
  });

  it("follows rubato (tempo swinging ±15 %) with ±40 ms onset scatter", () => {
    const expected = exercise();
    // played time = ∫ local tempo factor: t' = 1.5 + t + 0.15 · (P/2π) · (1 − cos(2πt/P)), P = 6 s
    const warp = (t: number) => 1.5 + t + ((0.15 * 6) / (2 * Math.PI)) * (1 - Math.cos((2 * Math.PI * t) / 6));
    const random = rng(21);
    const played = expected.map((n) => {
      const j = (random() - 0.5) * 0.08;
      return { ...n, onsetSec: warp(n.onsetSec) + j, offsetSec: warp(n.offsetSec) + j };
    });
    const a = alignToAssignment(played, expected);
    expect(a.score!).toBeGreaterThanOrEqual(0.95);
    expect(a.counts.offPitch).toBe(0);
  });

  it("a wrong note is off-pitch, a left-out one missed, an added one extra", () => {
    const expected = exercise();
    const played = perform(expected, 1.1, 2, 0.02);
    // indices into the sorted exercise: pick melody notes (voice 5) in the middle
    const melodyIdx = expected.map((n, i) => (n.voice === 5 ? i : -1)).filter((i) => i >= 0);
    const wrong = melodyIdx[5];
    const left = melodyIdx[9];
    played[wrong] = { ...played[wrong], pitch: played[wrong].pitch + 1 };
    const withoutLeft = played.filter((_, i) => i !== left);
    const added: AlignNote = { onsetSec: 2 + 6.25 * 1.1, offsetSec: 2 + 6.4 * 1.1, pitch: 95, voice: 5 };
    const take = [...withoutLeft, added];
    const a = alignToAssignment(take, expected);
    expect(a.expected[wrong].result).toBe("off-pitch");
    expect(a.expected[left].result).toBe("missed");
    const addedResult = a.played.find((p) => p.pitch === 95)!;
    expect(addedResult.result).toBe("extra");
    expect(a.counts).toMatchObject({ expected: expected.length, played: take.length, missed: 1, extra: 1, offPitch: 1 });
    expect(a.counts.matched).toBe(expected.length - 2);
    const offPitchPlayed = a.played.find((p) => p.result === "off-pitch")!;
    expect(offPitchPlayed.expectedIndex).toBe(wrong);
  });

  it("ignores a warm-up before the exercise", () => {
    const expected = exercise();
    const warmUp: AlignNote[] = [0, 0.4, 0.8, 1.2].map((t, k) => ({ onsetSec: t, offsetSec: t + 0.3, pitch: 60 + 2 * k, voice: 1 }));
    const a = alignToAssignment([...warmUp, ...perform(expected, 1.05, 3, 0.01)], expected);
    expect(a.score!).toBeGreaterThanOrEqual(0.95);
    expect(a.counts.extra).toBe(4);
  });

  for (const name of ["chord-exercise", "two-hand-study"]) {
    it(`the committed demo ground truth demo/${name}.json, time-stretched and delayed`, () => {
      const expected = demo(name);
      expect(expected.length).toBeGreaterThan(20);
      for (const [stretch, delaySec] of [
        [1.1, 2],
        [0.9, 0.5],
      ]) {
        const a = alignToAssignment(perform(expected, stretch, delaySec, 0.02, 9), expected);
        expect(a.score!, `${name} ×${stretch} +${delaySec}`).toBeGreaterThanOrEqual(0.95);
        expect(a.counts.extra).toBeLessThanOrEqual(Math.ceil(0.05 * expected.length));
        expect(a.tempoRatio!).toBeCloseTo(stretch, 1);
      }
    });
  }

  it("empty inputs", () => {
    const expected = exercise();
    const none = alignToAssignment([], expected);
    expect(none.counts).toMatchObject({ matched: 0, missed: expected.length, extra: 0 });
    expect(none.score).toBe(0);
    const noAssignment = alignToAssignment(expected, []);
    expect(noAssignment.counts.extra).toBe(expected.length);
    expect(noAssignment.score).toBeNull();
  });
});

describe("subsequenceDtw", () => {
  it("finds a query inside a longer sequence (one-hot frames)", () => {
    const oneHot = (classes: number[]) => {
      const f = new Float32Array(classes.length * 3);
      classes.forEach((c, k) => (f[k * 3 + c] = 1));
      return f;
    };
    const query = oneHot([0, 1, 2, 1]);
    const database = oneHot([2, 2, 0, 0, 1, 2, 2, 1, 0, 0]);
    const path = subsequenceDtw(query, database, 3);
    // starts on the second 0: from the first, the next step would have to pair 1 with 0 (row 0 has no horizontal steps)
    expect(path[0]).toEqual([0, 3]);
    expect(path[path.length - 1]).toEqual([3, 7]);
    for (let k = 1; k < path.length; k++) {
      const di = path[k][0] - path[k - 1][0];
      const dj = path[k][1] - path[k - 1][1];
      expect([di, dj]).toSatisfy(([a, b]: number[]) => a >= 0 && b >= 0 && a + b >= 1 && a <= 1 && b <= 1);
    }
  });

  it("feature frames are unit length and mark onsets", () => {
    const f = noteFeatureFrames([{ onsetSec: 0, offsetSec: 0.2, pitch: 60 }], 0, 0.05, 5);
    const row = (k: number) => Array.from(f.slice(k * 24, k * 24 + 24));
    expect(Math.hypot(...row(0))).toBeCloseTo(1, 5);
    expect(row(0)[12]).toBeGreaterThan(0);
    expect(row(3)[12]).toBe(0);
    expect(row(3)[0]).toBeCloseTo(1, 5);
    expect(row(4).every((x) => x === 0)).toBe(true);
  });
});
