import "server-only";
import type { AnalysisDto } from "@/lib/schemas/takes";
import { and, asc, desc, eq, inArray, isNull, lt, or, sql } from "drizzle-orm";
import { db, type Db } from "./client";
import { newId } from "./ids";
import { analysis, draft, take, type AnalysisState } from "./schema";
import { EngineError, parseSettings, type Transcription } from "@/lib/engine";
import { jobConfig } from "@/lib/config";
import { AppError, conflict, notFound } from "@/lib/errors";

/**
 * The analysis queue. Jobs live in the `analysis` table: `queued → analysing → ready | failed`.
 * A runner claims a job with a lease (workerId + leaseUntil) and renews it with every progress
 * report; a job whose lease ran out was interrupted (crash, kill, restart) and is put back in
 * the queue by `recoverInterrupted`, at most `maxAttempts` times. `attempts` counts claims.
 */

type Tx = Parameters<Parameters<Db["transaction"]>[0]>[0];
/** The database or a transaction on it, so an upload can enqueue inside its own transaction. */
export type DbOrTx = Db | Tx;

export type { AnalysisDto };

export const CANCELLED = "Cancelled";

const columns = {
  id: analysis.id,
  takeId: analysis.takeId,
  state: analysis.state,
  progressPercent: analysis.progressPercent,
  error: analysis.error,
  settingsJson: analysis.settingsJson,
  createdAt: analysis.createdAt,
  startedAt: analysis.startedAt,
  finishedAt: analysis.finishedAt,
};

type Row = {
  id: string;
  takeId: string;
  state: AnalysisState;
  progressPercent: number;
  error: string | null;
  settingsJson: string;
  createdAt: Date;
  startedAt: Date | null;
  finishedAt: Date | null;
};

function toDto(row: Row): AnalysisDto {
  let settings: Record<string, unknown> = {};
  try {
    settings = JSON.parse(row.settingsJson) as Record<string, unknown>;
  } catch {
    // stored by enqueueAnalysis, always JSON; an empty object is the safe reading otherwise
  }
  return {
    id: row.id,
    takeId: row.takeId,
    state: row.state,
    progress: Math.round(row.progressPercent * 10) / 10,
    ...(row.error ? { error: row.error } : {}),
    settings,
    createdAt: row.createdAt.toISOString(),
    ...(row.startedAt ? { startedAt: row.startedAt.toISOString() } : {}),
    ...(row.finishedAt ? { finishedAt: row.finishedAt.toISOString() } : {}),
  };
}

/**
 * Queues an analysis of a take. The settings are checked and stored with the engine's defaults
 * filled in, so the record says exactly what ran. Bad settings are a 422 with `fields.settings`.
 */
export async function enqueueAnalysis(
  database: DbOrTx,
  input: { takeId: string; studioId: string; settings: unknown; createdByUserId: string | null },
): Promise<AnalysisDto> {
  let settings: object;
  try {
    settings = parseSettings(input.settings ?? {});
  } catch (e) {
    if (e instanceof EngineError) {
      const message = e.message.charAt(0).toUpperCase() + e.message.slice(1) + ".";
      throw new AppError("validation_failed", message, { settings: [message] });
    }
    throw e;
  }
  const [row] = await database
    .insert(analysis)
    .values({
      id: newId(),
      takeId: input.takeId,
      studioId: input.studioId,
      settingsJson: JSON.stringify(settings),
      createdByUserId: input.createdByUserId,
    })
    .returning(columns);
  return toDto(row!);
}

/** One analysis of the studio; another studio's id is a 404, as if it did not exist. */
export async function getAnalysis(studioId: string, analysisId: string): Promise<AnalysisDto> {
  const [row] = await db()
    .select(columns)
    .from(analysis)
    .where(and(eq(analysis.id, analysisId), eq(analysis.studioId, studioId)));
  if (!row) throw notFound("This analysis");
  return toDto(row);
}

/** The newest analysis of a take (the caller has checked the take's studio). */
export async function latestAnalysis(takeId: string): Promise<AnalysisDto | undefined> {
  const [row] = await db()
    .select(columns)
    .from(analysis)
    .where(eq(analysis.takeId, takeId))
    .orderBy(desc(analysis.createdAt), desc(analysis.id))
    .limit(1);
  return row ? toDto(row) : undefined;
}

/** The newest analysis of each of the takes, in one query (for take lists). */
export async function latestAnalyses(takeIds: string[]): Promise<Map<string, AnalysisDto>> {
  const out = new Map<string, AnalysisDto>();
  if (takeIds.length === 0) return out;
  const rows = await db()
    .select(columns)
    .from(analysis)
    .where(inArray(analysis.takeId, takeIds))
    .orderBy(desc(analysis.createdAt), desc(analysis.id));
  for (const row of rows) if (!out.has(row.takeId)) out.set(row.takeId, toDto(row));
  return out;
}

