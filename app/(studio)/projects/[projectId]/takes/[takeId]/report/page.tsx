import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { getProject } from "@/db/projects";
import { CreateStudioCard } from "@/components/studio/CreateStudioCard";
import { ReportView } from "@/components/report/ReportView";
import { requirePageActor } from "@/lib/auth/page";
import { isAppError } from "@/lib/errors";

export const metadata: Metadata = { title: "Tuning report" };

export default async function TuningReportPage({ params }: { params: Promise<{ projectId: string; takeId: string }> }) {
  const { projectId, takeId } = await params;
  const actor = await requirePageActor(`/projects/${projectId}/takes/${takeId}/report`);
  if (!actor.studioId) return <CreateStudioCard />;
  const project = await getProject(actor.studioId, projectId).catch((e) => {
    if (isAppError(e) && e.code === "not_found") notFound();
    throw e;
  });
  return <ReportView projectId={project.id} projectName={project.name} takeId={takeId} />;
}
