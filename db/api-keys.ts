import "server-only";
import { and, desc, eq, isNull } from "drizzle-orm";
import { db } from "./client";
import { newId, sha256Hex } from "./ids";
import { apiKey, studio, studioMember, user } from "./schema";
import { randomBytes } from "node:crypto";
import { notFound } from "@/lib/errors";
import { ROLE_RANK, type Role } from "@/lib/auth/permissions";

export type ApiKeyRow = { id: string; name: string; prefix: string; role: Role; createdAt: Date; lastUsedAt: Date | null; createdBy: string | null };

export async function listApiKeys(studioId: string): Promise<ApiKeyRow[]> {
  return db()
    .select({
      id: apiKey.id,
      name: apiKey.name,
      prefix: apiKey.prefix,
      role: apiKey.role,
      createdAt: apiKey.createdAt,
      lastUsedAt: apiKey.lastUsedAt,
      createdBy: user.name,
    })
    .from(apiKey)
    .leftJoin(user, eq(user.id, apiKey.createdByUserId))
    .where(and(eq(apiKey.studioId, studioId), isNull(apiKey.revokedAt)))
    .orderBy(desc(apiKey.createdAt));
}

/** Creates a key and returns it in full once; only its SHA-256 is kept. */
export async function createApiKey(studioId: string, name: string, role: Role, createdByUserId: string): Promise<{ row: ApiKeyRow; key: string }> {
  const key = `tn_${randomBytes(30).toString("base64url")}`;
  const id = newId();
  await db().insert(apiKey).values({ id, studioId, name, role, prefix: key.slice(0, 10), keyHash: sha256Hex(key), createdByUserId });
  const row = (await listApiKeys(studioId)).find((k) => k.id === id)!;
  return { row, key };
}

export async function revokeApiKey(studioId: string, id: string): Promise<void> {
  const done = await db()
    .update(apiKey)
    .set({ revokedAt: new Date() })
    .where(and(eq(apiKey.id, id), eq(apiKey.studioId, studioId), isNull(apiKey.revokedAt)))
    .returning({ id: apiKey.id });
  if (done.length === 0) throw notFound("This API key");
  forgetCachedKeys();
}

export type KeyActor = {
  keyId: string;
  keyName: string;
  studioId: string;
  studioName: string;
  /** The lower of the key's role and its creator's current role in the studio. */
  role: Role;
  user: { id: string; name: string; email: string; emailVerified: boolean };
};

const LAST_USED_EVERY_MS = 60_000;
const lastUsedWrites = new Map<string, number>();

// A short in-process cache of resolved keys: a script's burst of calls costs one lookup.
// Revoking through this process clears it at once; elsewhere a change shows within KEY_CACHE_MS.
const KEY_CACHE_MS = 5000;
const keyCache = new Map<string, { actor: KeyActor | null; until: number }>();
// lookups under way: when the cached entry runs out, a script's 200 waiting calls share one
const lookingUp = new Map<string, Promise<KeyActor | null>>();

export function forgetCachedKeys(): void {
  keyCache.clear();
  lookingUp.clear();
}

/** Resolves a bearer key; null when unknown, revoked, or its creator has left the studio. */
export async function resolveApiKey(key: string): Promise<KeyActor | null> {
  if (!/^tn_[A-Za-z0-9_-]{20,80}$/.test(key)) return null;
  const hash = sha256Hex(key);
  const cached = keyCache.get(hash);
  if (cached && cached.until > Date.now()) return cached.actor;
  const under = lookingUp.get(hash);
  if (under) return under;
  const lookup = lookUpApiKey(hash).then(
    (actor) => {
      if (lookingUp.get(hash) === lookup) {
        lookingUp.delete(hash);
        if (keyCache.size > 1000) keyCache.clear();
        keyCache.set(hash, { actor, until: Date.now() + KEY_CACHE_MS });
      }
      return actor;
    },
    (e: unknown) => {
      if (lookingUp.get(hash) === lookup) lookingUp.delete(hash);
      throw e;
    },
  );
  lookingUp.set(hash, lookup);
  return lookup;
}

async function lookUpApiKey(hash: string): Promise<KeyActor | null> {
  const [row] = await db()
    .select({
      keyId: apiKey.id,
      keyName: apiKey.name,
      studioId: apiKey.studioId,
      studioName: studio.name,
      keyRole: apiKey.role,
      memberRole: studioMember.role,
      userId: user.id,
      userName: user.name,
      userEmail: user.email,
    })
    .from(apiKey)
    .innerJoin(studio, eq(studio.id, apiKey.studioId))
    .innerJoin(studioMember, and(eq(studioMember.studioId, apiKey.studioId), eq(studioMember.userId, apiKey.createdByUserId)))
    .innerJoin(user, eq(user.id, studioMember.userId))
    .where(and(eq(apiKey.keyHash, hash), isNull(apiKey.revokedAt)));
  if (!row) return null;
  const role = ROLE_RANK[row.keyRole] <= ROLE_RANK[row.memberRole] ? row.keyRole : row.memberRole;
  const now = Date.now();
  if (now - (lastUsedWrites.get(row.keyId) ?? 0) > LAST_USED_EVERY_MS) {
    // at most one write a minute per key: a script's burst of reads must not turn into writes
    lastUsedWrites.set(row.keyId, now);
    void db().update(apiKey).set({ lastUsedAt: new Date(now) }).where(eq(apiKey.id, row.keyId)).catch(() => undefined);
  }
  return {
    keyId: row.keyId,
    keyName: row.keyName,
    studioId: row.studioId,
    studioName: row.studioName,
    role,
    user: { id: row.userId, name: row.userName, email: row.userEmail, emailVerified: true },
  };
}
