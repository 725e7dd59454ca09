import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { getProject } from "@/db/projects";
import { getTake, getTakeNotesBody } from "@/db/takes";
import { CreateStudioCard } from "@/components/studio/CreateStudioCard";
import { TakePageData, type TakePageInitial } from "@/components/takes/TakePageData";
import { TakeView } from "@/components/takes/TakeView";
import type { Actor } from "@/lib/auth/actor";
import { pageCan, requirePageActor } from "@/lib/auth/page";
import { isAppError } from "@/lib/errors";

export const metadata: Metadata = { title: "Take" };

export default async function TakePage({ params }: { params: Promise<{ projectId: string; takeId: string }> }) {
  const { projectId, takeId } = await params;
  const actor = await requirePageActor(`/projects/${projectId}/takes/${takeId}`);
  if (!actor.studioId) return <CreateStudioCard />;
  const [project, initial] = await Promise.all([
    getProject(actor.studioId, projectId).catch((e) => {
      if (isAppError(e) && e.code === "not_found") notFound();
      throw e;
    }),
    takePageInitial(actor, actor.studioId, takeId),
  ]);
  return (
    <TakePageData takeId={takeId} initial={initial}>
      <TakeView projectId={project.id} projectName={project.name} takeId={takeId} canEdit={pageCan(actor, "edit")} canExport={pageCan(actor, "export")} canBuy={pageCan(actor, "bill")} />
    </TakePageData>
  );
}

/**
 * The take and its notes (with pitch curves) in the page itself, as the API would answer them,
 * so the piano roll does not wait for the browser to ask after hydration. Null when the take is
 * not there (the page then asks the API and shows its answer).
 */
async function takePageInitial(actor: Actor, studioId: string, takeId: string): Promise<TakePageInitial | null> {
  if (!pageCan(actor, "read")) return null;
  const missing = (e: unknown) => {
    if (isAppError(e) && e.code === "not_found") return null;
    throw e;
  };
  const [take, curves] = await Promise.all([getTake(studioId, takeId).catch(missing), getTakeNotesBody(studioId, takeId, { curves: true, rows: true }).then((b) => new TextDecoder().decode(b)).catch(missing)]);
  if (!take) return null;
  return { at: Date.now(), take: JSON.stringify({ take, analysis: take.analysis }), curves };
}
