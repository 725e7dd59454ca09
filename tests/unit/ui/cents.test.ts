import { describe, expect, it } from "vitest";
import {
  centsColour,
  centsCssColour,
  centsDirection,
  centsIntensity,
  describeCents,
  formatCents,
  mixHex,
  roundCents,
} from "@/components/ui/cents-scale";

const INK = "#1d2433";
const FLAT = "#3b5ba5";
const SHARP = "#d9822b";

function rgb(hex: string): [number, number, number] {
  return [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16)) as [number, number, number];
}
function distance(a: string, b: string): number {
  const x = rgb(a);
  const y = rgb(b);
  return Math.hypot(x[0] - y[0], x[1] - y[1], x[2] - y[2]);
}

describe("formatCents", () => {
  it("writes the sign, one decimal and the cent sign", () => {
    expect(formatCents(11.8)).toBe("+11.8 ¢");
    expect(formatCents(-3)).toBe("\u22123.0 ¢");
    expect(formatCents(0)).toBe("0.0 ¢");
    expect(formatCents(50)).toBe("+50.0 ¢");
  });

  it("rounds to 0.1 cent, halves away from zero, symmetric in sign", () => {
    expect(formatCents(11.76)).toBe("+11.8 ¢");
    expect(formatCents(11.74)).toBe("+11.7 ¢");
    expect(formatCents(2.25)).toBe("+2.3 ¢");
    expect(formatCents(-2.25)).toBe("\u22122.3 ¢");
    expect(formatCents(0.15)).toBe("+0.2 ¢");
    expect(roundCents(-7.349)).toBe(-7.3);
  });

  it("never shows a signed zero", () => {
    expect(formatCents(-0.04)).toBe("0.0 ¢");
    expect(formatCents(0.04)).toBe("0.0 ¢");
    expect(formatCents(-0)).toBe("0.0 ¢");
    expect(Object.is(roundCents(-0.04), 0)).toBe(true);
  });

  it("shows a dash for values that are not numbers", () => {
    expect(formatCents(Number.NaN)).toBe("—");
    expect(formatCents(Number.POSITIVE_INFINITY)).toBe("—");
  });
});

describe("centsColour", () => {
  it("is plain ink within ±5 cents", () => {
    for (const c of [-5, -4.99, -2, 0, 3.3, 5, 5.04]) {
      expect(centsColour(c)).toBe(INK);
      expect(centsDirection(c)).toBe("in-tune");
      expect(centsIntensity(c)).toBe(0);
    }
  });

  it("leans toward flat blue at −30 cents", () => {
    const c = centsColour(-30);
    expect(centsDirection(-30)).toBe("flat");
    // t = √((30 − 5) / 45) = √(5/9) = 0.7454; ink (29,36,51) → flat (59,91,165), per channel by hand:
    // 29 + 30·0.7454 = 51.4, 36 + 55·0.7454 = 77.0, 51 + 114·0.7454 = 136.0
    expect(c).toBe("#334d88");
    expect(distance(c, FLAT)).toBeLessThan(distance(INK, FLAT));
    expect(distance(c, SHARP)).toBeGreaterThan(distance(c, FLAT));
    const [r, , b] = rgb(c);
    expect(b).toBeGreaterThan(r); // blue dominates
  });

  it("leans toward sharp orange at +30 cents", () => {
    const c = centsColour(30);
    expect(centsDirection(30)).toBe("sharp");
    // ink (29,36,51) → sharp (217,130,43): 29 + 188·0.7454 = 169.1, 36 + 94·0.7454 = 106.1, 51 − 8·0.7454 = 45.0
    expect(c).toBe("#a96a2d");
    expect(distance(c, SHARP)).toBeLessThan(distance(INK, SHARP));
    expect(distance(c, FLAT)).toBeGreaterThan(distance(c, SHARP));
    const [r, , b] = rgb(c);
    expect(r).toBeGreaterThan(b); // red-orange dominates
  });

  it("is already clearly tinted at 10 cents: t = √(5/45) = 1/3", () => {
    expect(centsIntensity(10)).toBeCloseTo(1 / 3, 12);
    expect(centsIntensity(-10)).toBeCloseTo(1 / 3, 12);
  });

  it("reaches the full hue at ±50 cents and stays there", () => {
    expect(centsColour(-50)).toBe(FLAT);
    expect(centsColour(50)).toBe(SHARP);
    expect(centsColour(-120)).toBe(FLAT);
    expect(centsColour(99)).toBe(SHARP);
    expect(centsIntensity(50)).toBe(1);
  });

  it("grows monotonically with the size of the deviation", () => {
    let previous = 0;
    for (let c = 5; c <= 50; c += 2.5) {
      const d = distance(centsColour(c), INK);
      expect(d).toBeGreaterThanOrEqual(previous);
      previous = d;
      expect(centsIntensity(-c)).toBeCloseTo(centsIntensity(c), 12);
    }
  });

  it("mixes in sRGB at the end points exactly", () => {
    expect(mixHex(INK, FLAT, 0)).toBe(INK);
    expect(mixHex(INK, FLAT, 1)).toBe(FLAT);
    expect(mixHex("#000000", "#ffffff", 0.5)).toBe("#808080");
  });
});

describe("CSS colour and spoken form", () => {
  it("uses theme variables so dark mode follows", () => {
    expect(centsCssColour(2)).toBe("var(--tn-ink)");
    expect(centsCssColour(-50)).toBe("color-mix(in srgb, var(--tn-flat-text) 100%, var(--tn-ink))");
    // 27.5 cents: t = √(22.5 / 45) = √0.5 = 0.7071
    expect(centsCssColour(27.5, "fill")).toBe("color-mix(in srgb, var(--tn-sharp) 70.7%, var(--tn-ink))");
  });

  it("describes the deviation in words", () => {
    expect(describeCents(11.8)).toBe("11.8 cents sharp");
    expect(describeCents(-30)).toBe("30.0 cents flat");
    expect(describeCents(2)).toBe("in tune (+2.0 cents)");
    expect(describeCents(0)).toBe("in tune (0.0 cents)");
  });
});
