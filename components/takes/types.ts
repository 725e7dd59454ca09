import type { AnalysisState } from "@/components/ui";

/** An analysis as the API returns it (`GET /api/v1/takes/{takeId}/analyses`). */
export type AnalysisDto = {
  id: string;
  takeId: string;
  state: AnalysisState;
  /** 0 … 100 */
  progress: number;
  error?: string | null;
  settings: Record<string, unknown>;
  createdAt: string;
  startedAt?: string | null;
  finishedAt?: string | null;
};

/** A take as the API returns it (`GET /api/v1/projects/{projectId}/takes`). */
export type TakeDto = {
  id: string;
  projectId: string;
  name: string;
  durationSec: number;
  sampleRateHz: number;
  channels: number;
  originalMime: string;
  originalBytes: number;
  createdAt: string;
  analysis: AnalysisDto | null;
  noteCount: number | null;
};

/** One note of a take (`GET /api/v1/takes/{takeId}/notes`). */
export type TakeNote = {
  onsetSec: number;
  offsetSec: number;
  pitch: number;
  cents: number;
  velocity: number;
  voice: number;
};

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
