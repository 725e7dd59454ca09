import "server-only";
import { and, desc, eq, inArray, sql } from "drizzle-orm";
import { db } from "./client";
import { newId } from "./ids";
import { analysis, draft, project, revision, take } from "./schema";
import { enqueueAnalysis, latestAnalyses, latestAnalysis } from "./analyses";
import type { AnalysisDto, TakeDto } from "@/lib/schemas/takes";
import { AppError, conflict, notFound } from "@/lib/errors";
import { toNoteRows } from "@/lib/music/note-rows";
import { deleteTakeFiles, storeFile } from "@/lib/storage/files";
import type { NoteDto } from "@/lib/schemas/notes";

export type { TakeDto };

const takeColumns = {
  id: take.id,
  projectId: take.projectId,
  name: take.name,
  durationSec: take.durationSec,
  sampleRateHz: take.sampleRateHz,
  channels: take.channels,
  originalMime: take.originalMime,
  originalBytes: take.originalBytes,
  originalKey: take.originalKey,
  analysisKey: take.analysisKey,
  createdAt: take.createdAt,
};

type TakeRow = { [K in keyof typeof takeColumns]: (typeof take.$inferSelect)[K] };

/** Note counts of "the notes" of each take: the latest revision, else the latest ready draft. */
async function noteCounts(takeIds: string[]): Promise<Map<string, number>> {
  const out = new Map<string, number>();
  if (takeIds.length === 0) return out;
  const revs = await db()
    .select({ takeId: revision.takeId, number: revision.number, noteCount: revision.noteCount })
    .from(revision)
    .where(inArray(revision.takeId, takeIds))
    .orderBy(desc(revision.number));
  for (const r of revs) if (!out.has(r.takeId)) out.set(r.takeId, r.noteCount);
  const drafts = await db()
    .select({ takeId: draft.takeId, noteCount: draft.noteCount })
    .from(draft)
    .innerJoin(analysis, eq(analysis.id, draft.analysisId))
    .where(inArray(draft.takeId, takeIds))
    .orderBy(desc(analysis.createdAt));
  for (const d of drafts) if (!out.has(d.takeId)) out.set(d.takeId, d.noteCount);
  return out;
}

function toDto(row: TakeRow, latest: AnalysisDto | null, noteCount: number | null): TakeDto {
  return {
    id: row.id,
    projectId: row.projectId,
    name: row.name,
    durationSec: row.durationSec,
    sampleRateHz: row.sampleRateHz,
    channels: row.channels,
    originalMime: row.originalMime,
    originalBytes: row.originalBytes,
    createdAt: row.createdAt.toISOString(),
    analysis: latest,
    noteCount,
  };
}

export async function listTakes(studioId: string, projectId: string): Promise<TakeDto[]> {
  const rows = await db()
    .select(takeColumns)
    .from(take)
    .where(and(eq(take.studioId, studioId), eq(take.projectId, projectId)))
    .orderBy(desc(take.createdAt));
  const ids = rows.map((r) => r.id);
  const [counts, analyses] = await Promise.all([noteCounts(ids), latestAnalyses(ids)]);
  return rows.map((r) => toDto(r, analyses.get(r.id) ?? null, counts.get(r.id) ?? null));
}

/** The take's row in the studio, or 404 (another studio's take does not exist for the caller). */
export async function getTakeRow(studioId: string, takeId: string): Promise<TakeRow> {
  const [row] = await db()
    .select(takeColumns)
    .from(take)
    .where(and(eq(take.id, takeId), eq(take.studioId, studioId)));
  if (!row) throw notFound("This take");
  return row;
}

export async function getTake(studioId: string, takeId: string): Promise<TakeDto> {
  const row = await getTakeRow(studioId, takeId);
  const counts = await noteCounts([row.id]);
  return toDto(row, (await latestAnalysis(row.id)) ?? null, counts.get(row.id) ?? null);
}

export type NewTake = {
  studioId: string;
  projectId: string;
  name: string;
  createdByUserId: string;
  original: { bytes: Uint8Array; ext: string; mime: string };
  /** The WAV/FLAC the engine reads; omitted when the original is one. */
  analysisFile?: { bytes: Uint8Array; ext: string };
  decoded: { durationSec: number; sampleRateHz: number; channels: number };
  settings: unknown;
};

/**
 * Stores the files, then inserts the take and its first analysis in one transaction.
 * If anything fails, the files are removed again: no orphan rows or files.
 */
