/**
 * The upload check's worker thread: decodes an uploaded WAV/FLAC file with the engine's decoder
 * (every sample read, so truncated files and NaN/Inf samples are caught) and answers with the
 * take's length, rate and channels, or with the engine's error code. It runs off the web
 * server's event loop, so note reads and progress polls are not held up while uploads arrive.
 * Nothing here touches the database or the files on disk.
 */
import { parentPort } from "node:worker_threads";
import { ANALYSIS_RATE_HZ, decodeAudio, EngineError } from "../engine/index";

export type DecodeCheckRequest = { id: number; bytes: Uint8Array; maxDurationSec: number };

export type DecodeCheckReply =
  | { id: number; ok: true; durationSec: number; sourceRateHz: number; channels: number }
  | { id: number; ok: false; engineCode?: string; message: string };

async function check(request: DecodeCheckRequest): Promise<DecodeCheckReply> {
  try {
    // decoded to the analysis rate block by block, so a long upload never exists at full rate
    const decoded = await decodeAudio(request.bytes, { maxDurationSec: request.maxDurationSec, resampleToHz: ANALYSIS_RATE_HZ });
    return { id: request.id, ok: true, durationSec: decoded.durationSec, sourceRateHz: decoded.sourceRateHz, channels: decoded.channels };
  } catch (e) {
    if (e instanceof EngineError) return { id: request.id, ok: false, engineCode: e.code, message: e.message };
    return { id: request.id, ok: false, message: e instanceof Error ? e.message : String(e) };
  }
}

parentPort?.on("message", (request: DecodeCheckRequest) => {
  void check(request).then((reply) => parentPort!.postMessage(reply));
});
