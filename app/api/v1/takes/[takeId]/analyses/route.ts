import { NextResponse } from "next/server";
import { z } from "zod";
import { enqueueAnalysis, listAnalyses } from "@/db/analyses";
import { db } from "@/db/client";
import { getTakeRow } from "@/db/takes";
import { parseJson, route, validationError } from "@/lib/api/respond";
import { requireActor, requireRole } from "@/lib/auth/actor";
import { settingsSchema } from "@/lib/engine/settings";

type Ctx = { params: Promise<{ takeId: string }> };

export const GET = route(async (request, { params }: Ctx) => {
  const actor = await requireActor(request);
  const { takeId } = await params;
  await getTakeRow(actor.studioId, takeId);
  requireRole(actor, "read");
  return NextResponse.json({ analyses: await listAnalyses(takeId) });
});

/** Re-analyse with other settings: a new analysis each time; the old ones are kept. */
export const POST = route(async (request, { params }: Ctx) => {
  const actor = await requireActor(request);
  const { takeId } = await params;
  await getTakeRow(actor.studioId, takeId);
  requireRole(actor, "edit");
  const body = await parseJson(request, z.object({ settings: z.unknown().default({}) }));
  const checked = settingsSchema.safeParse(body.settings ?? {});
  if (!checked.success) throw validationError(checked.error);
  const analysis = await enqueueAnalysis(db(), { takeId, studioId: actor.studioId, settings: body.settings ?? {}, createdByUserId: actor.user.id });
  return NextResponse.json({ analysis }, { status: 202 });
});
