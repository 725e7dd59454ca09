import { NextResponse } from "next/server";
import { createShareLink, listShareLinks } from "@/db/teaching";
import { getTakeRow } from "@/db/takes";
import { parseJson, route } from "@/lib/api/respond";
import { requireActor, requireRole } from "@/lib/auth/actor";
import { appUrl } from "@/lib/env";
import { newShareLinkSchema } from "@/lib/schemas/comments";

type Ctx = { params: Promise<{ takeId: string }> };

export const GET = route(async (request, { params }: Ctx) => {
  const actor = await requireActor(request);
  const take = await getTakeRow(actor.studioId, (await params).takeId);
  requireRole(actor, "edit");
  return NextResponse.json({ shareLinks: await listShareLinks(take.id) });
});

/** A signed, expiring, revocable read-only link to this take; the URL is returned once. */
export const POST = route(async (request, { params }: Ctx) => {
  const actor = await requireActor(request);
  const take = await getTakeRow(actor.studioId, (await params).takeId);
  requireRole(actor, "edit");
  const { expiresInDays } = await parseJson(request, newShareLinkSchema);
  const { link, token } = await createShareLink(take.id, expiresInDays, actor.user.id);
  return NextResponse.json({ shareLink: link, url: `${appUrl()}/share/${token}` }, { status: 201 });
});
