import "server-only";
import { randomUUID } from "node:crypto";
import os from "node:os";
import type { Worker } from "node:worker_threads";
import { spawnTsWorker } from "./ts-worker";
import {
  CANCELLED,
  claimNext,
  completeAnalysis,
  failAnalysis,
  recoverInterrupted,
  reportProgress,
  requeueAnalysis,
  type ClaimedJob,
} from "@/db/analyses";
import type { Transcription } from "@/lib/engine";
import { jobConfig, uploadLimits, type JobConfig } from "@/lib/config";
import { crashMessage, failureMessage, timeoutMessage, type WorkerFailure } from "./messages";
import type { RunRequest, WorkerReply } from "./analysis-worker";

/**
 * The analysis runner: polls the queue in the database, runs each claimed job in a pool of
 * worker threads (at most `concurrency` at once) and writes progress and results. The main
 * thread never computes, so it renews leases and notices cancels while the engine runs.
 */
export type RunnerOptions = Partial<JobConfig> & {
  /** Names this runner in the `worker_id` column; unique per process by default. */
  workerId?: string;
  /** V8 heap limit of each worker thread (MB): a take that needs more fails its attempt, not the process. */
  workerMemoryMb?: number;
  /** Longest one attempt may run; a hung engine would otherwise hold its job while the lease is renewed. */
  jobTimeoutMs?: number;
  log?: (line: string) => void;
};

type Outcome =
  | { kind: "done"; transcription: Pick<Transcription, "referenceHz" | "notes"> }
  | { kind: "failed"; failure: WorkerFailure }
  | { kind: "crashed"; detail: string }
  | { kind: "cancelled" }
  | { kind: "timedOut" }
  | { kind: "lost" }
  | { kind: "stopping" };

type Running = {
  job: ClaimedJob;
  worker: Worker;
  percent: number;
  writtenPercent: number;
  writtenAtMs: number;
  writing: boolean;
  dirty: boolean;
  ended: boolean;
  heartbeat: NodeJS.Timeout;
  deadline: NodeJS.Timeout;
  detach: () => void;
};

// Write progress when it moved by this much, or this long after the last write.
const PROGRESS_STEP_PERCENT = 1;
const PROGRESS_INTERVAL_MS = 500;
// The engine analyses a 10-minute take in well under a minute; this is far beyond any honest run.
const DEFAULT_JOB_TIMEOUT_MS = 30 * 60_000;

const workerEntry = new URL("./analysis-worker.ts", import.meta.url).href;

function spawnWorker(memoryMb: number | undefined): Worker {
  return spawnTsWorker(workerEntry, memoryMb ? { resourceLimits: { maxOldGenerationSizeMb: memoryMb } } : {});
}

export class AnalysisRunner {
  readonly workerId: string;
  private readonly config: JobConfig;
  private readonly memoryMb?: number;
  private readonly jobTimeoutMs: number;
  private readonly log: (line: string) => void;
  private readonly running = new Map<string, Running>();
  private readonly idle: Worker[] = [];
  private readonly pending = new Set<Promise<unknown>>();
  private timer?: NodeJS.Timeout;
  private ticking?: Promise<void>;
  private stopped = true;
  private lastRecoveryMs = 0;

  constructor(options: RunnerOptions = {}) {
    const defaults = jobConfig();
    this.config = {
      concurrency: options.concurrency ?? defaults.concurrency,
      maxAttempts: options.maxAttempts ?? defaults.maxAttempts,
      leaseMs: options.leaseMs ?? defaults.leaseMs,
      pollMs: options.pollMs ?? defaults.pollMs,
    };
    this.workerId = options.workerId ?? `${os.hostname()}:${process.pid}:${randomUUID().slice(0, 8)}`;
    this.memoryMb = options.workerMemoryMb;
    this.jobTimeoutMs = options.jobTimeoutMs ?? DEFAULT_JOB_TIMEOUT_MS;
    this.log = options.log ?? ((line) => console.log(`[worker] ${line}`));
  }

  /** Jobs this runner is analysing right now. */
  get activeJobs(): number {
    return this.running.size;
  }

  /** Recovers interrupted jobs, then polls the queue until `stop()`. */
  async start(): Promise<void> {
    if (!this.stopped) return;
    this.stopped = false;
    const recovered = await recoverInterrupted({ maxAttempts: this.config.maxAttempts });
    this.lastRecoveryMs = Date.now();
    if (recovered.requeued || recovered.failed)
      this.log(`recovered interrupted analyses: ${recovered.requeued} re-queued, ${recovered.failed} failed`);
    this.wake();
  }

