import path from "node:path";
import { pathToFileURL } from "node:url";
import type { Worker } from "node:worker_threads";
import { spawnTsWorker } from "@/lib/jobs/ts-worker";
import { EngineError, type EngineErrorCode } from "@/lib/engine/errors";
import { AppError } from "@/lib/errors";
import type { DecodeCheckReply, DecodeCheckRequest } from "./decode-worker";

/** What the upload check learns from a file that decodes. */
export type AudioCheck = { durationSec: number; sourceRateHz: number; channels: number };

// A 30-minute upload decodes in about a second here; far beyond that the thread is stuck.
const CHECK_TIMEOUT_MS = 60_000;

type Pending = { resolve: (check: AudioCheck) => void; reject: (e: unknown) => void; timer: NodeJS.Timeout };

let thread: Worker | undefined;
const pending = new Map<number, Pending>();
let nextId = 1;

/**
 * The thread is started on the first upload and kept. Worker threads do not inherit tsx's module
 * hooks and Next's server bundle has no use for the engine's sources, so the thread loads
 * `decode-worker.ts` through tsx from the project folder (the server runs there).
 */
function decodeThread(): Worker {
  if (thread) return thread;
  const entry = pathToFileURL(path.join(process.cwd(), "lib", "api", "decode-worker.ts")).href;
  const worker = spawnTsWorker(entry);
  worker.unref();
  worker.on("message", (reply: DecodeCheckReply) => {
    const job = pending.get(reply.id);
    if (!job) return;
    pending.delete(reply.id);
    clearTimeout(job.timer);
    if (reply.ok) job.resolve({ durationSec: reply.durationSec, sourceRateHz: reply.sourceRateHz, channels: reply.channels });
    else if (reply.engineCode) job.reject(new EngineError(reply.engineCode as EngineErrorCode, reply.message));
    else job.reject(new Error(reply.message));
  });
  const fail = (e: unknown) => {
    if (thread !== worker) return;
    thread = undefined;
    for (const [id, job] of pending) {
      clearTimeout(job.timer);
      pending.delete(id);
      job.reject(new AppError("internal", "The audio check stopped unexpectedly. Try the upload again."));
    }
    void e;
  };
  worker.on("error", fail);
  worker.on("exit", fail);
  thread = worker;
  return worker;
}

/**
 * Decodes an upload off the event loop (one worker thread, requests queued in order) and answers
 * with its length, rate and channels; bad audio rejects with the engine's EngineError, as
 * `decodeAudio` itself would.
 */
export function checkAudioOffThread(bytes: Uint8Array, maxDurationSec: number): Promise<AudioCheck> {
  return new Promise<AudioCheck>((resolve, reject) => {
    const worker = decodeThread();
    const id = nextId++;
    const timer = setTimeout(() => {
      pending.delete(id);
      reject(new AppError("internal", "Checking the audio took too long. Try the upload again."));
      // a stuck thread is replaced; the others waiting on it are failed by its exit
      if (thread === worker) void worker.terminate();
    }, CHECK_TIMEOUT_MS);
    timer.unref();
    pending.set(id, { resolve, reject, timer });
    const request: DecodeCheckRequest = { id, bytes, maxDurationSec };
    worker.postMessage(request);
  });
}

/** Starts the thread ahead of the first upload (at server start), so no upload waits for it. */
export function warmDecodeThread(): void {
  decodeThread();
}

/** Stops the thread (tests and shutdown); the next check starts a new one. */
export async function stopDecodeThread(): Promise<void> {
  const worker = thread;
  thread = undefined;
  if (worker) await worker.terminate();
}
