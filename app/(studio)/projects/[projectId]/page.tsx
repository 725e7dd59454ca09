import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { getProject } from "@/db/projects";
import { ProjectTakesView } from "@/components/takes/ProjectTakesView";
import { Mono, PageHeader } from "@/components/ui";
import { CreateStudioCard } from "@/components/studio/CreateStudioCard";
import { pageCan, requirePageActor } from "@/lib/auth/page";
import { isAppError } from "@/lib/errors";

export const metadata: Metadata = { title: "Project" };

const dateFormat = new Intl.DateTimeFormat("en-GB", { dateStyle: "long" });

export default async function ProjectPage({ params }: { params: Promise<{ projectId: string }> }) {
  const { projectId } = await params;
  const actor = await requirePageActor(`/projects/${projectId}`);
  if (!actor.studioId) return <CreateStudioCard />;
  const project = await getProject(actor.studioId, projectId).catch((e) => {
    if (isAppError(e) && e.code === "not_found") notFound();
    throw e;
  });
  return (
    <div className="space-y-6">
      <p className="text-sm">
        <Link href="/projects" className="text-ink-muted underline-offset-2 hover:underline">← Projects</Link>
      </p>
      <PageHeader
        title={project.name}
        description={
          <>
            {project.description ? <span className="block">{project.description}</span> : null}
            <span className="text-sm">Created <Mono>{dateFormat.format(project.createdAt)}</Mono> in {actor.studioName}.</span>
          </>
        }
      />
      <ProjectTakesView projectId={project.id} canEdit={pageCan(actor, "edit")} />
    </div>
  );
}
