import { describe, it, expect } from "vitest";
import { AttackAnalyser } from "@/lib/engine/attacks";

// Synthetic peak lists: a note held throughout (220 Hz, partials 1/h) and a second note
// starting at frame 100 on the held note's 3rd partial (660 Hz); the detection function has
// one peak there.
function series(f0: number, amp: number, out: Array<[number, number]>) {
  for (let h = 1; h * f0 < 7000 && h <= 12; h++) out.push([h * f0, amp / h]);
}

function run(newAmp: number) {
  const frames = 200;
  const hopSec = 0.01;
  const an = new AttackAnalyser(
    frames,
    144,
    hopSec,
    [
      { hiHz: 250, frameSec: 0.256 },
      { hiHz: 800, frameSec: 0.128 },
      { hiHz: 7000, frameSec: 0.064 },
    ],
    { lowMidi: 28, highMidi: 100, voiceLimit: 8, sensitivityDb: 30, maxFreqHz: 7000 },
  );
  const f = new Float32Array(144);
  const a = new Float32Array(144);
  for (let t = 0; t < frames; t++) {
    const peaks: Array<[number, number]> = [];
    series(220, 0.5, peaks);
    if (t >= 100 && newAmp > 0) series(660, newAmp, peaks);
    // merge coinciding partials (a frame shows one peak per frequency)
    const merged = new Map<number, number>();
    for (const [fr, am] of peaks) merged.set(Math.round(fr), Math.hypot(merged.get(Math.round(fr)) ?? 0, am));
    const list = [...merged.entries()].sort((p, q) => p[0] - q[0]);
    list.forEach(([fr, am], i) => {
      f[i] = fr;
      a[i] = am;
    });
    const odf = 1 + (t === 100 ? 50 : 0) + 0.01 * Math.sin(t);
    an.push(t, f, a, list.length, odf);
  }
  an.finish(frames - 1);
  return an.attacks;
}

describe("attack spectra", () => {
  it("a note starting on a held note's partial shows as the pitch that starts, not the held one", () => {
    const at = run(0.4);
    const onset = at.find((x) => x.frame === 100);
    expect(onset).toBeDefined();
    const pitches = Array.from(onset!.f0Hz, (x) => Math.round(12 * Math.log2(x / 440) + 69));
    expect(pitches[0]).toBe(76); // 660 Hz ≈ E5
    expect(pitches).not.toContain(57); // 220 Hz, held
    expect(onset!.f0Share[0]).toBeGreaterThan(0.75);
  });
  it("nothing starts where nothing is new", () => {
    const at = run(0);
    expect(at.every((x) => x.f0Hz.length === 0 || x.frame !== 100)).toBe(true);
  });
});
