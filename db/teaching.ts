import "server-only";
import { and, asc, desc, eq, gt, isNull } from "drizzle-orm";
import { db } from "./client";
import { newId, newToken, sha256Hex } from "./ids";
import { assignment, comment, shareLink, studioMember, take, user } from "./schema";
import { AppError, notFound } from "@/lib/errors";

// ---- assignments -------------------------------------------------------------------------

export type ExpectedNoteRow = { onsetSec: number; offsetSec: number; pitch: number; voice: number };
export type AssignmentInfo = { id: string; name: string; sourceFormat: "midi" | "musicxml" | "take"; noteCount: number; createdAt: string };

export async function setAssignment(
  takeId: string,
  input: { name: string; sourceFormat: AssignmentInfo["sourceFormat"]; notes: ExpectedNoteRow[] },
  userId: string,
): Promise<AssignmentInfo> {
  const row = {
    id: newId(),
    takeId,
    name: input.name,
    sourceFormat: input.sourceFormat,
    notesJson: JSON.stringify(input.notes),
    noteCount: input.notes.length,
    createdByUserId: userId || null,
    createdAt: new Date(),
  };
  await db()
    .insert(assignment)
    .values(row)
    .onConflictDoUpdate({ target: assignment.takeId, set: { id: row.id, name: row.name, sourceFormat: row.sourceFormat, notesJson: row.notesJson, noteCount: row.noteCount, createdByUserId: row.createdByUserId, createdAt: row.createdAt } });
  return { id: row.id, name: row.name, sourceFormat: row.sourceFormat, noteCount: row.noteCount, createdAt: row.createdAt.toISOString() };
}

export async function getAssignment(takeId: string): Promise<{ info: AssignmentInfo; notes: ExpectedNoteRow[] } | null> {
  const [row] = await db().select().from(assignment).where(eq(assignment.takeId, takeId));
  if (!row) return null;
  return {
    info: { id: row.id, name: row.name, sourceFormat: row.sourceFormat, noteCount: row.noteCount, createdAt: row.createdAt.toISOString() },
    notes: JSON.parse(row.notesJson),
  };
}

export async function deleteAssignment(takeId: string): Promise<void> {
  const done = await db().delete(assignment).where(eq(assignment.takeId, takeId)).returning({ id: assignment.id });
  if (done.length === 0) throw notFound("This take's assignment");
}

// ---- comments ----------------------------------------------------------------------------

export type CommentTarget =
  | { kind: "take" }
  | { kind: "note"; noteIndex: number; onsetSec: number; pitch: number }
  | { kind: "range"; startSec: number; endSec: number };

export type CommentDto = {
  id: string;
  parentId: string | null;
  author: { name: string };
  authorUserId: string | null;
  body: string;
  target: CommentTarget;
  createdAt: string;
};

export async function listComments(takeId: string): Promise<CommentDto[]> {
  const rows = await db()
    .select({ id: comment.id, parentId: comment.parentId, authorUserId: comment.authorUserId, name: user.name, body: comment.body, targetJson: comment.targetJson, createdAt: comment.createdAt })
    .from(comment)
    .leftJoin(user, eq(user.id, comment.authorUserId))
    .where(eq(comment.takeId, takeId))
    .orderBy(asc(comment.createdAt));
  return rows.map((r) => ({
    id: r.id,
    parentId: r.parentId,
    author: { name: r.name ?? "A former member" },
    authorUserId: r.authorUserId,
    body: r.body,
    target: JSON.parse(r.targetJson) as CommentTarget,
    createdAt: r.createdAt.toISOString(),
  }));
}

export async function addComment(takeId: string, input: { body: string; target: CommentTarget; parentId?: string }, userId: string): Promise<CommentDto> {
  if (input.parentId) {
    const [parent] = await db().select({ id: comment.id, parentId: comment.parentId }).from(comment).where(and(eq(comment.id, input.parentId), eq(comment.takeId, takeId)));
    if (!parent) throw new AppError("validation_failed", "The comment you reply to does not exist.", { parentId: ["No such comment on this take."] });
    // one level of replies: a reply to a reply joins the same thread
    input = { ...input, parentId: parent.parentId ?? parent.id };
  }
  const id = newId();
  await db().insert(comment).values({ id, takeId, parentId: input.parentId ?? null, authorUserId: userId, body: input.body, targetJson: JSON.stringify(input.target) });
  return (await listComments(takeId)).find((c) => c.id === id)!;
}

