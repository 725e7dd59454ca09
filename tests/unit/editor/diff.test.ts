import { describe, expect, it } from "vitest";
import { diffNotes, lowerBound, sameNotes, upperBound } from "@/lib/editor";
import { note, rng } from "./helpers";

const strip = <T extends { id: string }>(ns: T[]) => ns.map(({ id: _id, ...n }) => n);

describe("diff between note lists", () => {
  const a = strip([note("n1", 0, 1, 60), note("n2", 1, 2, 64), note("n3", 2, 3, 67), note("n4", 3, 4, 72)]);

  it("finds nothing between a list and its reordering", () => {
    const d = diffNotes(a, [...a].reverse());
    expect(d).toEqual({ added: [], removed: [], changed: [], unchanged: 4 });
    expect(sameNotes(a, [...a].reverse())).toBe(true);
  });

  it("tells added, removed and changed notes apart", () => {
    const b = [
      a[0]!, // unchanged
      { ...a[1]!, pitch: 65 }, // transposed a semitone: changed
      { ...a[2]!, offsetSec: 2.5 }, // shortened: changed
      // a[3] removed
      { onsetSec: 5, offsetSec: 6, pitch: 48, cents: 0, velocity: 80, voice: 1 }, // added
    ];
    const d = diffNotes(a, b);
    expect(d.unchanged).toBe(1);
    expect(d.changed).toEqual([{ a: 1, b: 1 }, { a: 2, b: 2 }]);
    expect(d.removed).toEqual([3]);
    expect(d.added).toEqual([3]);
    expect(sameNotes(a, b)).toBe(false);
  });

  it("a note moved a little in time is the same note changed; one far away is removed and added", () => {
    const near = diffNotes(a, [a[0]!, a[1]!, a[2]!, { ...a[3]!, onsetSec: 3.1, offsetSec: 4.1 }]);
    expect(near.changed).toEqual([{ a: 3, b: 3 }]);
    const far = diffNotes(a, [a[0]!, a[1]!, a[2]!, { ...a[3]!, onsetSec: 30, offsetSec: 31 }]);
    expect(far.removed).toEqual([3]);
    expect(far.added).toEqual([3]);
  });

  it("changes in velocity or cents count, in another voice do not pair", () => {
    expect(diffNotes(a, [{ ...a[0]!, cents: 12 }, ...a.slice(1)]).changed).toEqual([{ a: 0, b: 0 }]);
    const revoiced = diffNotes(a, [{ ...a[0]!, voice: 2 }, ...a.slice(1)]);
    expect(revoiced.removed).toEqual([0]);
    expect(revoiced.added).toEqual([0]);
  });

  it("counts add up on random lists (every note of a and b accounted for once)", () => {
    const rand = rng(11);
    for (let trial = 0; trial < 50; trial++) {
      const mk = (n: number) =>
        Array.from({ length: n }, () => {
          const on = Math.round(rand() * 200) / 10;
          return { onsetSec: on, offsetSec: on + 0.1 + Math.round(rand() * 10) / 10, pitch: 55 + Math.floor(rand() * 12), cents: 0, velocity: 80, voice: 1 + Math.floor(rand() * 2) };
        });
      const x = mk(40);
      const y = [...x.slice(0, 25), ...mk(20)];
      const d = diffNotes(x, y);
      expect(d.unchanged + d.changed.length + d.removed.length).toBe(x.length);
      expect(d.unchanged + d.changed.length + d.added.length).toBe(y.length);
      expect(new Set(d.changed.map((c) => c.a)).size).toBe(d.changed.length);
    }
  });
});

describe("binary searches", () => {
  const xs = [0, 1, 1, 1, 2, 5];
  it("lowerBound and upperBound agree with a linear scan", () => {
    for (const x of [-1, 0, 0.5, 1, 1.5, 2, 3, 5, 6]) {
      expect(lowerBound(xs, x)).toBe(xs.findIndex((v) => v >= x) === -1 ? xs.length : xs.findIndex((v) => v >= x));
      expect(upperBound(xs, x)).toBe(xs.findIndex((v) => v > x) === -1 ? xs.length : xs.findIndex((v) => v > x));
    }
  });
});
