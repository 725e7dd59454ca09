/**
 * The intonation scale: how a deviation in cents is written and coloured.
 *
 * Pure (no React), so the piano roll's canvas, the tuning report and the
 * tests share one definition. A cent is 1/100 of an equal-tempered semitone.
 *
 * Colour: a diverging scale. Within ±{@link IN_TUNE_CENTS} the value is plain
 * ink; beyond it the colour moves toward flat blue (below) or sharp orange
 * (above) and reaches the full hue at ±{@link FULL_SCALE_CENTS} (a
 * quarter-tone). The ramp is a square root, so the 10–20 cent deviations a
 * teacher cares about are already clearly tinted. The number is always shown
 * too: colour is never the only signal.
 */

/** Deviations within ± this many cents count as in tune (drawn in ink). */
export const IN_TUNE_CENTS = 5;
/** At ± this many cents (a quarter-tone) the colour reaches its full hue. */
export const FULL_SCALE_CENTS = 50;

export type CentsDirection = "flat" | "in-tune" | "sharp";

export interface CentsPalette {
  ink: string;
  flat: string;
  sharp: string;
}

/** The light-mode hues from NAMES.md (ink #1D2433, flat #3B5BA5, sharp #D9822B). */
export const LIGHT_CENTS_PALETTE: CentsPalette = {
  ink: "#1d2433",
  flat: "#3b5ba5",
  sharp: "#d9822b",
};

/** The same hues as lifted for the dark background #14181F (see globals.css). */
export const DARK_CENTS_PALETTE: CentsPalette = {
  ink: "#e9e4d9",
  flat: "#6f8fd6",
  sharp: "#e08e3c",
};

/** Rounds to 0.1 cent, halves away from zero, so +x and −x always mirror. */
export function roundCents(cents: number): number {
  const rounded = Math.sign(cents) * (Math.round(Math.abs(cents) * 10) / 10);
  return rounded === 0 ? 0 : rounded; // no −0
}

/**
 * Writes a deviation with its sign, to 0.1 cent: "+11.8 ¢", "−3.0 ¢", "0.0 ¢".
 * The minus is the typographic minus sign U+2212. Non-finite input gives "—".
 */
export function formatCents(cents: number): string {
  if (!Number.isFinite(cents)) return "—";
  const r = roundCents(cents);
  const digits = Math.abs(r).toFixed(1);
  if (r > 0) return `+${digits} ¢`;
  if (r < 0) return `\u2212${digits} ¢`;
  return `${digits} ¢`;
}

/** Which side of equal temperament (or the chosen reference) a deviation lies. */
export function centsDirection(cents: number): CentsDirection {
  if (!Number.isFinite(cents)) return "in-tune";
  const r = roundCents(cents);
  if (r < -IN_TUNE_CENTS) return "flat";
  if (r > IN_TUNE_CENTS) return "sharp";
  return "in-tune";
}

/**
 * How far along the scale a deviation is, 0 (ink) … 1 (full hue):
 * t = √clamp((|c| − 5) / (50 − 5), 0, 1), with c rounded to 0.1 cent first.
 */
export function centsIntensity(cents: number): number {
  if (!Number.isFinite(cents)) return 0;
  const magnitude = Math.abs(roundCents(cents));
  const linear = (magnitude - IN_TUNE_CENTS) / (FULL_SCALE_CENTS - IN_TUNE_CENTS);
  return Math.sqrt(Math.min(1, Math.max(0, linear)));
}

/** Spoken form for assistive technology: "11.8 cents sharp", "in tune (+2.0 cents)". */
export function describeCents(cents: number): string {
  if (!Number.isFinite(cents)) return "no tuning measured";
  const r = roundCents(cents);
  const digits = Math.abs(r).toFixed(1);
  const direction = centsDirection(r);
  if (direction === "in-tune") {
    const sign = r > 0 ? "+" : r < 0 ? "\u2212" : "";
    return `in tune (${sign}${digits} cents)`;
  }
  return `${digits} cents ${direction}`;
}

function parseHex(hex: string): [number, number, number] {
  const h = hex.replace("#", "");
  const full = h.length === 3 ? h.replace(/./g, (c) => c + c) : h;
  if (!/^[0-9a-fA-F]{6}$/.test(full)) throw new Error(`not a #rrggbb colour: ${hex}`);
  return [0, 2, 4].map((i) => parseInt(full.slice(i, i + 2), 16)) as [number, number, number];
}

function toHex(channels: readonly number[]): string {
  return `#${channels.map((c) => Math.round(c).toString(16).padStart(2, "0")).join("")}`;
}

/** Linear mix in sRGB: t = 0 gives `from`, t = 1 gives `to`. */
export function mixHex(from: string, to: string, t: number): string {
  const a = parseHex(from);
  const b = parseHex(to);
  return toHex(a.map((c, i) => c + (b[i]! - c) * t));
}

/**
 * The scale colour of a deviation as "#rrggbb": ink within ±5 cents, then an
 * sRGB mix toward flat or sharp by {@link centsIntensity}, reaching the full
 * hue at ±50 cents.
 * Pass {@link DARK_CENTS_PALETTE} when drawing on the dark background.
 */
export function centsColour(cents: number, palette: CentsPalette = LIGHT_CENTS_PALETTE): string {
  const direction = centsDirection(cents);
  if (direction === "in-tune") return mixHex(palette.ink, palette.ink, 0);
  const target = direction === "flat" ? palette.flat : palette.sharp;
  return mixHex(palette.ink, target, centsIntensity(cents));
}

/**
 * The same scale as a CSS colour built from the theme variables, so it
 * follows dark mode. `text` uses the text-safe ends of the scale (≥ 4.5:1
 * on the page); otherwise the fill hues are used (for marks and gauges).
 */
export function centsCssColour(cents: number, use: "text" | "fill" = "text"): string {
  const direction = centsDirection(cents);
  if (direction === "in-tune") return "var(--tn-ink)";
  const variable = use === "text" ? `--tn-${direction}-text` : `--tn-${direction}`;
  const percent = Math.round(centsIntensity(cents) * 1000) / 10;
  return `color-mix(in srgb, var(${variable}) ${percent}%, var(--tn-ink))`;
}
