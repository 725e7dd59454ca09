import { NextResponse } from "next/server";
import { getProject } from "@/db/projects";
import { createTake, listTakes } from "@/db/takes";
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
  const created = await createTake({ ...upload, studioId: actor.studioId, projectId, createdByUserId: actor.user.id });
  return NextResponse.json(created, { status: 201 });
});
