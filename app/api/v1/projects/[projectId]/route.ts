import { NextResponse } from "next/server";
import { deleteProject, getProject, updateProject } from "@/db/projects";
import { projectDto } from "@/lib/api/dto";
import { parseJson, route } from "@/lib/api/respond";
import { requireActor, requireRole } from "@/lib/auth/actor";
import { updateProjectSchema } from "@/lib/schemas/project";

type Ctx = { params: Promise<{ projectId: string }> };

export const GET = route(async (request, { params }: Ctx) => {
  const actor = await requireActor(request);
  requireRole(actor, "read");
  const project = await getProject(actor.studioId, (await params).projectId);
  return NextResponse.json({ project: projectDto(project) });
});

export const PATCH = route(async (request, { params }: Ctx) => {
  const actor = await requireActor(request);
  const { projectId } = await params;
  await getProject(actor.studioId, projectId); // another studio's project is 404 before any role check
  requireRole(actor, "edit");
  const input = await parseJson(request, updateProjectSchema);
  const project = await updateProject(actor.studioId, projectId, input);
  return NextResponse.json({ project: projectDto(project) });
});

export const DELETE = route(async (request, { params }: Ctx) => {
  const actor = await requireActor(request);
  const { projectId } = await params;
  await getProject(actor.studioId, projectId);
  requireRole(actor, "edit");
  await deleteProject(actor.studioId, projectId);
  return new NextResponse(null, { status: 204 });
});