/**
 * How the reference pitch of the take's latest ready draft came about: estimated by the engine
 * from the audio, or set in the analysis's settings (a number of Hz); null when there is no draft.
 */
export async function draftReferenceSetting(takeId: string): Promise<"estimate" | number | null> {
  const [row] = await db()
    .select({ settingsJson: analysis.settingsJson })
    .from(analysis)
    .innerJoin(draft, eq(draft.analysisId, analysis.id))
    .where(eq(analysis.takeId, takeId))
    .orderBy(desc(analysis.createdAt))
    .limit(1);
  if (!row) return null;
  try {
    const value = (JSON.parse(row.settingsJson) as { referenceHz?: unknown }).referenceHz;
    return typeof value === "number" ? value : "estimate";
  } catch {
    return "estimate";
  }
}

/** Every analysis of a take, newest first (the caller has checked the take's studio). */
export async function listAnalyses(takeId: string): Promise<AnalysisDto[]> {
  const rows = await db()
    .select(columns)
    .from(analysis)
    .where(eq(analysis.takeId, takeId))
    .orderBy(desc(analysis.createdAt), desc(analysis.id));
  return rows.map(toDto);
}

/**
 * Cancels an analysis: a queued one fails "Cancelled" at once; an analysing one is flagged
 * and its runner stops it within about a second. A finished one is a 409.
 */
export async function requestCancel(studioId: string, analysisId: string): Promise<AnalysisDto> {
  const database = db();
  const now = new Date();
  const inStudio = and(eq(analysis.id, analysisId), eq(analysis.studioId, studioId));
  const queued = await database
    .update(analysis)
    .set({ state: "failed", error: CANCELLED, cancelRequested: true, finishedAt: now, workerId: null, leaseUntil: null })
    .where(and(inStudio, eq(analysis.state, "queued")))
    .returning(columns);
  if (queued[0]) return toDto(queued[0]);
  const running = await database
    .update(analysis)
    .set({ cancelRequested: true })
    .where(and(inStudio, eq(analysis.state, "analysing")))
    .returning(columns);
  if (running[0]) return toDto(running[0]);
  const current = await getAnalysis(studioId, analysisId);
  throw conflict(
    current.state === "ready"
      ? "This analysis has already finished."
      : "This analysis has already stopped.",
  );
}

// ---------------------------------------------------------------------------------------------
// Queue internals, used by the job runner (lib/jobs). Every write by a runner is guarded by its
// workerId and the state, so a runner that lost its lease can no longer change the job.

export type ClaimedJob = { id: string; takeId: string; analysisKey: string; settings: object; attempts: number };

/**
 * Claims the oldest queued job for a worker, atomically: one UPDATE whose WHERE picks the
 * oldest queued id and checks the state again, so two claimers never get the same job.
 */
export async function claimNext(workerId: string, leaseMs: number, database: Db = db()): Promise<ClaimedJob | undefined> {
  const now = Date.now();
  const oldestQueued = database
    .select({ id: analysis.id })
    .from(analysis)
    .where(eq(analysis.state, "queued"))
    .orderBy(asc(analysis.createdAt), asc(analysis.id))
    .limit(1);
  const [row] = await database
    .update(analysis)
    .set({
      state: "analysing",
      workerId,
      leaseUntil: new Date(now + leaseMs),
      startedAt: new Date(now),
      progressPercent: 0,
      attempts: sql`${analysis.attempts} + 1`,
    })
    .where(and(inArray(analysis.id, oldestQueued), eq(analysis.state, "queued")))
    .returning({ id: analysis.id, takeId: analysis.takeId, settingsJson: analysis.settingsJson, attempts: analysis.attempts });
  if (!row) return undefined;
  // A take deleted in between takes its analyses with it (cascade); the runner's writes then find nothing.
  const [source] = await database.select({ analysisKey: take.analysisKey }).from(take).where(eq(take.id, row.takeId));
  return {
    id: row.id,
    takeId: row.takeId,
    analysisKey: source?.analysisKey ?? "",
    settings: JSON.parse(row.settingsJson) as object,
    attempts: row.attempts,
  };
}

const heldBy = (id: string, workerId: string) =>
  and(eq(analysis.id, id), eq(analysis.workerId, workerId), eq(analysis.state, "analysing"));

/**
 * Writes progress and renews the lease. `leaseHeld` is false when the job is no longer this
 * worker's (recovered after a missed lease, or deleted with its take): the worker must stop.
 */
export async function reportProgress(
  id: string,
  workerId: string,
  percent: number,
  leaseMs: number,
  database: Db = db(),
): Promise<{ cancelRequested: boolean; leaseHeld: boolean }> {
  const [row] = await database
    .update(analysis)
    .set({ progressPercent: Math.max(0, Math.min(100, percent)), leaseUntil: new Date(Date.now() + leaseMs) })
    .where(heldBy(id, workerId))
    .returning({ cancelRequested: analysis.cancelRequested });
  return { cancelRequested: row?.cancelRequested ?? false, leaseHeld: row !== undefined };
}

