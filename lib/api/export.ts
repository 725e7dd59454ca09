import "server-only";
import { notesToCsv, notesToMusicXml, notesToSmf, type ExportNote, type TimeSignature } from "@/lib/export";
import type { ExportQuery } from "@/lib/schemas/export";

export type ExportFile = { bytes: Uint8Array; contentType: string; extension: string };

/** Writes one export (pure, quick): the caller runs it inside the credit transaction. */
export function writeExport(notes: ExportNote[], title: string, q: ExportQuery): ExportFile {
  const timeSignature = q.timeSignature ? (q.timeSignature.split("/").map(Number) as unknown as TimeSignature) : undefined;
  switch (q.format) {
    case "midi":
      return {
        bytes: notesToSmf(notes, { tempoBpm: q.tempo, timeSignature, pitchBend: q.pitchBend, quantize: q.quantize ?? null, title }),
        contentType: "audio/midi",
        extension: "mid",
      };
    case "musicxml":
      return {
        bytes: new TextEncoder().encode(notesToMusicXml(notes, { title, tempoBpm: q.tempo, timeSignature, quantize: q.quantize })),
        contentType: "application/vnd.recordare.musicxml+xml",
        extension: "musicxml",
      };
    case "csv":
      return { bytes: new TextEncoder().encode(notesToCsv(notes)), contentType: "text/csv; charset=utf-8", extension: "csv" };
  }
}

/** A download file name from the take's name: letters, digits, dashes only. */
export function downloadName(takeName: string, revision: number | undefined, extension: string): string {
  const base = takeName.normalize("NFKD").replace(/[\u0300-\u036f]/g, "").replace(/[^\w-]+/g, "-").replace(/^-+|-+$/g, "").slice(0, 60) || "take";
  return `${base}${revision ? `-rev${revision}` : ""}.${extension}`;
}
