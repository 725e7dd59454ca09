import "server-only";
import { and, asc, eq, gt, sql } from "drizzle-orm";
import { db } from "./client";
import { newId, newToken, sha256Hex } from "./ids";
import { invitation, studio, studioMember, user } from "./schema";
import { AppError, conflict, notFound } from "@/lib/errors";
import type { Role } from "@/lib/auth/permissions";
import { forgetCachedKeys } from "./api-keys";

export const INVITATION_TTL_MS = 7 * 24 * 60 * 60 * 1000;

export type Membership = { studioId: string; studioName: string; role: Role; memberId: string };

export async function createStudio(name: string, ownerUserId: string): Promise<{ id: string; name: string }> {
  const id = newId();
  await db().batch([
    db().insert(studio).values({ id, name }),
    db().insert(studioMember).values({ id: newId(), studioId: id, userId: ownerUserId, role: "owner" }),
  ]);
  return { id, name };
}

/** The studio every new account starts with, named after its owner. */
export async function createPersonalStudio(userId: string, userName: string): Promise<void> {
  const name = userName.trim() ? `${userName.trim()}'s studio` : "My studio";
  await createStudio(name.slice(0, 80), userId);
}

export async function listMemberships(userId: string): Promise<Membership[]> {
  const rows = await db()
    .select({ studioId: studio.id, studioName: studio.name, role: studioMember.role, memberId: studioMember.id })
    .from(studioMember)
    .innerJoin(studio, eq(studio.id, studioMember.studioId))
    .where(eq(studioMember.userId, userId))
    .orderBy(asc(studio.name));
  return rows;
}

export async function getMembership(userId: string, studioId: string): Promise<Membership | null> {
  const [row] = await db()
    .select({ studioId: studio.id, studioName: studio.name, role: studioMember.role, memberId: studioMember.id })
    .from(studioMember)
    .innerJoin(studio, eq(studio.id, studioMember.studioId))
    .where(and(eq(studioMember.userId, userId), eq(studioMember.studioId, studioId)))
    .limit(1);
  return row ?? null;
}

export async function renameStudio(studioId: string, name: string): Promise<void> {
  await db().update(studio).set({ name }).where(eq(studio.id, studioId));
}

export type MemberRow = { id: string; userId: string; name: string; email: string; role: Role; joinedAt: Date };

export async function listMembers(studioId: string): Promise<MemberRow[]> {
  return db()
    .select({
      id: studioMember.id,
      userId: studioMember.userId,
      name: user.name,
      email: user.email,
      role: studioMember.role,
      joinedAt: studioMember.createdAt,
    })
    .from(studioMember)
    .innerJoin(user, eq(user.id, studioMember.userId))
    .where(eq(studioMember.studioId, studioId))
    .orderBy(asc(user.name));
}

async function ownerCount(tx: Pick<ReturnType<typeof db>, "select">, studioId: string): Promise<number> {
  const [row] = await tx
    .select({ n: sql<number>`count(*)` })
    .from(studioMember)
    .where(and(eq(studioMember.studioId, studioId), eq(studioMember.role, "owner")));
  return Number(row?.n ?? 0);
}

/** Changes a member's role; a studio always keeps at least one owner (checked inside the write transaction). */
export async function changeMemberRole(studioId: string, memberId: string, role: Role): Promise<MemberRow> {
  await db().transaction(async (tx) => {
    const [member] = await tx
      .select({ role: studioMember.role })
      .from(studioMember)
      .where(and(eq(studioMember.id, memberId), eq(studioMember.studioId, studioId)));
    if (!member) throw notFound("This member");
    if (member.role === "owner" && role !== "owner" && (await ownerCount(tx, studioId)) <= 1) {
      throw conflict("A studio needs at least one owner. Make someone else an owner first.");
    }
    await tx.update(studioMember).set({ role }).where(eq(studioMember.id, memberId));
  });
  forgetCachedKeys(); // a key never outranks its creator's current role
  const members = await listMembers(studioId);
  return members.find((m) => m.id === memberId)!;
}

/** Removes a member; the last owner cannot be removed (nor leave). */
export async function removeMember(studioId: string, memberId: string): Promise<void> {
  await db().transaction(async (tx) => {
    const [member] = await tx
      .select({ role: studioMember.role })
      .from(studioMember)
      .where(and(eq(studioMember.id, memberId), eq(studioMember.studioId, studioId)));
    if (!member) throw notFound("This member");
    if (member.role === "owner" && (await ownerCount(tx, studioId)) <= 1) {
      throw conflict("A studio needs at least one owner. Make someone else an owner first.");
    }
    await tx.delete(studioMember).where(eq(studioMember.id, memberId));
  });
  forgetCachedKeys();
}

