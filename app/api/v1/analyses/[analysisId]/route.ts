import { NextResponse } from "next/server";
import { getAnalysis } from "@/db/analyses";
import { route } from "@/lib/api/respond";
import { requireActor, requireRole } from "@/lib/auth/actor";

type Ctx = { params: Promise<{ analysisId: string }> };

export const GET = route(async (request, { params }: Ctx) => {
  const actor = await requireActor(request);
  const analysis = await getAnalysis(actor.studioId, (await params).analysisId);
  requireRole(actor, "read");
  return NextResponse.json({ analysis });
});
