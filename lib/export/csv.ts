import { estimateKeyFifths, noteNameAscii, spellPitch } from "./spelling";
import type { ExportNote } from "./types";

export interface CsvOptions {
  /** Decimals of onsetSec and offsetSec. Default 3 (milliseconds). */
  secDecimals?: number;
  /** Decimals of cents. Default 1. */
  centsDecimals?: number;
  /** Key used to spell noteName, −6 … 6 on the circle of fifths. Default: estimated (spelling.ts). */
  keyFifths?: number;
}

export const CSV_COLUMNS = ["onsetSec", "offsetSec", "pitch", "noteName", "cents", "velocity", "voice"] as const;

/**
 * One CSV field by RFC 4180 §2: a field holding a comma, a double quote, CR or LF is enclosed in
 * double quotes and each double quote inside it doubled; any other field is written as it is.
 */
export function csvField(value: string | number): string {
  const s = String(value);
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

/** One CSV record (RFC 4180): fields joined by commas, ended by CRLF. */
export function csvRecord(fields: readonly (string | number)[]): string {
  return fields.map(csvField).join(",") + "\r\n";
}

/** Fixed decimals without a negative zero ("-0.0" → "0.0"). */
export function fixed(value: number, decimals: number): string {
  const s = value.toFixed(decimals);
  return /^-0\.?0*$/.test(s) ? s.slice(1) : s;
}

/**
 * CSV of a note list (RFC 4180: CRLF line ends, a header record, quoting where a field needs it).
 * Columns: onsetSec, offsetSec, pitch, noteName, cents, velocity, voice — the API's note fields,
 * plus noteName (ASCII scientific name, "C#4", spelled by the take's key, spelling.ts).
 * Rows are ordered by onset, then pitch, then voice. Encoding UTF-8 (all of it is ASCII).
 */
export function notesToCsv(notes: readonly ExportNote[], opts: CsvOptions = {}): string {
  const secDecimals = opts.secDecimals ?? 3;
  const centsDecimals = opts.centsDecimals ?? 1;
  const fifths = opts.keyFifths ?? estimateKeyFifths(notes.map((n) => n.pitch));
  const rows = [...notes].sort((a, b) => a.onsetSec - b.onsetSec || a.pitch - b.pitch || a.voice - b.voice);
  let out = csvRecord(CSV_COLUMNS);
  for (const n of rows) {
    out += csvRecord([
      fixed(n.onsetSec, secDecimals),
      fixed(n.offsetSec, secDecimals),
      Math.round(n.pitch),
      noteNameAscii(spellPitch(n.pitch, fifths)),
      fixed(n.cents, centsDecimals),
      Math.round(n.velocity),
      Math.round(n.voice),
    ]);
  }
  return out;
}