  /** Polls now instead of at the next interval (e.g. right after an enqueue in this process). */
  wake(): void {
    if (this.stopped) return;
    clearTimeout(this.timer);
    this.timer = undefined;
    if (!this.ticking) this.ticking = this.tick().finally(() => (this.ticking = undefined));
  }

  /**
   * Stops claiming, terminates the running jobs' threads and puts their jobs back in the queue
   * at once (the attempt is given back), so another runner or the next start picks them up.
   */
  async stop(): Promise<void> {
    if (this.stopped) return;
    this.stopped = true;
    clearTimeout(this.timer);
    await this.ticking;
    for (const run of [...this.running.values()]) this.end(run, { kind: "stopping" });
    while (this.pending.size) await Promise.allSettled([...this.pending]);
    await Promise.allSettled(this.idle.splice(0).map((w) => w.terminate()));
  }

  private schedule(): void {
    if (this.stopped) return;
    clearTimeout(this.timer);
    this.timer = setTimeout(() => this.wake(), this.config.pollMs);
  }

  private async tick(): Promise<void> {
    try {
      // Any runner may recover any expired lease; live runners renew theirs well before expiry.
      if (Date.now() - this.lastRecoveryMs >= Math.max(1000, this.config.leaseMs / 2)) {
        this.lastRecoveryMs = Date.now();
        const recovered = await recoverInterrupted({ maxAttempts: this.config.maxAttempts });
        if (recovered.requeued || recovered.failed)
          this.log(`recovered interrupted analyses: ${recovered.requeued} re-queued, ${recovered.failed} failed`);
      }
      while (!this.stopped && this.running.size < this.config.concurrency) {
        const job = await claimNext(this.workerId, this.config.leaseMs);
        if (!job) break;
        if (this.stopped) {
          await requeueAnalysis(job.id, this.workerId, { countAttempt: false });
          break;
        }
        this.startJob(job);
      }
    } catch (e) {
      this.log(`polling the queue failed, retrying: ${e instanceof Error ? e.message : String(e)}`);
    } finally {
      this.schedule();
    }
  }

  private newWorker(): Worker {
    const worker = spawnWorker(this.memoryMb);
    // A thread that dies while idle is dropped from the pool; while it runs a job, startJob's
    // listeners handle its death. This listener also keeps an 'error' from throwing here.
    worker.on("error", (e) => {
      if (this.idle.includes(worker)) this.log(`an idle worker thread failed: ${e.message}`);
    });
    worker.once("exit", () => {
      const i = this.idle.indexOf(worker);
      if (i >= 0) this.idle.splice(i, 1);
    });
    return worker;
  }

  private startJob(job: ClaimedJob): void {
    const worker = this.idle.pop() ?? this.newWorker();
    const onMessage = (reply: WorkerReply) => {
      if (reply.analysisId !== job.id) return;
      if (reply.type === "progress") {
        run.percent = Math.max(run.percent, Math.min(99, reply.fraction * 100));
        this.writeProgress(run, false);
      } else if (reply.type === "done") {
        this.end(run, { kind: "done", transcription: { referenceHz: reply.referenceHz, notes: reply.notes as Transcription["notes"] } });
      } else {
        this.end(run, { kind: "failed", failure: reply.failure });
      }
    };
    const onError = (e: Error) => this.end(run, { kind: "crashed", detail: e.message });
    const onExit = (code: number) => this.end(run, { kind: "crashed", detail: `worker thread exited with code ${code}` });
    worker.on("message", onMessage);
    worker.on("error", onError);
    worker.on("exit", onExit);
    const heartbeatMs = Math.max(50, Math.min(1000, this.config.leaseMs / 3));
    const run: Running = {
      job,
      worker,
      percent: 0,
      writtenPercent: 0,
      writtenAtMs: Date.now(),
      writing: false,
      dirty: false,
      ended: false,
      // renews the lease and looks for a cancel even while the engine posts nothing
      heartbeat: setInterval(() => this.writeProgress(run, true), heartbeatMs),
      deadline: setTimeout(() => this.end(run, { kind: "timedOut" }), this.jobTimeoutMs),
      detach: () => {
        worker.off("message", onMessage);
        worker.off("error", onError);
        worker.off("exit", onExit);
      },
    };
    this.running.set(job.id, run);
    this.log(`analysing ${job.id} (attempt ${job.attempts})`);
    const request: RunRequest = {
      type: "run",
      analysisId: job.id,
      analysisKey: job.analysisKey,
      settings: job.settings,
      maxDurationSec: uploadLimits().maxDurationSec,
    };
    worker.postMessage(request);
  }

