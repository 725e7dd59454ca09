import { NextResponse } from "next/server";
import { z } from "zod";
import { getTakeRow } from "@/db/takes";
import { buildTuningReport } from "@/lib/api/report";
import { route, validationError } from "@/lib/api/respond";
import { requireActor, requireRole } from "@/lib/auth/actor";

type Ctx = { params: Promise<{ takeId: string }> };

const querySchema = z.object({
  referenceHz: z.coerce.number().min(380, "Between 380 and 500 Hz.").max(500, "Between 380 and 500 Hz.").optional(),
  revision: z.coerce.number().int().min(1).optional(),
});

/** Per-note and per-voice deviation from equal temperament and from just intervals; summary. */
export const GET = route(async (request, { params }: Ctx) => {
  const actor = await requireActor(request);
  const take = await getTakeRow(actor.studioId, (await params).takeId);
  requireRole(actor, "read");
  const q = querySchema.safeParse(Object.fromEntries(new URL(request.url).searchParams));
  if (!q.success) throw validationError(q.error);
  return NextResponse.json(await buildTuningReport(actor.studioId, take.id, q.data));
});
