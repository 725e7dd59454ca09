import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { rmSync } from "node:fs";
import { openDb } from "@/db/client";
import {
  claimNext,
  enqueueAnalysis,
  getAnalysis,
  latestAnalysis,
  listAnalyses,
  recoverInterrupted,
  requestCancel,
} from "@/db/analyses";
import { AnalysisRunner } from "@/lib/jobs/runner";
import { AppError } from "@/lib/errors";
import type { Note } from "@/lib/engine";
import { startTestApp, type TestApp } from "../support/app";
import { analysisRow, draftRow, seedTake, tempDataDir, toneWav, waitForAnalysis } from "../support/jobs";

// A4 and C#5 (440 Hz, 554.37 Hz = MIDI 69 and 73; MIDI tuning standard, A4 = 440 Hz).
const CHORD_HZ = [440, 554.37];

let app: TestApp;
let dataDir: string;
let runner: AnalysisRunner | undefined;

beforeAll(async () => {
  dataDir = tempDataDir();
  app = await startTestApp({ DATA_DIR: dataDir });
});

afterAll(async () => {
  await runner?.stop();
  await app.close();
  rmSync(dataDir, { recursive: true, force: true });
});

const quiet = () => {};

async function enqueue(takeId: string, studioId: string, settings: unknown = {}) {
  return enqueueAnalysis(app.db, { takeId, studioId, settings, createdByUserId: null });
}

async function withRunner<T>(options: ConstructorParameters<typeof AnalysisRunner>[0], body: (r: AnalysisRunner) => Promise<T>): Promise<T> {
  runner = new AnalysisRunner({ pollMs: 50, leaseMs: 3000, log: quiet, ...options });
  await runner.start();
  try {
    return await body(runner);
  } finally {
    await runner.stop();
    runner = undefined;
  }
}

