import "server-only";
import { headers } from "next/headers";
import { redirect } from "next/navigation";
import { actorFromHeaders, type Actor } from "./actor";
import { can, type Action } from "./permissions";

/** For signed-in pages: the actor, or a redirect to sign-in. */
export async function requirePageActor(nextPath: string): Promise<Actor> {
  const actor = await actorFromHeaders(await headers());
  if (!actor) redirect(`/sign-in?next=${encodeURIComponent(nextPath)}`);
  return actor;
}

/** The actor when signed in, else null (for pages that differ for guests). */
export async function optionalPageActor(): Promise<Actor | null> {
  return actorFromHeaders(await headers());
}

export function pageCan(actor: Actor, action: Action): boolean {
  return can(actor.role, action);
}

/** Only same-site paths may be used as a post-sign-in destination. */
export function safeNext(next: string | string[] | undefined, fallback = "/projects"): string {
  const value = Array.isArray(next) ? next[0] : next;
  return value && value.startsWith("/") && !value.startsWith("//") ? value : fallback;
}