export async function getComment(studioId: string, commentId: string): Promise<{ id: string; takeId: string; authorUserId: string | null }> {
  const [row] = await db()
    .select({ id: comment.id, takeId: comment.takeId, authorUserId: comment.authorUserId })
    .from(comment)
    .innerJoin(take, eq(take.id, comment.takeId))
    .where(and(eq(comment.id, commentId), eq(take.studioId, studioId)));
  if (!row) throw notFound("This comment");
  return row;
}

export async function deleteComment(commentId: string): Promise<void> {
  await db().delete(comment).where(eq(comment.parentId, commentId));
  await db().delete(comment).where(eq(comment.id, commentId));
}

/** The e-mail addresses of the studio's listeners, for new-comment notices. */
export async function listenerEmails(studioId: string): Promise<{ email: string; name: string }[]> {
  return db()
    .select({ email: user.email, name: user.name })
    .from(studioMember)
    .innerJoin(user, eq(user.id, studioMember.userId))
    .where(and(eq(studioMember.studioId, studioId), eq(studioMember.role, "listener")));
}

// ---- share links -------------------------------------------------------------------------

export type ShareLinkDto = { id: string; expiresAt: string; createdAt: string; createdBy: string | null };

export async function createShareLink(takeId: string, expiresInDays: number, userId: string): Promise<{ link: ShareLinkDto; token: string }> {
  const { token, tokenHash } = newToken();
  const id = newId();
  const expiresAt = new Date(Date.now() + expiresInDays * 24 * 3600 * 1000);
  await db().insert(shareLink).values({ id, takeId, tokenHash, expiresAt, createdByUserId: userId || null });
  const link = (await listShareLinks(takeId)).find((l) => l.id === id)!;
  return { link, token };
}

export async function listShareLinks(takeId: string): Promise<ShareLinkDto[]> {
  const rows = await db()
    .select({ id: shareLink.id, expiresAt: shareLink.expiresAt, createdAt: shareLink.createdAt, name: user.name })
    .from(shareLink)
    .leftJoin(user, eq(user.id, shareLink.createdByUserId))
    .where(and(eq(shareLink.takeId, takeId), isNull(shareLink.revokedAt), gt(shareLink.expiresAt, new Date())))
    .orderBy(desc(shareLink.createdAt));
  return rows.map((r) => ({ id: r.id, expiresAt: r.expiresAt.toISOString(), createdAt: r.createdAt.toISOString(), createdBy: r.name }));
}

export async function revokeShareLink(studioId: string, id: string): Promise<void> {
  const [row] = await db()
    .select({ id: shareLink.id })
    .from(shareLink)
    .innerJoin(take, eq(take.id, shareLink.takeId))
    .where(and(eq(shareLink.id, id), eq(take.studioId, studioId), isNull(shareLink.revokedAt)));
  if (!row) throw notFound("This share link");
  await db().update(shareLink).set({ revokedAt: new Date() }).where(eq(shareLink.id, id));
}

/** The take a share token opens, or 404 when it is unknown, expired or revoked. One token opens one take. */
export async function resolveShareToken(token: string): Promise<{ takeId: string; studioId: string }> {
  if (!/^[A-Za-z0-9_-]{20,100}$/.test(token)) throw notFound("This link");
  const [row] = await db()
    .select({ takeId: shareLink.takeId, studioId: take.studioId, expiresAt: shareLink.expiresAt, revokedAt: shareLink.revokedAt })
    .from(shareLink)
    .innerJoin(take, eq(take.id, shareLink.takeId))
    .where(eq(shareLink.tokenHash, sha256Hex(token)));
  if (!row || row.revokedAt || row.expiresAt <= new Date()) throw notFound("This link (it may have expired or been withdrawn)");
  return { takeId: row.takeId, studioId: row.studioId };
}