export async function createTake(input: NewTake): Promise<{ take: TakeDto; analysis: AnalysisDto }> {
  const id = newId();
  try {
    const original = await storeFile(id, "original", input.original.ext, input.original.bytes);
    const forAnalysis = input.analysisFile ? await storeFile(id, "analysis", input.analysisFile.ext, input.analysisFile.bytes) : original;
    const queued = await db().transaction(async (tx) => {
      const [p] = await tx
        .select({ id: project.id })
        .from(project)
        .where(and(eq(project.id, input.projectId), eq(project.studioId, input.studioId)));
      if (!p) throw notFound("This project");
      await tx.insert(take).values({
        id,
        studioId: input.studioId,
        projectId: input.projectId,
        name: input.name,
        originalKey: original.key,
        originalMime: input.original.mime,
        originalBytes: input.original.bytes.byteLength,
        originalSha256: original.sha256,
        analysisKey: forAnalysis.key,
        durationSec: input.decoded.durationSec,
        sampleRateHz: input.decoded.sampleRateHz,
        channels: input.decoded.channels,
        createdByUserId: input.createdByUserId,
      });
      await tx.update(project).set({ updatedAt: new Date() }).where(eq(project.id, input.projectId));
      return enqueueAnalysis(tx, { takeId: id, studioId: input.studioId, settings: input.settings, createdByUserId: input.createdByUserId });
    });
    return { take: await getTake(input.studioId, id), analysis: queued };
  } catch (e) {
    await deleteTakeFiles(id).catch(() => undefined);
    throw e;
  }
}

/** Deletes a take for good: its rows (analyses, drafts, revisions cascade) and then its files. */
export async function deleteTake(studioId: string, takeId: string): Promise<void> {
  const deleted = await db()
    .delete(take)
    .where(and(eq(take.id, takeId), eq(take.studioId, studioId)))
    .returning({ id: take.id });
  if (deleted.length === 0) throw notFound("This take");
  await deleteTakeFiles(takeId);
}

export type TakeNotes = {
  source: "draft" | "revision";
  revision?: number;
  analysisId?: string;
  referenceHz: number;
  notes: NoteDto[];
};

/** "The notes" of a take: the latest revision, else the latest ready draft; `revision: 0` is that draft; 404 while there is neither. */
export async function getTakeNotes(studioId: string, takeId: string, opts: { revision?: number } = {}): Promise<TakeNotes> {
  await getTakeRow(studioId, takeId);
  if (opts.revision === 0) return latestDraftNotes(takeId);
  const revQuery = db()
    .select({ number: revision.number, referenceHz: revision.referenceHz, notesJson: revision.notesJson })
    .from(revision)
    .where(opts.revision ? and(eq(revision.takeId, takeId), eq(revision.number, opts.revision)) : eq(revision.takeId, takeId))
    .orderBy(desc(revision.number))
    .limit(1);
  const [rev] = await revQuery;
  if (rev) return { source: "revision", revision: rev.number, referenceHz: rev.referenceHz, notes: JSON.parse(rev.notesJson) };
  if (opts.revision) throw notFound(`Revision ${opts.revision}`);
  return latestDraftNotes(takeId);
}

async function latestDraftNotes(takeId: string): Promise<TakeNotes> {
  const [d] = await db()
    .select({ analysisId: draft.analysisId, referenceHz: draft.referenceHz, notesJson: draft.notesJson })
    .from(draft)
    .innerJoin(analysis, eq(analysis.id, draft.analysisId))
    .where(eq(draft.takeId, takeId))
    .orderBy(desc(analysis.createdAt))
    .limit(1);
  if (!d) throw new AppError("not_found", "This take has no notes yet: its analysis is not ready.");
  return { source: "draft", analysisId: d.analysisId, referenceHz: d.referenceHz, notes: JSON.parse(d.notesJson) };
}

export type RevisionInfo = { number: number; noteCount: number; createdAt: string; createdBy: string | null };

/**
 * Saves corrected notes as revision n+1. `baseRevision` is the revision the edit started
 * from (0 = the draft); when it is not the latest, 409 — an edit is never silently lost.
 */
