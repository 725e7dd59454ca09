import type { CurvedNoteEvent } from "@/lib/music/note";
import type { ReportChord, ReportNote, TuningSummary, VoiceSummary } from "@/lib/music/tuning-report";

/** `GET /api/v1/takes/{takeId}/tuning-report` (and the `report` of a shared take). */
export type TuningReportDto = {
  referenceHz: number;
  /** Estimated from the take's own notes; null when there are too few. */
  estimatedReferenceHz?: number | null;
  /** Whether the take's own reference was estimated from the audio or set in the analysis settings. */
  takeReferenceSource?: "estimated" | "set";
  referenceOffsetCents: number;
  notes: ReportNote[];
  voices: VoiceSummary[];
  summary: TuningSummary;
  chords: ReportChord[];
};

/** A note with its pitch curve (`GET /api/v1/takes/{takeId}/notes?curves=1`). */
export type CurveNote = CurvedNoteEvent;

export type CurveNotesDto = {
  source: "draft" | "revision";
  revision?: number;
  referenceHz: number;
  notes: CurveNote[];
};

export type { ReportChord, ReportNote, TuningSummary, VoiceSummary };
