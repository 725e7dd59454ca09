import type { NoteEvent } from "@/lib/music/note";
import type { AnalysisDto } from "@/lib/schemas/takes";
export type { AnalysisDto, TakeDto } from "@/lib/schemas/takes";

/** One note of a take (`GET /api/v1/takes/{takeId}/notes`): the shared note event. */
export type TakeNote = NoteEvent;

export type TakeNotesDto = {
  source: "draft" | "revision";
  revision?: number;
  referenceHz: number;
  notes: TakeNote[];
};

/** Upload limits from `GET /api/v1/limits`. */
export type LimitsDto = { maxBytes: number; maxDurationSec: number; acceptedTypes: string[] };

export function isRunning(analysis: Pick<AnalysisDto, "state"> | null | undefined): boolean {
  return analysis?.state === "queued" || analysis?.state === "analysing";
}
