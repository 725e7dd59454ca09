import { NextResponse } from "next/server";
import { getAnalysis, requestCancel } from "@/db/analyses";
import { route } from "@/lib/api/respond";
import { requireActor, requireRole } from "@/lib/auth/actor";

type Ctx = { params: Promise<{ analysisId: string }> };

export const POST = route(async (request, { params }: Ctx) => {
  const actor = await requireActor(request);
  const { analysisId } = await params;
  await getAnalysis(actor.studioId, analysisId);
  requireRole(actor, "edit");
  const analysis = await requestCancel(actor.studioId, analysisId);
  return NextResponse.json({ analysis });
});
