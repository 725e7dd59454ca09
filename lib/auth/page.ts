import "server-only";
import { headers } from "next/headers";
import { redirect } from "next/navigation";
import { cache } from "react";
import { actorFromHeaders, type Actor } from "./actor";
import { can, type Action } from "./permissions";

/** The request's actor, looked up once per server render (a layout and its page both ask). */
const requestActor = cache(async (): Promise<Actor | null> => actorFromHeaders(await headers()));

/** For signed-in pages: the actor, or a redirect to sign-in. */
export async function requirePageActor(nextPath: string): Promise<Actor> {
  const actor = await requestActor();
  if (!actor) redirect(`/sign-in?next=${encodeURIComponent(nextPath)}`);
  return actor;
}

/** The actor when signed in, else null (for pages that differ for guests). */
export async function optionalPageActor(): Promise<Actor | null> {
  return requestActor();
}

export function pageCan(actor: Actor, action: Action): boolean {
  return can(actor.role, action);
}

/** Only same-site paths may be used as a post-sign-in destination. */
export function safeNext(next: string | string[] | undefined, fallback = "/projects"): string {
  const value = Array.isArray(next) ? next[0] : next;
  return value && value.startsWith("/") && !value.startsWith("//") ? value : fallback;
}
