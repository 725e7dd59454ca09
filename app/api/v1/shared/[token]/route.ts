import { NextResponse } from "next/server";
import { listComments, resolveShareToken } from "@/db/teaching";
import { getTakeNotes, getTakeRow } from "@/db/takes";
import { buildTuningReport } from "@/lib/api/report";
import { route } from "@/lib/api/respond";

type Ctx = { params: Promise<{ token: string }> };

/** The read-only replay of one take behind a share link; no account needed. */
export const GET = route(async (_request, { params }: Ctx) => {
  const { takeId, studioId } = await resolveShareToken((await params).token);
  const take = await getTakeRow(studioId, takeId);
  const [notes, report, comments] = await Promise.all([
    getTakeNotes(studioId, takeId),
    buildTuningReport(studioId, takeId),
    listComments(takeId),
  ]);
  return NextResponse.json(
    {
      take: { name: take.name, durationSec: take.durationSec },
      referenceHz: notes.referenceHz,
      notes: notes.notes,
      report,
      comments: comments.map(({ authorUserId: _a, ...c }) => ({ ...c, mine: false })),
    },
    { headers: { "cache-control": "private, no-store", "referrer-policy": "no-referrer" } },
  );
});
