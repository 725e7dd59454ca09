import { NextResponse } from "next/server";
import { getTakeNotesBody, getTakeRow, saveRevision } from "@/db/takes";
import { parseJson, route } from "@/lib/api/respond";
import { requireActor, requireRole } from "@/lib/auth/actor";
import { AppError } from "@/lib/errors";
import { putNotesSchema } from "@/lib/schemas/notes";

type Ctx = { params: Promise<{ takeId: string }> };

export const GET = route(async (request, { params }: Ctx) => {
  const actor = await requireActor(request);
  const url = new URL(request.url);
  const rev = url.searchParams.get("revision");
  // revision=0 is the latest ready draft (the engine's notes), even when revisions exist
  if (rev !== null && !/^(0|[1-9][0-9]*)$/.test(rev)) throw new AppError("bad_request", "revision must be a whole number (0 = the analysis's draft).");
  requireRole(actor, "read");
  const body = await getTakeNotesBody(actor.studioId, (await params).takeId, {
    revision: rev === null ? undefined : Number(rev),
    curves: url.searchParams.get("curves") === "1",
  });
  return new Response(body as BodyInit, { headers: { "content-type": "application/json", "content-length": String(body.byteLength) } });
});

/** Saves corrected notes as the next revision; 409 when baseRevision is not the latest. */
export const PUT = route(async (request, { params }: Ctx) => {
  const actor = await requireActor(request);
  const { takeId } = await params;
  await getTakeRow(actor.studioId, takeId);
  requireRole(actor, "edit");
  const input = await parseJson(request, putNotesSchema);
  const revision = await saveRevision(actor.studioId, takeId, input, actor.user.id);
  return NextResponse.json({ revision }, { status: 201 });
});
