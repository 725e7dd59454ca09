import { NextResponse } from "next/server";
import { revokeInvitation } from "@/db/studios";
import { route } from "@/lib/api/respond";
import { requireActor, requireRole } from "@/lib/auth/actor";

type Ctx = { params: Promise<{ invitationId: string }> };

export const DELETE = route(async (request, { params }: Ctx) => {
  const actor = await requireActor(request);
  requireRole(actor, "manageMembers");
  await revokeInvitation(actor.studioId, (await params).invitationId);
  return new NextResponse(null, { status: 204 });
});
