import { parse } from "csv-parse/sync";
import { describe, expect, it } from "vitest";
import { csvField, csvRecord, notesToCsv, CSV_COLUMNS, type ExportNote } from "@/lib/export";

// Outside check: the CSV is read back by csv-parse 7.0.3 (npm), an RFC 4180 parser; the quoting
// rules are RFC 4180 §2 (fields with commas, double quotes or line breaks in double quotes, inner
// double quotes doubled, records ended by CRLF).

const NOTES: ExportNote[] = [
  { onsetSec: 1.23456, offsetSec: 1.9, pitch: 61, cents: -12.34, velocity: 88, voice: 2 },
  { onsetSec: 0, offsetSec: 0.5004, pitch: 60, cents: 0.04, velocity: 100, voice: 1 },
  { onsetSec: 0, offsetSec: 0.5, pitch: 64, cents: -0.04, velocity: 1, voice: 1 },
  { onsetSec: 12.3456789, offsetSec: 13, pitch: 127, cents: 49.96, velocity: 127, voice: 0 },
];

describe("CSV of the note list", () => {
  const csv = notesToCsv(NOTES, { keyFifths: 0 });

  it("starts with the header record and ends every record with CRLF", () => {
    expect(csv.split("\r\n")[0]).toBe("onsetSec,offsetSec,pitch,noteName,cents,velocity,voice");
    expect(csv.endsWith("\r\n")).toBe(true);
    expect(csv.replace(/\r\n/g, "")).not.toMatch(/[\r\n]/);
    expect(csv.split("\r\n")).toHaveLength(NOTES.length + 2);
  });

  it("parses back (csv-parse) to the same values at the written decimals", () => {
    const rows: Record<string, string>[] = parse(csv, { columns: true, record_delimiter: "\r\n" });
    expect(Object.keys(rows[0])).toEqual([...CSV_COLUMNS]);
    const sorted = [...NOTES].sort((a, b) => a.onsetSec - b.onsetSec || a.pitch - b.pitch);
    expect(rows).toHaveLength(sorted.length);
    rows.forEach((r, k) => {
      const n = sorted[k];
      expect(Number(r.onsetSec)).toBeCloseTo(n.onsetSec, 3);
      expect(Number(r.offsetSec)).toBeCloseTo(n.offsetSec, 3);
      expect(Number(r.pitch)).toBe(n.pitch);
      expect(Number(r.cents)).toBeCloseTo(n.cents, 1);
      expect(Number(r.velocity)).toBe(n.velocity);
      expect(Number(r.voice)).toBe(n.voice);
      expect(r.onsetSec).toMatch(/^\d+\.\d{3}$/);
      expect(r.cents).toMatch(/^-?\d+\.\d$/);
    });
    expect(rows.map((r) => r.noteName)).toEqual(["C4", "E4", "C#4", "G9"]);
    expect(rows.map((r) => r.cents)).toEqual(["0.0", "0.0", "-12.3", "50.0"]); // no "-0.0"
  });

  it("quotes by RFC 4180 and csv-parse reads the quoted fields back", () => {
    expect(csvField("plain")).toBe("plain");
    expect(csvField("a,b")).toBe('"a,b"');
    expect(csvField('say "A4"')).toBe('"say ""A4"""');
    expect(csvField("two\r\nlines")).toBe('"two\r\nlines"');
    expect(csvField(-1.5)).toBe("-1.5");
    const odd = ["a,b", 'say "A4"', "two\r\nlines", "", "x"];
    const text = csvRecord(["h1", "h2", "h3", "h4", "h5"]) + csvRecord(odd);
    expect(parse(text, { record_delimiter: "\r\n" })).toEqual([["h1", "h2", "h3", "h4", "h5"], odd]);
  });

  it("takes the decimals as options and spells by the key", () => {
    const flats = notesToCsv([{ onsetSec: 0.5, offsetSec: 1, pitch: 70, cents: 3.14159, velocity: 90, voice: 1 }], { secDecimals: 1, centsDecimals: 2, keyFifths: -1 });
    expect(flats.split("\r\n")[1]).toBe("0.5,1.0,70,Bb4,3.14,90,1");
  });

  it("writes only the header for no notes", () => {
    expect(notesToCsv([])).toBe("onsetSec,offsetSec,pitch,noteName,cents,velocity,voice\r\n");
  });
});
