/** A short line describing an analysis's settings, e.g. "Hann · 256/128/64 ms · hop 10 ms · A4 estimated". */
export function summariseSettings(settings: Record<string, unknown>): string {
  const taper = typeof settings.taper === "string" ? settings.taper : "hann";
  const frames = settings.frameLengthsMs as { low?: number; mid?: number; high?: number } | undefined;
  const parts = [taperLabel(taper)];
  if (frames && (frames.low || frames.mid || frames.high)) {
    parts.push(`${frames.low ?? 256}/${frames.mid ?? 128}/${frames.high ?? 64} ms`);
  }
  if (typeof settings.hopMs === "number") parts.push(`hop ${settings.hopMs} ms`);
  const ref = settings.referenceHz;
  parts.push(typeof ref === "number" ? `A4 = ${ref} Hz` : "A4 estimated");
  return parts.join(" · ");
}

const TAPER_LABELS: Record<string, string> = {
  rectangular: "Rectangular",
  triangular: "Triangular",
  sine: "Sine",
  welch: "Welch",
  hann: "Hann",
  hamming: "Hamming",
  blackman: "Blackman",
  "blackman-harris": "Blackman–Harris",
  gaussian: "Gaussian",
  parzen: "Parzen",
  kaiser: "Kaiser",
};

export function taperLabel(name: string): string {
  return TAPER_LABELS[name] ?? name;
}
