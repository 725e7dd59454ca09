/** Display helpers for the tuning report. */

/** A share 0 … 1 as "83 %"; null gives "—". */
export function formatShare(share: number | null | undefined): string {
  return typeof share === "number" && Number.isFinite(share) ? `${Math.round(share * 100)} %` : "—";
}

/** An unsigned amount of cents: "8.3 ¢". */
export function formatAbsCents(cents: number | null | undefined): string {
  return typeof cents === "number" && Number.isFinite(cents) ? `${Math.abs(cents).toFixed(1)} ¢` : "—";
}

/** A signed drift: "−3.2 ¢/min". */
export function formatDrift(centsPerMin: number | null | undefined): string {
  if (typeof centsPerMin !== "number" || !Number.isFinite(centsPerMin)) return "—";
  const r = Math.round(centsPerMin * 10) / 10;
  return `${r > 0 ? "+" : r < 0 ? "\u2212" : ""}${Math.abs(r).toFixed(1)} ¢/min`;
}

/** What a drift means for the people playing: the reference sagging or rising. */
export function describeDrift(centsPerMin: number | null | undefined): string {
  if (typeof centsPerMin !== "number" || !Number.isFinite(centsPerMin)) return "not enough notes to tell";
  if (Math.abs(centsPerMin) < 1) return "steady over the take";
  return centsPerMin < 0 ? "the pitch sagging over the take" : "the pitch rising over the take";
}

/** Sharp or flat on the whole, in words. */
export function describeTendency(cents: number | null | undefined): string {
  if (typeof cents !== "number" || !Number.isFinite(cents)) return "—";
  if (Math.abs(cents) <= 2) return "centred";
  return cents < 0 ? "on the flat side" : "on the sharp side";
}

/** Seconds as "1:02.35" (minutes, seconds to 0.01 s), for times along a take. */
export function formatClock(seconds: number): string {
  if (!Number.isFinite(seconds) || seconds < 0) return "—";
  const m = Math.floor(seconds / 60);
  const s = seconds - m * 60;
  return `${m}:${s.toFixed(2).padStart(5, "0")}`;
}

export function formatHz(hz: number | null | undefined): string {
  return typeof hz === "number" && Number.isFinite(hz) ? `${hz.toFixed(1)} Hz` : "—";
}

/** A vibrato as "5.6 Hz, ±23.0 ¢"; the rate may be missing when the curve is too short to time it. */
export function formatVibrato(v: { rateHz: number | null; extentCents: number | null } | null | undefined): string {
  if (!v) return "—";
  const rate = typeof v.rateHz === "number" && Number.isFinite(v.rateHz) ? `${v.rateHz.toFixed(1)} Hz` : "rate not measured";
  const extent = typeof v.extentCents === "number" && Number.isFinite(v.extentCents) ? `±${v.extentCents.toFixed(1)} ¢` : "extent not measured";
  return `${rate}, ${extent}`;
}
