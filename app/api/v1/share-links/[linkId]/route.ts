import { NextResponse } from "next/server";
import { revokeShareLink } from "@/db/teaching";
import { route } from "@/lib/api/respond";
import { requireActor, requireRole } from "@/lib/auth/actor";

type Ctx = { params: Promise<{ linkId: string }> };

export const DELETE = route(async (request, { params }: Ctx) => {
  const actor = await requireActor(request);
  requireRole(actor, "edit");
  await revokeShareLink(actor.studioId, (await params).linkId);
  return new NextResponse(null, { status: 204 });
});
