import { getTakeNotes, getTakeRow } from "@/db/takes";
import { spendCredits } from "@/db/credits";
import { downloadName, writeExport } from "@/lib/api/export";
import { route, validationError } from "@/lib/api/respond";
import { requireActor, requireRole } from "@/lib/auth/actor";
import { EXPORT_COST } from "@/lib/billing/plans";
import { exportQuerySchema } from "@/lib/schemas/export";

type Ctx = { params: Promise<{ takeId: string }> };

/**
 * Exports the take's notes (the latest revision, or ?revision=n). MIDI and MusicXML use
 * one export credit, inside the same transaction that writes the file; CSV is free.
 */
export const GET = route(async (request, { params }: Ctx) => {
  const actor = await requireActor(request);
  const take = await getTakeRow(actor.studioId, (await params).takeId);
  requireRole(actor, "export");
  const parsed = exportQuerySchema.safeParse(Object.fromEntries(new URL(request.url).searchParams));
  if (!parsed.success) throw validationError(parsed.error);
  const q = parsed.data;
  const notes = await getTakeNotes(actor.studioId, take.id, { revision: q.revision });
  const { result: file, balance } = await spendCredits(
    actor.studioId,
    EXPORT_COST[q.format],
    { userId: actor.user.id, takeId: take.id, detail: `${q.format.toUpperCase()} of “${take.name}”${notes.revision ? `, revision ${notes.revision}` : ", draft"}` },
    () => writeExport(notes.notes, take.name, q),
  );
  return new Response(file.bytes as BodyInit, {
    status: 200,
    headers: {
      "content-type": file.contentType,
      "content-disposition": `attachment; filename="${downloadName(take.name, notes.revision, file.extension)}"`,
      "x-tapernote-credits-left": String(balance.balance),
      "cache-control": "no-store",
    },
  });
});
