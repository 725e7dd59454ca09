import { NextResponse } from "next/server";
import { createProject, listProjects } from "@/db/projects";
import { projectDto } from "@/lib/api/dto";
import { parseJson, route } from "@/lib/api/respond";
import { requireActor, requireRole } from "@/lib/auth/actor";
import { createProjectSchema } from "@/lib/schemas/project";

export const GET = route(async (request) => {
  const actor = await requireActor(request);
  requireRole(actor, "read");
  const projects = await listProjects(actor.studioId);
  return NextResponse.json({ projects: projects.map(projectDto) });
});

export const POST = route(async (request) => {
  const actor = await requireActor(request);
  requireRole(actor, "edit");
  const input = await parseJson(request, createProjectSchema);
  const project = await createProject(actor.studioId, input, actor.user.id);
  return NextResponse.json({ project: projectDto(project) }, { status: 201 });
});
