/**
 * The worker thread of the analysis runner: reads a take's analysis file, decodes it and runs
 * the engine, posting progress (0 … 1) as it goes. One job at a time; the runner terminates the
 * thread to cancel. Nothing here touches the database.
 */
import { parentPort } from "node:worker_threads";
import { ANALYSIS_RATE_HZ, decodeAudio, transcribe, EngineError, type SettingsInput } from "../engine/index";
import { readStored } from "../storage/files";
import type { WorkerFailure } from "./messages";

export type RunRequest = { type: "run"; analysisId: string; analysisKey: string; settings: object; maxDurationSec: number };

export type WorkerReply =
  | { type: "progress"; analysisId: string; fraction: number }
  | { type: "done"; analysisId: string; referenceHz: number; notes: unknown[] }
  | { type: "failed"; analysisId: string; failure: WorkerFailure };

// Share of the progress bar for reading and decoding; the engine reports the rest.
const DECODED = 0.05;

function describe(e: unknown): WorkerFailure {
  if (e instanceof EngineError) return { kind: "engine", code: e.code, message: e.message };
  if ((e as NodeJS.ErrnoException)?.code === "ENOENT") return { kind: "missing", message: String((e as Error).message) };
  return { kind: "other", message: e instanceof Error ? e.message : String(e) };
}

async function run(request: RunRequest): Promise<WorkerReply> {
  const { analysisId } = request;
  const post = (reply: WorkerReply) => parentPort!.postMessage(reply);
  try {
    const bytes = await readStored(request.analysisKey);
    // decoded straight to the analysis rate, block by block: a long take never exists at full rate
    const audio = await decodeAudio(bytes, { maxDurationSec: request.maxDurationSec, resampleToHz: ANALYSIS_RATE_HZ });
    post({ type: "progress", analysisId, fraction: DECODED });
    const result = await transcribe(audio.samples, audio.sampleRateHz, request.settings as SettingsInput, (f) =>
      post({ type: "progress", analysisId, fraction: DECODED + (1 - DECODED) * 0.99 * f }),
    );
    return { type: "done", analysisId, referenceHz: result.referenceHz, notes: result.notes };
  } catch (e) {
    return { type: "failed", analysisId, failure: describe(e) };
  }
}

parentPort?.on("message", (request: RunRequest) => {
  if (request?.type !== "run") return;
  void run(request).then((reply) => parentPort!.postMessage(reply));
});