describe("analysis jobs", () => {
  it("analyses a take in a worker thread: ready, progress 100, a draft with the chord's notes", async () => {
    const seeded = await seedTake(app.db, toneWav(3, CHORD_HZ), { durationSec: 3 });
    const queued = await enqueue(seeded.takeId, seeded.studioId, { taper: "blackman" });
    expect(queued).toMatchObject({ takeId: seeded.takeId, state: "queued", progress: 0 });
    expect(queued.settings).toMatchObject({ taper: "blackman", hopMs: 10 }); // defaults filled in

    const seen: number[] = [];
    await withRunner({ concurrency: 1 }, async () => {
      await waitForAnalysis(app.db, queued.id, (r) => r.state === "ready" || r.state === "failed", 20_000, seen);
    });
    const dto = await getAnalysis(seeded.studioId, queued.id);
    expect(dto.state).toBe("ready");
    expect(dto.progress).toBe(100);
    expect(dto.error).toBeUndefined();
    expect(Date.parse(dto.finishedAt!)).toBeGreaterThanOrEqual(Date.parse(dto.startedAt!));
    // progress only goes up
    expect([...seen].sort((a, b) => a - b)).toEqual(seen);

    const saved = await draftRow(app.db, queued.id);
    expect(saved).toBeDefined();
    const notes = JSON.parse(saved!.notesJson) as Note[];
    expect(saved!.noteCount).toBe(notes.length);
    const pitches = new Set(notes.map((n) => n.pitch));
    expect(pitches.has(69)).toBe(true);
    expect(pitches.has(73)).toBe(true);
    const a4 = notes.find((n) => n.pitch === 69)!;
    expect(Math.abs(a4.cents)).toBeLessThan(5); // an exact 440 Hz tone
    expect(a4.onsetSec).toBeCloseTo(0.25, 1);
    expect(saved!.referenceHz).toBeGreaterThan(435);
    expect(saved!.referenceHz).toBeLessThan(445);

    expect((await latestAnalysis(seeded.takeId))?.id).toBe(queued.id);
  });

  it("keeps every analysis of a take, newest first, and rejects bad settings with 422", async () => {
    const seeded = await seedTake(app.db, toneWav(1, CHORD_HZ));
    const first = await enqueue(seeded.takeId, seeded.studioId);
    await new Promise((r) => setTimeout(r, 5));
    const second = await enqueue(seeded.takeId, seeded.studioId, { referenceHz: 442 });
    expect((await listAnalyses(seeded.takeId)).map((a) => a.id)).toEqual([second.id, first.id]);
    expect((await latestAnalysis(seeded.takeId))?.id).toBe(second.id);

    const bad = await enqueue(seeded.takeId, seeded.studioId, { taper: "not-a-taper" }).catch((e) => e);
    expect(bad).toBeInstanceOf(AppError);
    expect(bad.code).toBe("validation_failed");
    expect(bad.fields.settings[0]).toMatch(/taper/);
    expect(await listAnalyses(seeded.takeId)).toHaveLength(2);
    await requestCancel(seeded.studioId, first.id);
    await requestCancel(seeded.studioId, second.id);
  });

  it("never gives one job to two claimers (two connections claiming at once)", async () => {
    const seeded = await seedTake(app.db, toneWav(0.5, CHORD_HZ));
    const ids = new Set<string>();
    for (let i = 0; i < 16; i++) ids.add((await enqueue(seeded.takeId, seeded.studioId)).id);
    const a = openDb(process.env.DATABASE_URL!);
    const b = openDb(process.env.DATABASE_URL!);
    const claimAll = async (database: typeof a, workerId: string) => {
      const got: string[] = [];
      for (;;) {
        const job = await claimNext(workerId, 60_000, database);
        if (!job) return got;
        got.push(job.id);
      }
    };
    const [gotA, gotB] = await Promise.all([claimAll(a, "claimer-a"), claimAll(b, "claimer-b")]);
    a.$client.close();
    b.$client.close();
    const all = [...gotA, ...gotB];
    expect(new Set(all).size).toBe(all.length);
    expect(new Set(all)).toEqual(ids);
    for (const id of gotA) expect((await analysisRow(app.db, id))?.workerId).toBe("claimer-a");
    // give them back so later tests see an empty queue
    await recoverInterrupted({ maxAttempts: 1, now: new Date(Date.now() + 120_000) });
  });

  it("fails a corrupt or empty file with a sentence a person can act on", async () => {
    const good = toneWav(1, CHORD_HZ);
    const cut = await seedTake(app.db, good.slice(0, 30)); // header cut short
    const garbage = await seedTake(app.db, new TextEncoder().encode("RIFF\u0000\u0000\u0000\u0000this is not a wave file at all"));
    const silent = await seedTake(app.db, toneWav(0, CHORD_HZ));
    const jobs = await Promise.all([cut, garbage, silent].map((s) => enqueue(s.takeId, s.studioId)));
    await withRunner({ concurrency: 2 }, async () => {
      for (const job of jobs) await waitForAnalysis(app.db, job.id, (r) => r.state === "failed" || r.state === "ready");
    });
    const errors = await Promise.all(jobs.map(async (j, i) => (await getAnalysis([cut, garbage, silent][i]!.studioId, j.id)).error));
    for (const [i, job] of jobs.entries()) {
      const row = await analysisRow(app.db, job.id);
      expect(row?.state).toBe("failed");
      expect(row?.attempts).toBe(1); // a bad file is not retried
      expect(await draftRow(app.db, job.id)).toBeUndefined();
      expect(errors[i]).toMatch(/^[A-Z].*\.$/); // a sentence, no stack or code
      expect(errors[i]).not.toMatch(/Error|at .*\(|\.ts/);
    }
    expect(errors[2]).toBe("The file holds no audio samples.");
  });

  it("cancels a queued job at once and a running one by stopping its thread", async () => {
    const short = await seedTake(app.db, toneWav(1, CHORD_HZ));
    const queued = await enqueue(short.takeId, short.studioId);
    const cancelled = await requestCancel(short.studioId, queued.id);
    expect(cancelled).toMatchObject({ state: "failed", error: "Cancelled" });
    await expect(requestCancel(short.studioId, queued.id)).rejects.toMatchObject({ code: "conflict" });
    await expect(requestCancel("another-studio", queued.id)).rejects.toMatchObject({ code: "not_found" });
    await expect(getAnalysis("another-studio", queued.id)).rejects.toMatchObject({ code: "not_found" });

    // two minutes at a 2 ms hop keep the engine busy for several seconds (20 s had become about one)
    const long = await seedTake(app.db, toneWav(120, CHORD_HZ));
    const job = await enqueue(long.takeId, long.studioId, { hopMs: 2 });
    await withRunner({ concurrency: 1 }, async (r) => {
      await waitForAnalysis(app.db, job.id, (row) => row.state === "analysing" && row.progressPercent >= 5);
      const flagged = await requestCancel(long.studioId, job.id);
      expect(flagged.state).toBe("analysing");
      const t0 = Date.now();
      const row = await waitForAnalysis(app.db, job.id, (row) => row.state !== "analysing", 10_000);
      expect(Date.now() - t0).toBeLessThan(5000); // the runner looks for a cancel every second
      expect(row.state).toBe("failed");
      expect(row.error).toBe("Cancelled");
      expect(row.workerId).toBeNull();
      expect(await draftRow(app.db, job.id)).toBeUndefined();
      // the runner carries on with the next job after a cancel
      const next = await enqueue(short.takeId, short.studioId);
      r.wake();
      expect((await waitForAnalysis(app.db, next.id, (row) => row.state === "ready" || row.state === "failed")).state).toBe("ready");
    });
  });

  it("re-queues a job whose lease ran out, and fails it after the last attempt", async () => {
    const seeded = await seedTake(app.db, toneWav(1, CHORD_HZ));
    const job = await enqueue(seeded.takeId, seeded.studioId);
    const maxAttempts = 3;
    for (let attempt = 1; attempt <= maxAttempts; attempt++) {
      // a runner that claims the job and then dies without a word
      const claimed = await claimNext(`vanished-${attempt}`, 10);
      expect(claimed?.id).toBe(job.id);
      expect(claimed?.attempts).toBe(attempt);
      // a live lease is left alone
      expect(await recoverInterrupted({ maxAttempts, now: new Date(Date.now() - 1000) })).toEqual({ requeued: 0, failed: 0 });
      const recovered = await recoverInterrupted({ maxAttempts, now: new Date(Date.now() + 1000) });
      expect(recovered).toEqual(attempt < maxAttempts ? { requeued: 1, failed: 0 } : { requeued: 0, failed: 1 });
    }
    const dto = await getAnalysis(seeded.studioId, job.id);
    expect(dto.state).toBe("failed");
    expect(dto.error).toMatch(/interrupted 3 times/);
    expect(dto.error).toMatch(/Analyse the take again/);
  });

  it("retries a job whose worker thread dies, up to the attempt limit", async () => {
    const seeded = await seedTake(app.db, toneWav(5, CHORD_HZ));
    const job = await enqueue(seeded.takeId, seeded.studioId);
    // a 4 MB heap is far too little for the engine: the thread dies with ERR_WORKER_OUT_OF_MEMORY
    await withRunner({ concurrency: 1, maxAttempts: 2, workerMemoryMb: 4 }, async () => {
      await waitForAnalysis(app.db, job.id, (r) => r.state === "failed" || r.state === "ready", 30_000);
    });
    const row = await analysisRow(app.db, job.id);
    expect(row?.state).toBe("failed");
    expect(row?.attempts).toBe(2);
    expect(row?.error).toMatch(/stopped unexpectedly 2 times/);
  });

  it("stops an attempt that runs past the time limit and fails it with the limit named", async () => {
    // two minutes at a 2 ms hop: several seconds of analysis, far past the 1-second limit (a
    // 20-second take analysed within the second once the engine got faster)
    const seeded = await seedTake(app.db, toneWav(120, CHORD_HZ));
    const job = await enqueue(seeded.takeId, seeded.studioId, { hopMs: 2 });
    await withRunner({ concurrency: 1, jobTimeoutMs: 1000 }, async () => {
      await waitForAnalysis(app.db, job.id, (r) => r.state === "failed" || r.state === "ready");
    });
    expect((await getAnalysis(seeded.studioId, job.id)).error).toBe(
      "The analysis took longer than 1 second and was stopped. Try a shorter take, or analyse again with a larger hop.",
    );
  });

  it("puts running jobs back in the queue when the runner stops, and another runner finishes them", async () => {
    // a minute at a 2 ms hop: a few seconds of analysis, so the first runner stops it midway
    const seeded = await seedTake(app.db, toneWav(60, CHORD_HZ));
    const job = await enqueue(seeded.takeId, seeded.studioId, { hopMs: 2 });
    await withRunner({ concurrency: 1 }, async () => {
      await waitForAnalysis(app.db, job.id, (r) => r.state === "analysing" && r.progressPercent > 0);
    });
    const back = await analysisRow(app.db, job.id);
    expect(back).toMatchObject({ state: "queued", attempts: 0, workerId: null, progressPercent: 0 });
    await withRunner({ concurrency: 1 }, async () => {
      await waitForAnalysis(app.db, job.id, (r) => r.state === "ready" || r.state === "failed", 30_000);
    });
    expect((await analysisRow(app.db, job.id))?.state).toBe("ready");
    expect(await draftRow(app.db, job.id)).toBeDefined();
  });
});
