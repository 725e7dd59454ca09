import { NextResponse } from "next/server";
import { listRevisions } from "@/db/takes";
import { route } from "@/lib/api/respond";
import { requireActor, requireRole } from "@/lib/auth/actor";

type Ctx = { params: Promise<{ takeId: string }> };

export const GET = route(async (request, { params }: Ctx) => {
  const actor = await requireActor(request);
  const revisions = await listRevisions(actor.studioId, (await params).takeId);
  requireRole(actor, "read");
  return NextResponse.json({ revisions });
});