export type InvitationRow = {
  id: string;
  email: string;
  role: Role;
  state: "pending" | "accepted" | "revoked";
  expiresAt: Date;
  createdAt: Date;
};

const invitationColumns = {
  id: invitation.id,
  email: invitation.email,
  role: invitation.role,
  state: invitation.state,
  expiresAt: invitation.expiresAt,
  createdAt: invitation.createdAt,
};

export async function listPendingInvitations(studioId: string): Promise<InvitationRow[]> {
  return db()
    .select(invitationColumns)
    .from(invitation)
    .where(and(eq(invitation.studioId, studioId), eq(invitation.state, "pending"), gt(invitation.expiresAt, new Date())))
    .orderBy(asc(invitation.createdAt));
}

/** Creates an invitation and returns its one-time token (only its hash is stored). */
export async function createInvitation(
  studioId: string,
  email: string,
  role: Role,
  invitedByUserId: string,
): Promise<{ invitation: InvitationRow; token: string }> {
  const normalised = email.trim().toLowerCase();
  const [existingMember] = await db()
    .select({ id: studioMember.id })
    .from(studioMember)
    .innerJoin(user, eq(user.id, studioMember.userId))
    .where(and(eq(studioMember.studioId, studioId), eq(user.email, normalised)));
  if (existingMember) {
    throw new AppError("conflict", "This person is already a member of the studio.", {
      email: ["Already a member of this studio."],
    });
  }
  const { token, tokenHash } = newToken();
  const id = newId();
  const expiresAt = new Date(Date.now() + INVITATION_TTL_MS);
  // A new invitation to the same address replaces an older pending one.
  await db().batch([
    db()
      .update(invitation)
      .set({ state: "revoked" })
      .where(and(eq(invitation.studioId, studioId), eq(invitation.email, normalised), eq(invitation.state, "pending"))),
    db().insert(invitation).values({ id, studioId, email: normalised, role, tokenHash, invitedByUserId, expiresAt }),
  ]);
  const [row] = await db().select(invitationColumns).from(invitation).where(eq(invitation.id, id));
  return { invitation: row!, token };
}

export async function revokeInvitation(studioId: string, invitationId: string): Promise<void> {
  const result = await db()
    .update(invitation)
    .set({ state: "revoked" })
    .where(and(eq(invitation.id, invitationId), eq(invitation.studioId, studioId), eq(invitation.state, "pending")))
    .returning({ id: invitation.id });
  if (result.length === 0) throw notFound("This invitation");
}

export type InvitationPreview = { studioName: string; email: string; role: Role; usable: boolean };

export async function previewInvitation(token: string): Promise<InvitationPreview | null> {
  const [row] = await db()
    .select({ studioName: studio.name, email: invitation.email, role: invitation.role, state: invitation.state, expiresAt: invitation.expiresAt })
    .from(invitation)
    .innerJoin(studio, eq(studio.id, invitation.studioId))
    .where(eq(invitation.tokenHash, sha256Hex(token)));
  if (!row) return null;
  return { studioName: row.studioName, email: row.email, role: row.role, usable: row.state === "pending" && row.expiresAt > new Date() };
}

/**
 * Accepts an invitation for a signed-in user whose e-mail matches: joins the studio
 * with the invited role (or keeps a higher role the user already has).
 */
export async function acceptInvitation(token: string, userId: string, userEmail: string): Promise<{ studioId: string }> {
  return db().transaction(async (tx) => {
    const [inv] = await tx.select().from(invitation).where(eq(invitation.tokenHash, sha256Hex(token)));
    if (!inv || inv.state !== "pending" || inv.expiresAt <= new Date()) {
      throw notFound("This invitation (it may have expired or been withdrawn)");
    }
    if (inv.email !== userEmail.trim().toLowerCase()) {
      throw new AppError("forbidden", `This invitation is for ${inv.email}. Sign in with that address to accept it.`);
    }
    const [existing] = await tx
      .select({ id: studioMember.id })
      .from(studioMember)
      .where(and(eq(studioMember.studioId, inv.studioId), eq(studioMember.userId, userId)));
    if (!existing) {
      await tx.insert(studioMember).values({ id: newId(), studioId: inv.studioId, userId, role: inv.role });
    }
    await tx.update(invitation).set({ state: "accepted", acceptedAt: new Date() }).where(eq(invitation.id, inv.id));
    return { studioId: inv.studioId };
  });
}
