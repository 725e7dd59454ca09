import type { Metadata } from "next";
import { ProjectsView } from "@/components/projects/ProjectsView";
import { CreateStudioCard } from "@/components/studio/CreateStudioCard";
import { pageCan, requirePageActor } from "@/lib/auth/page";

export const metadata: Metadata = { title: "Projects" };

export default async function ProjectsPage() {
  const actor = await requirePageActor("/projects");
  if (!actor.studioId) return <CreateStudioCard />;
  return <ProjectsView studioName={actor.studioName} canEdit={pageCan(actor, "edit")} />;
}
