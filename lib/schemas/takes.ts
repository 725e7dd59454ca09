/** Shapes of takes and analyses as the API returns them (shared by the server and the browser). */
export type AnalysisStateName = "queued" | "analysing" | "ready" | "failed";

export type AnalysisDto = {
  id: string;
  takeId: string;
  state: AnalysisStateName;
  /** 0 … 100 */
  progress: number;
  error?: string;
  settings: Record<string, unknown>;
  createdAt: string;
  startedAt?: string;
  finishedAt?: string;
};

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
