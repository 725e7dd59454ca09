/**
 * Helpers for the analysis-job tests: rendered tone takes (wavefile), a studio + project + take
 * inserted directly, and waiting on an analysis row.
 */
import { mkdtempSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { eq } from "drizzle-orm";
import type { Db } from "@/db/client";
import { newId } from "@/db/ids";
import { analysis, draft, project, studio, take } from "@/db/schema";
import { claimNext, completeAnalysis } from "@/db/analyses";
import { decodeAudio, transcribe } from "@/lib/engine";
import { readStored, storeFile } from "@/lib/storage/files";
import { toneWav as harmonicToneWav } from "./audio";

/** A fresh DATA_DIR for one test file (pass it to startTestApp). */
export function tempDataDir(): string {
  return mkdtempSync(path.join(os.tmpdir(), "tapernote-uploads-"));
}

/** A 16-bit mono WAV at 16 kHz of tones (with harmonics) sounding together from `startSec` (0.25 s) to the end. */
export function toneWav(durationSec: number, freqsHz: number[], options: { sampleRateHz?: number; startSec?: number } = {}): Uint8Array {
  return harmonicToneWav({ durationSec, freqsHz, sampleRateHz: options.sampleRateHz ?? 16000, startSec: options.startSec ?? 0.25 });
}

export type SeededTake = { studioId: string; projectId: string; takeId: string };

/** Inserts a studio (or reuses one), a project and a take whose analysis file holds `bytes`. */
export async function seedTake(database: Db, bytes: Uint8Array, options: { studioId?: string; durationSec?: number } = {}): Promise<SeededTake> {
  const studioId = options.studioId ?? newId();
  if (!options.studioId) await database.insert(studio).values({ id: studioId, name: `Studio ${studioId.slice(0, 8)}` });
  const projectId = newId();
  await database.insert(project).values({ id: projectId, studioId, name: `Project ${projectId.slice(0, 8)}` });
  const takeId = newId();
  const stored = await storeFile(takeId, "analysis", "wav", bytes);
  await database.insert(take).values({
    id: takeId,
    studioId,
    projectId,
    name: "Tone take",
    originalKey: stored.key,
    originalMime: "audio/wav",
    originalBytes: bytes.length,
    originalSha256: stored.sha256,
    analysisKey: stored.key,
    durationSec: options.durationSec ?? 0,
    sampleRateHz: 16000,
    channels: 1,
  });
  return { studioId, projectId, takeId };
}

export async function analysisRow(database: Db, id: string) {
  const [row] = await database.select().from(analysis).where(eq(analysis.id, id));
  return row;
}

export async function draftRow(database: Db, analysisId: string) {
  const [row] = await database.select().from(draft).where(eq(draft.analysisId, analysisId));
  return row;
}

/** Polls the analysis row until `done(row)` holds; returns it. Also collects every progress seen. */
export async function waitForAnalysis(
  database: Db,
  id: string,
  done: (row: NonNullable<Awaited<ReturnType<typeof analysisRow>>>) => boolean,
  timeoutMs = 30_000,
  seenProgress: number[] = [],
) {
  const start = Date.now();
  for (;;) {
    const row = await analysisRow(database, id);
    if (row) {
      if (seenProgress.at(-1) !== row.progressPercent) seenProgress.push(row.progressPercent);
      if (done(row)) return row;
    }
    if (Date.now() - start > timeoutMs) throw new Error(`analysis ${id} did not get there: ${JSON.stringify(row)}`);
    await new Promise((r) => setTimeout(r, 40));
  }
}

/**
 * Runs the queued analyses with the real engine, in this process, as a worker would (the pool
 * itself is tested in jobs.test.ts).
 */
export async function runQueuedJobs(workerId = "test-worker"): Promise<void> {
  for (;;) {
    const job = await claimNext(workerId, 60_000);
    if (!job) return;
    const audio = await decodeAudio(await readStored(job.analysisKey));
    await completeAnalysis(job.id, workerId, await transcribe(audio.samples, audio.sampleRateHz, job.settings));
  }
}
