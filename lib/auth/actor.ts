import "server-only";
import { auth } from "./auth";
import { can, type Action, type Role } from "./permissions";
import { resolveApiKey } from "@/db/api-keys";
import { getMembership, listMemberships, type Membership } from "@/db/studios";
import { AppError, forbidden, unauthorized } from "@/lib/errors";
import { isProductionEnv } from "@/lib/env";

/** The cookie that names the studio chosen in the studio switcher. */
export const ACTIVE_STUDIO_COOKIE = "tapernote_studio";

export type SessionUser = { id: string; name: string; email: string; emailVerified: boolean };

/** Who is asking and in which studio they act. */
export type Actor = {
  user: SessionUser;
  studioId: string;
  studioName: string;
  role: Role;
  memberId: string;
  memberships: Membership[];
  /** How the caller proved who they are; an API key acts only in its own studio. */
  via: "session" | "apiKey";
  apiKeyId?: string;
};

function cookieValue(headers: Headers, name: string): string | undefined {
  const header = headers.get("cookie");
  if (!header) return undefined;
  for (const part of header.split(";")) {
    const eq = part.indexOf("=");
    if (eq < 0) continue;
    if (part.slice(0, eq).trim() === name) return decodeURIComponent(part.slice(eq + 1).trim());
  }
  return undefined;
}

export async function sessionUser(headers: Headers): Promise<SessionUser | null> {
  const session = await auth().api.getSession({ headers });
  if (!session) return null;
  const { id, name, email, emailVerified } = session.user;
  return { id, name, email, emailVerified };
}

/**
 * The caller's actor: the signed-in user in their active studio (the switcher's
 * cookie when it names one of their studios, else their first studio).
 * Returns null when signed out; `studioId` is "" when the user has no studio.
 */
export async function actorFromHeaders(headers: Headers): Promise<Actor | null> {
  const user = await sessionUser(headers);
  if (!user) return null;
  const wanted = cookieValue(headers, ACTIVE_STUDIO_COOKIE);
  const memberships = await listMemberships(user.id);
  const active = (wanted && memberships.find((m) => m.studioId === wanted)) || memberships[0];
  if (!active) return { user, studioId: "", studioName: "", role: "listener", memberId: "", memberships, via: "session" };
  return { user, studioId: active.studioId, studioName: active.studioName, role: active.role, memberId: active.memberId, memberships, via: "session" };
}

/**
 * The actor of an API request: a studio API key (`Authorization: Bearer tn_…`) or the
 * browser session. 401 when neither is valid, 404 when the user belongs to no studio.
 */
export async function requireActor(request: Request): Promise<Actor> {
  const authorization = request.headers.get("authorization");
  if (authorization) {
    const match = authorization.match(/^Bearer\s+(\S+)$/i);
    const key = match ? await resolveApiKey(match[1]!) : null;
    if (!key) throw new AppError("unauthorized", "This API key is not valid (unknown, revoked, or its creator left the studio).");
    return {
      user: key.user,
      studioId: key.studioId,
      studioName: key.studioName,
      role: key.role,
      memberId: "",
      memberships: [{ studioId: key.studioId, studioName: key.studioName, role: key.role, memberId: "" }],
      via: "apiKey",
      apiKeyId: key.keyId,
    };
  }
  const actor = await actorFromHeaders(request.headers);
  if (!actor) throw unauthorized();
  if (!actor.studioId) throw new AppError("not_found", "You are not a member of any studio yet.");
  return actor;
}

/** Throws 403 unless the actor's role allows the action (see permissions.ts). */
export function requireRole(actor: Actor, action: Action): void {
  if (!can(actor.role, action)) throw forbidden();
}

/** True when the user is a member of the studio (for switching studios). */
export async function isMember(userId: string, studioId: string): Promise<boolean> {
  return (await getMembership(userId, studioId)) !== null;
}

/** Makes a studio the one the browser session acts in (the studio switcher's cookie). */
export function setActiveStudio(response: { cookies: { set: (name: string, value: string, options: object) => unknown } }, studioId: string): void {
  response.cookies.set(ACTIVE_STUDIO_COOKIE, studioId, {
    httpOnly: true,
    sameSite: "lax",
    secure: isProductionEnv(),
    path: "/",
    maxAge: 60 * 60 * 24 * 365,
  });
}