export async function saveRevision(
  studioId: string,
  takeId: string,
  input: { baseRevision: number; notes: NoteDto[]; referenceHz?: number },
  userId: string,
): Promise<RevisionInfo> {
  await getTakeRow(studioId, takeId);
  let referenceHz = input.referenceHz;
  if (referenceHz === undefined) {
    referenceHz = await getTakeNotes(studioId, takeId).then((n) => n.referenceHz, () => 440);
  }
  const refHz = referenceHz;
  const created = await db().transaction(async (tx) => {
    const [row] = await tx
      .select({ latest: sql<number>`coalesce(max(${revision.number}), 0)` })
      .from(revision)
      .where(eq(revision.takeId, takeId));
    const latest = Number(row?.latest ?? 0);
    if (input.baseRevision !== latest) {
      throw new AppError(
        "conflict",
        `This edit started from ${input.baseRevision === 0 ? "the draft" : `revision ${input.baseRevision}`}, but revision ${latest} has been saved since. Reload to see it.`,
      );
    }
    const number = latest + 1;
    const createdAt = new Date();
    await tx.insert(revision).values({
      id: newId(),
      takeId,
      number,
      referenceHz: refHz,
      notesJson: JSON.stringify(input.notes),
      noteCount: input.notes.length,
      createdByUserId: userId || null,
      createdAt,
    });
    return { number, noteCount: input.notes.length, createdAt: createdAt.toISOString(), createdBy: null };
  });
  return created;
}

export async function listRevisions(studioId: string, takeId: string): Promise<RevisionInfo[]> {
  await getTakeRow(studioId, takeId);
  const rows = await db()
    .select({ number: revision.number, noteCount: revision.noteCount, createdAt: revision.createdAt, createdByUserId: revision.createdByUserId })
    .from(revision)
    .where(eq(revision.takeId, takeId))
    .orderBy(desc(revision.number));
  return rows.map((r) => ({ number: r.number, noteCount: r.noteCount, createdAt: r.createdAt.toISOString(), createdBy: r.createdByUserId }));
}

export { conflict };

// ---- fast reads of "the notes" ---------------------------------------------------------------

const NOTES_CACHE_MAX = 256;
const notesCache = new Map<string, Uint8Array>();

/**
 * The GET /notes body as UTF-8 JSON bytes. One small query finds which revision or draft is "the
 * notes" now; the serialised body of that version is kept in a bounded in-process cache, so
 * repeated reads (players, scripts) parse, serialise and encode nothing (kept as bytes: encoding
 * the text again for every answer was a tenth of the server's time under load). A new revision
 * or draft has a new key, so the cache never serves stale notes. With `rows`, the same answer
 * with its notes as rows (lib/music/note-rows), for the take page's own HTML.
 */
export async function getTakeNotesBody(studioId: string, takeId: string, opts: { revision?: number; curves?: boolean; rows?: boolean } = {}): Promise<Uint8Array> {
  const [version] = await db()
    .select({
      // explicit aliases: unqualified column names inside a subquery would bind to the inner table
      latestRevision: sql<number | null>`(select max(r.number) from revision r where r.take_id = "take"."id")`,
      // through the take's analyses (analysis_take_idx), newest first, the first that has a draft
      latestDraft: sql<string | null>`(select a.id from analysis a join draft d on d.analysis_id = a.id where a.take_id = "take"."id" order by a.created_at desc limit 1)`,
    })
    .from(take)
    .where(and(eq(take.id, takeId), eq(take.studioId, studioId)));
  if (!version) throw notFound("This take");
  // a revision's notes never change; the draft's (revision 0 or no revision yet) change with each analysis
  const revisionKey = opts.revision ?? version.latestRevision ?? 0;
  const key = `${takeId}|${revisionKey}|${revisionKey === 0 ? (version.latestDraft ?? "") : ""}|${opts.curves ? 1 : 0}|${opts.rows ? 1 : 0}`;
  const hit = notesCache.get(key);
  if (hit !== undefined) {
    notesCache.delete(key);
    notesCache.set(key, hit); // most recently used last
    return hit;
  }
  const notes = await getTakeNotes(studioId, takeId, { revision: opts.revision });
  const answer = {
    source: notes.source,
    ...(notes.revision !== undefined ? { revision: notes.revision } : {}),
    referenceHz: notes.referenceHz,
    notes: opts.curves ? notes.notes : notes.notes.map(({ pitchCurve: _curve, ...n }) => n),
  };
  const body = new TextEncoder().encode(JSON.stringify(opts.rows ? toNoteRows(answer) : answer));
  notesCache.set(key, body);
  if (notesCache.size > NOTES_CACHE_MAX) notesCache.delete(notesCache.keys().next().value!);
  return body;
}
