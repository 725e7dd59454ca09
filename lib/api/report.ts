import "server-only";
import { draftReferenceSetting } from "@/db/analyses";
import { getTakeNotes } from "@/db/takes";
import { tuningReport } from "@/lib/music/tuning-report";

/**
 * The take's tuning report: the latest notes (or a revision), measured at the take's own
 * reference pitch (as analysed) or at one the teacher sets.
 */
export async function buildTuningReport(studioId: string, takeId: string, opts: { referenceHz?: number; revision?: number } = {}) {
  const notes = await getTakeNotes(studioId, takeId, { revision: opts.revision });
  const referenceHz = opts.referenceHz ?? notes.referenceHz;
  const report = tuningReport(notes.notes, referenceHz);
  // the take's own reference: the engine's estimate, unless the analysis was told the pitch
  const setting = await draftReferenceSetting(takeId);
  const takeReferenceSource: "estimated" | "set" = typeof setting === "number" ? "set" : "estimated";
  return { ...report, estimatedReferenceHz: notes.referenceHz, takeReferenceSource, source: notes.source, revision: notes.revision };
}
