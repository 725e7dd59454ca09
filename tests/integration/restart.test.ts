/**
 * The job runner as a real process (`scripts/worker.ts`): killed with SIGKILL mid-analysis and
 * started again, the interrupted job is recovered once its lease runs out and finishes with its
 * draft. SIGTERM stops the runner gracefully and puts its running job back in the queue.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { spawn, type ChildProcess } from "node:child_process";
import { rmSync } from "node:fs";
import { enqueueAnalysis } from "@/db/analyses";
import type { Note } from "@/lib/engine";
import { startTestApp, type TestApp } from "../support/app";
import { analysisRow, draftRow, seedTake, tempDataDir, toneWav, waitForAnalysis } from "../support/jobs";

let app: TestApp;
let dataDir: string;
const children = new Set<ChildProcess>();

beforeAll(async () => {
  dataDir = tempDataDir();
  app = await startTestApp({ DATA_DIR: dataDir });
});

afterAll(async () => {
  for (const child of children) child.kill("SIGKILL");
  await app.close();
  rmSync(dataDir, { recursive: true, force: true });
});

const LEASE_MS = 2000;

type WorkerProcess = { child: ChildProcess; output: () => string; exited: Promise<{ code: number | null; signal: NodeJS.Signals | null }> };

/** Starts `scripts/worker.ts` the way `npm run worker` does, against the test database. */
function startWorker(): WorkerProcess {
  const child = spawn(process.execPath, ["--conditions=react-server", "--import", "tsx", "scripts/worker.ts"], {
    cwd: process.cwd(),
    env: {
      ...process.env,
      JOB_CONCURRENCY: "1",
      JOB_LEASE_MS: String(LEASE_MS),
      JOB_POLL_MS: "100",
      JOB_MAX_ATTEMPTS: "3",
    },
    stdio: ["ignore", "pipe", "pipe"],
  });
  children.add(child);
  let text = "";
  child.stdout!.on("data", (chunk) => (text += chunk));
  child.stderr!.on("data", (chunk) => (text += chunk));
  const exited = new Promise<{ code: number | null; signal: NodeJS.Signals | null }>((resolve) =>
    child.on("exit", (code, signal) => {
      children.delete(child);
      resolve({ code, signal });
    }),
  );
  return { child, output: () => text, exited };
}

describe("job runner restart", () => {
  it("finishes an analysis interrupted by SIGKILL after the runner starts again", async () => {
    // 60 s of a chord at a 2 ms hop: several seconds of engine time, so the kill lands mid-way
    const seeded = await seedTake(app.db, toneWav(60, [440, 554.37]), { durationSec: 60 });
    const job = await enqueueAnalysis(app.db, { takeId: seeded.takeId, studioId: seeded.studioId, settings: { hopMs: 2 }, createdByUserId: null });

    const first = startWorker();
    const midway = await waitForAnalysis(app.db, job.id, (r) => r.state !== "queued" && r.progressPercent >= 15, 30_000).catch((e) => {
      throw new Error(`${e.message}\n${first.output()}`);
    });
    expect(midway.state).toBe("analysing");
    expect(midway.progressPercent).toBeLessThan(100);
    first.child.kill("SIGKILL");
    expect((await first.exited).signal).toBe("SIGKILL");

    // the dead runner still holds the job until its lease runs out
    const orphaned = await analysisRow(app.db, job.id);
    expect(orphaned).toMatchObject({ state: "analysing", attempts: 1 });
    expect(await draftRow(app.db, job.id)).toBeUndefined();

    const second = startWorker();
    const progress: number[] = [];
    const done = await waitForAnalysis(app.db, job.id, (r) => r.state === "ready" || r.state === "failed", 40_000, progress).catch((e) => {
      throw new Error(`${e.message}\n${second.output()}`);
    });
    expect(done.state).toBe("ready");
    expect(done.progressPercent).toBe(100);
    expect(done.attempts).toBe(2);
    expect(second.output()).toMatch(/recovered interrupted analyses: 1 re-queued/);

    const saved = await draftRow(app.db, job.id);
    const notes = JSON.parse(saved!.notesJson) as Note[];
    expect(notes.map((n) => n.pitch)).toContain(69);
    expect(notes.map((n) => n.pitch)).toContain(73);
    // one tone held for the whole take: one long note, not fragments from the two attempts
    const a4 = notes.filter((n) => n.pitch === 69);
    expect(a4).toHaveLength(1);
    expect(a4[0]!.offsetSec - a4[0]!.onsetSec).toBeGreaterThan(55);

    // SIGTERM: the runner stops claiming and puts its running job back at once
    const next = await enqueueAnalysis(app.db, { takeId: seeded.takeId, studioId: seeded.studioId, settings: { hopMs: 2 }, createdByUserId: null });
    await waitForAnalysis(app.db, next.id, (r) => r.state === "analysing" && r.progressPercent > 0, 30_000);
    second.child.kill("SIGTERM");
    const stopped = await second.exited;
    expect(stopped.code).toBe(0);
    expect(await analysisRow(app.db, next.id)).toMatchObject({ state: "queued", attempts: 0, workerId: null });
  });
});
