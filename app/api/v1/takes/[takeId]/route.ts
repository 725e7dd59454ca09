import { NextResponse } from "next/server";
import { deleteTake, getTake, getTakeRow } from "@/db/takes";
import { route } from "@/lib/api/respond";
import { requireActor, requireRole } from "@/lib/auth/actor";

type Ctx = { params: Promise<{ takeId: string }> };

export const GET = route(async (request, { params }: Ctx) => {
  const actor = await requireActor(request);
  const take = await getTake(actor.studioId, (await params).takeId);
  requireRole(actor, "read");
  return NextResponse.json({ take, analysis: take.analysis });
});

export const DELETE = route(async (request, { params }: Ctx) => {
  const actor = await requireActor(request);
  const { takeId } = await params;
  await getTakeRow(actor.studioId, takeId);
  requireRole(actor, "edit");
  await deleteTake(actor.studioId, takeId);
  return new NextResponse(null, { status: 204 });
});
