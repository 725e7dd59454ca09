import { NextResponse } from "next/server";
import { getProject } from "@/db/projects";
import { createTake, deleteTake, listTakes } from "@/db/takes";
import { route } from "@/lib/api/respond";
import { readUpload } from "@/lib/api/uploads";
import { requireActor, requireRole } from "@/lib/auth/actor";

type Ctx = { params: Promise<{ projectId: string }> };

export const GET = route(async (request, { params }: Ctx) => {
  const actor = await requireActor(request);
  const { projectId } = await params;
  await getProject(actor.studioId, projectId);
  requireRole(actor, "read");
  return NextResponse.json({ takes: await listTakes(actor.studioId, projectId) });
});

export const POST = route(async (request, { params }: Ctx) => {
  const actor = await requireActor(request);
  const { projectId } = await params;
  await getProject(actor.studioId, projectId);
  requireRole(actor, "edit");
  const upload = await readUpload(request);
  // a client that cancelled (or went away) once its body was sent gets nothing kept: its take is
  // not made, or deleted again when the cancel came while it was being stored
  if (request.signal.aborted) return new Response(null, { status: 499 });
  const created = await createTake({ ...upload, studioId: actor.studioId, projectId, createdByUserId: actor.user.id });
  if (request.signal.aborted) {
    await deleteTake(actor.studioId, created.take.id);
    return new Response(null, { status: 499 });
  }
  return NextResponse.json(created, { status: 201 });
});