/**
 * Writes the draft and sets the job ready, in one transaction. A job cancelled meanwhile is
 * not completed ("cancelled"); one that is no longer this worker's is left alone ("lost").
 */
export async function completeAnalysis(
  id: string,
  workerId: string,
  transcription: Pick<Transcription, "referenceHz" | "notes">,
  database: Db = db(),
): Promise<"ready" | "cancelled" | "lost"> {
  return database.transaction(async (tx) => {
    const [row] = await tx
      .select({ takeId: analysis.takeId, cancelRequested: analysis.cancelRequested })
      .from(analysis)
      .where(heldBy(id, workerId));
    if (!row) return "lost";
    if (row.cancelRequested) return "cancelled";
    await tx.insert(draft).values({
      analysisId: id,
      takeId: row.takeId,
      referenceHz: transcription.referenceHz,
      notesJson: JSON.stringify(transcription.notes),
      noteCount: transcription.notes.length,
    });
    await tx
      .update(analysis)
      .set({ state: "ready", progressPercent: 100, error: null, finishedAt: new Date(), workerId: null, leaseUntil: null })
      .where(heldBy(id, workerId));
    return "ready";
  });
}

/** Fails the job with a message a person can act on. Returns false when it was not this worker's. */
export async function failAnalysis(id: string, workerId: string, message: string, database: Db = db()): Promise<boolean> {
  const rows = await database
    .update(analysis)
    .set({ state: "failed", error: message, finishedAt: new Date(), workerId: null, leaseUntil: null })
    .where(heldBy(id, workerId))
    .returning({ id: analysis.id });
  return rows.length > 0;
}

/**
 * Puts a job of this worker back in the queue. `countAttempt: false` gives the attempt back
 * (a graceful stop is not the job's fault); true keeps it (the worker thread crashed).
 */
export async function requeueAnalysis(
  id: string,
  workerId: string,
  options: { countAttempt: boolean },
  database: Db = db(),
): Promise<boolean> {
  const rows = await database
    .update(analysis)
    .set({
      state: "queued",
      progressPercent: 0,
      workerId: null,
      leaseUntil: null,
      startedAt: null,
      ...(options.countAttempt ? {} : { attempts: sql`max(0, ${analysis.attempts} - 1)` }),
    })
    .where(heldBy(id, workerId))
    .returning({ id: analysis.id });
  return rows.length > 0;
}

// A job analysing without a lease cannot be renewed by anyone, so it counts as expired.
const leaseOver = (now: Date) => or(lt(analysis.leaseUntil, now), isNull(analysis.leaseUntil));

export function interruptedMessage(attempts: number): string {
  return (
    `The analysis was interrupted ${attempts} ${attempts === 1 ? "time" : "times"} before it could finish ` +
    "(the job runner stopped or ran out of memory). Analyse the take again; if it keeps failing, " +
    "try a shorter take or a larger hop."
  );
}

/**
 * Finds jobs whose lease ran out (their runner crashed, was killed or hung) and puts them back
 * in the queue, or fails them once they have had `maxAttempts` claims; a job whose cancel was
 * requested fails "Cancelled". Safe to run from every runner, at start and periodically.
 */
export async function recoverInterrupted(
  options: { maxAttempts?: number; now?: Date } = {},
  database: Db = db(),
): Promise<{ requeued: number; failed: number }> {
  const maxAttempts = options.maxAttempts ?? jobConfig().maxAttempts;
  const now = options.now ?? new Date();
  const expired = await database
    .select({ id: analysis.id, attempts: analysis.attempts, cancelRequested: analysis.cancelRequested, workerId: analysis.workerId })
    .from(analysis)
    .where(and(eq(analysis.state, "analysing"), leaseOver(now)));
  let requeued = 0;
  let failed = 0;
  for (const job of expired) {
    // Guard on the same worker and an expired lease: a runner renewing right now keeps its job.
    const stillExpired = and(
      eq(analysis.id, job.id),
      eq(analysis.state, "analysing"),
      leaseOver(now),
      job.workerId === null ? sql`${analysis.workerId} is null` : eq(analysis.workerId, job.workerId),
    );
    if (job.cancelRequested || job.attempts >= maxAttempts) {
      const rows = await database
        .update(analysis)
        .set({
          state: "failed",
          error: job.cancelRequested ? CANCELLED : interruptedMessage(job.attempts),
          finishedAt: now,
          workerId: null,
          leaseUntil: null,
        })
        .where(stillExpired)
        .returning({ id: analysis.id });
      failed += rows.length;
    } else {
      const rows = await database
        .update(analysis)
        .set({ state: "queued", progressPercent: 0, workerId: null, leaseUntil: null, startedAt: null })
        .where(stillExpired)
        .returning({ id: analysis.id });
      requeued += rows.length;
    }
  }
  return { requeued, failed };
}
