/** Display helpers for takes: lengths, sizes, sample rates. */

/** 83.4 → "1:23"; an hour or more → "1:02:03". */
export function formatDuration(seconds: number): string {
  if (!Number.isFinite(seconds) || seconds < 0) return "—";
  const total = Math.round(seconds);
  const h = Math.floor(total / 3600);
  const m = Math.floor((total % 3600) / 60);
  const s = total % 60;
  const ss = String(s).padStart(2, "0");
  return h > 0 ? `${h}:${String(m).padStart(2, "0")}:${ss}` : `${m}:${ss}`;
}

/** 1536 → "1.5 KB", 5_400_000 → "5.1 MB" (binary multiples, as file managers show them). */
export function formatBytes(bytes: number): string {
  if (!Number.isFinite(bytes) || bytes < 0) return "—";
  if (bytes < 1024) return `${bytes} B`;
  const units = ["KB", "MB", "GB"];
  let value = bytes / 1024;
  let unit = 0;
  while (value >= 1024 && unit < units.length - 1) {
    value /= 1024;
    unit++;
  }
  return `${value >= 100 ? Math.round(value) : value.toFixed(1)} ${units[unit]}`;
}

/** 44100 → "44.1 kHz". */
export function formatSampleRate(sampleRateHz: number): string {
  if (!Number.isFinite(sampleRateHz) || sampleRateHz <= 0) return "—";
  const khz = sampleRateHz / 1000;
  return `${Number.isInteger(khz) ? khz : khz.toFixed(1)} kHz`;
}

export function formatChannels(channels: number): string {
  return channels === 1 ? "mono" : channels === 2 ? "stereo" : `${channels} channels`;
}

/** Seconds with millisecond resolution, e.g. 1.25 → "1.250". */
export function formatSeconds(seconds: number): string {
  return Number.isFinite(seconds) ? seconds.toFixed(3) : "—";
}

let dateTime: Intl.DateTimeFormat | null = null;
/** Date and time, e.g. "2 Dec 2026, 04:11"; the formatter is made on first use (making one is slow, and the take page needs none before its roll is drawn). */
export const dateTimeFormat = {
  format: (date: Date | number): string => (dateTime ??= new Intl.DateTimeFormat("en-GB", { dateStyle: "medium", timeStyle: "short" })).format(date),
};
