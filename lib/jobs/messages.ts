import type { EngineErrorCode } from "@/lib/engine";

/** How an analysis attempt ended inside its worker thread, as posted to the runner. */
export type WorkerFailure =
  | { kind: "engine"; code: EngineErrorCode; message: string }
  | { kind: "missing"; message: string }
  | { kind: "other"; message: string };

const ENGINE_SENTENCES: Record<EngineErrorCode, string> = {
  not_audio: "The file is not a WAV or FLAC recording. Upload the take again as WAV or FLAC.",
  unsupported_format:
    "This kind of WAV or FLAC file cannot be read. Export the recording as 16- or 24-bit PCM WAV and upload it again.",
  truncated: "The file is cut short: part of its header or audio is missing. Upload the complete file again.",
  empty: "The file holds no audio samples.",
  bad_samples:
    "The file holds invalid samples (not-a-number or infinite values). Export it again from the recording software.",
  too_long: "The take is longer than the length limit. Split it into shorter takes and upload them.",
  bad_settings: "The analysis settings are not valid. Analyse the take again with other settings.",
  bad_argument: "The analysis stopped with an internal error. Analyse the take again; if it keeps failing, tell us the analysis id.",
};

/** A sentence a person can act on, for the `error` of a failed analysis. Never a stack trace. */
export function failureMessage(failure: WorkerFailure, limits: { maxDurationSec?: number } = {}): string {
  if (failure.kind === "engine" && failure.code === "too_long" && limits.maxDurationSec) {
    const minutes = Math.round(limits.maxDurationSec / 60);
    return `The take is longer than the ${minutes}-minute limit. Split it into shorter takes and upload them.`;
  }
  if (failure.kind === "engine") {
    const sentence = ENGINE_SENTENCES[failure.code] ?? ENGINE_SENTENCES.bad_argument;
    // the engine's own line names the offending setting, which helps the person fix it
    return failure.code === "bad_settings" ? `${sentence} (${failure.message})` : sentence;
  }
  if (failure.kind === "missing") return "The take's audio file is missing from storage. Upload the take again.";
  return ENGINE_SENTENCES.bad_argument;
}

export function crashMessage(attempts: number): string {
  return (
    `The analysis stopped unexpectedly ${attempts} ${attempts === 1 ? "time" : "times"} ` +
    "(its worker ran out of memory or crashed). Try a shorter take, or analyse again with a larger hop."
  );
}

export function timeoutMessage(timeoutMs: number): string {
  const plural = (n: number, unit: string) => `${n} ${unit}${n === 1 ? "" : "s"}`;
  const limit =
    timeoutMs >= 120_000 ? plural(Math.round(timeoutMs / 60_000), "minute") : plural(Math.max(1, Math.round(timeoutMs / 1000)), "second");
  return `The analysis took longer than ${limit} and was stopped. Try a shorter take, or analyse again with a larger hop.`;
}