  private writeProgress(run: Running, heartbeat: boolean): void {
    if (run.ended) return;
    if (run.writing) {
      run.dirty = true;
      return;
    }
    const now = Date.now();
    const moved = run.percent - run.writtenPercent;
    const due = heartbeat || moved >= PROGRESS_STEP_PERCENT || (moved > 0 && now - run.writtenAtMs >= PROGRESS_INTERVAL_MS);
    if (!due) return;
    run.writing = true;
    const percent = run.percent;
    this.track(
      reportProgress(run.job.id, this.workerId, percent, this.config.leaseMs)
        .then(({ cancelRequested, leaseHeld }) => {
          run.writtenPercent = percent;
          run.writtenAtMs = now;
          if (!leaseHeld) this.end(run, { kind: "lost" });
          else if (cancelRequested) this.end(run, { kind: "cancelled" });
        })
        .catch((e) => this.log(`progress of ${run.job.id} not written: ${e instanceof Error ? e.message : String(e)}`))
        .finally(() => {
          run.writing = false;
          if (run.dirty) {
            run.dirty = false;
            this.writeProgress(run, false);
          }
        }),
    );
  }

  private track(promise: Promise<unknown>): void {
    this.pending.add(promise);
    void promise.finally(() => this.pending.delete(promise));
  }

  /** Ends a job exactly once: frees or terminates its thread, then records the outcome. */
  private end(run: Running, outcome: Outcome): void {
    if (run.ended) return;
    run.ended = true;
    clearInterval(run.heartbeat);
    clearTimeout(run.deadline);
    run.detach();
    const { job } = run;
    const reusable = outcome.kind === "done" || outcome.kind === "failed";
    if (reusable && !this.stopped) this.idle.push(run.worker);
    else void run.worker.terminate();
    this.track(
      this.record(job, outcome)
        .catch((e) =>
          // the lease runs out and recoverInterrupted puts the job back; nothing is lost
          this.log(`outcome of ${job.id} not written: ${e instanceof Error ? e.message : String(e)}`),
        )
        .finally(() => {
          this.running.delete(job.id);
          this.wake();
        }),
    );
  }

  private async record(job: ClaimedJob, outcome: Outcome): Promise<void> {
    const { id } = job;
    switch (outcome.kind) {
      case "done": {
        const result = await completeAnalysis(id, this.workerId, outcome.transcription);
        if (result === "cancelled") await failAnalysis(id, this.workerId, CANCELLED);
        this.log(`${id} ${result === "ready" ? `ready (${outcome.transcription.notes.length} notes)` : result}`);
        return;
      }
      case "failed":
        await failAnalysis(id, this.workerId, failureMessage(outcome.failure, uploadLimits()));
        this.log(`${id} failed: ${outcome.failure.kind} ${outcome.failure.message}`);
        return;
      case "crashed":
        if (job.attempts < this.config.maxAttempts) {
          await requeueAnalysis(id, this.workerId, { countAttempt: true });
          this.log(`${id} worker crashed (${outcome.detail}); re-queued`);
        } else {
          await failAnalysis(id, this.workerId, crashMessage(job.attempts));
          this.log(`${id} worker crashed (${outcome.detail}); failed after ${job.attempts} attempts`);
        }
        return;
      case "timedOut":
        await failAnalysis(id, this.workerId, timeoutMessage(this.jobTimeoutMs));
        this.log(`${id} stopped after ${this.jobTimeoutMs} ms`);
        return;
      case "cancelled":
        await failAnalysis(id, this.workerId, CANCELLED);
        this.log(`${id} cancelled`);
        return;
      case "lost":
        this.log(`${id} is no longer held by this runner; stopped`);
        return;
      case "stopping":
        await requeueAnalysis(id, this.workerId, { countAttempt: false });
        this.log(`${id} re-queued (runner stopping)`);
        return;
    }
  }
}
