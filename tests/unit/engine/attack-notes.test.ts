import { describe, it, expect } from "vitest";
import { transcribe } from "@/lib/engine/index";

// A held low note (A3, 220 Hz, ten partials) and a louder line of short notes on its partials,
// 12 cents sharp (A5 = its 4th partial, C#6 = its 5th, E6 = its 6th, C#6), each 150 ms with a
// 10 ms attack: the attack spectra show them start where the frame search hands their energy
// to the held note.
function take(rate = 16000) {
  const x = new Float32Array(Math.round(3.2 * rate));
  const tone = (f0: number, parts: number, amp: number, on: number, dur: number, att: number, rel: number) => {
    const a = Math.round(on * rate);
    const b = Math.min(x.length, Math.round((on + dur + rel) * rate));
    for (let i = a; i < b; i++) {
      const t = (i - a) / rate;
      const env = t < att ? t / att : t < dur ? 1 : Math.max(0, 1 - (t - dur) / rel);
      let v = 0;
      for (let h = 1; h <= parts; h++) if (h * f0 < rate / 2) v += Math.sin(2 * Math.PI * h * f0 * t) / h;
      x[i] += amp * env * v;
    }
  };
  tone(220, 10, 0.2, 0.1, 3.0, 0.03, 0.05);
  const line: Array<[number, number]> = [[1.0, 880], [1.4, 1108.73], [1.8, 1318.51], [2.2, 1108.73]];
  for (const [on, f] of line) tone(f * Math.pow(2, 12 / 1200), 5, 0.3, on, 0.15, 0.01, 0.02);
  return { x, rate, line };
}

describe("notes seen in attack spectra", () => {
  it("a line of short notes on a held note's partials comes out as notes, onsets within 50 ms", async () => {
    const { x, rate, line } = take();
    const out = await transcribe(x, rate, {});
    const held = out.notes.filter((n) => n.pitch === 57);
    expect(held.length).toBeGreaterThanOrEqual(1);
    for (const [on, f] of line) {
      const pitch = Math.round(69 + 12 * Math.log2(f / 440));
      const hit = out.notes.find((n) => n.pitch === pitch && Math.abs(n.onsetSec - on) <= 0.05);
      expect(hit, `note ${pitch} at ${on} s`).toBeDefined();
    }
  }, 20_000);
});
