/**
 * The analysis job runner (`npm run worker`; the run command starts it next to Next.js):
 * runs queued analyses from DATABASE_URL in a pool of worker threads until SIGTERM or SIGINT,
 * then stops claiming and puts its running jobs back in the queue for the next start.
 * JOB_WORKER_MEMORY_MB caps each worker thread's heap; JOB_TIMEOUT_MIN caps one attempt (default 30).
 * JOB_NICE (default 10, 0 = off) lowers the runner's CPU priority: analyses are background work,
 * and on a small machine the web server's answers must not wait behind them.
 */
import os from "node:os";
import { db } from "@/db/client";
import { jobConfig } from "@/lib/config";
import { serverEnv } from "@/lib/env";
import { AnalysisRunner } from "@/lib/jobs/runner";

serverEnv(); // a bad environment stops here, with one readable message
const config = jobConfig();
const nice = Number(process.env.JOB_NICE ?? 10);
if (Number.isInteger(nice) && nice > 0) {
  try {
    // before the pool starts: its threads inherit the priority of the thread that creates them
    os.setPriority(0, Math.min(19, nice));
  } catch (e) {
    console.error(`[worker] could not lower the priority (JOB_NICE=${nice}): ${(e as Error).message}`);
  }
}
const positive = (value: string | undefined) => {
  const n = Number(value);
  return Number.isFinite(n) && n > 0 ? n : undefined;
};
const timeoutMin = positive(process.env.JOB_TIMEOUT_MIN);
const runner = new AnalysisRunner({
  ...config,
  workerMemoryMb: positive(process.env.JOB_WORKER_MEMORY_MB),
  jobTimeoutMs: timeoutMin === undefined ? undefined : timeoutMin * 60_000,
});

let stopping = false;
async function stop(signal: string) {
  if (stopping) return;
  stopping = true;
  console.log(`[worker] ${signal}: stopping, running analyses go back to the queue`);
  const forced = setTimeout(() => process.exit(1), 10_000);
  try {
    await runner.stop();
    db().$client.close();
  } finally {
    clearTimeout(forced);
    process.exit(0);
  }
}
process.on("SIGTERM", () => void stop("SIGTERM"));
process.on("SIGINT", () => void stop("SIGINT"));

try {
  await runner.start();
  console.log(`[worker] analysing with ${config.concurrency} worker thread(s) as ${runner.workerId}`);
} catch (e) {
  console.error("[worker]", e instanceof Error ? e.message : e);
  process.exit(1);
}
