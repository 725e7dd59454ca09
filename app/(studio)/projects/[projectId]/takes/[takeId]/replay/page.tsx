import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { getProject } from "@/db/projects";
import { CreateStudioCard } from "@/components/studio/CreateStudioCard";
import { MemberReplay } from "@/components/replay/MemberReplay";
import { pageCan, requirePageActor } from "@/lib/auth/page";
import { isAppError } from "@/lib/errors";

export const metadata: Metadata = { title: "Replay" };

export default async function ReplayPage({ params }: { params: Promise<{ projectId: string; takeId: string }> }) {
  const { projectId, takeId } = await params;
  const actor = await requirePageActor(`/projects/${projectId}/takes/${takeId}/replay`);
  if (!actor.studioId) return <CreateStudioCard />;
  const project = await getProject(actor.studioId, projectId).catch((e) => {
    if (isAppError(e) && e.code === "not_found") notFound();
    throw e;
  });
  return <MemberReplay projectId={project.id} projectName={project.name} takeId={takeId} canEdit={pageCan(actor, "edit")} />;
}
