import { getTakeRow } from "@/db/takes";
import { route } from "@/lib/api/respond";
import { requireActor, requireRole } from "@/lib/auth/actor";
import { audioResponse } from "@/lib/api/audio";

type Ctx = { params: Promise<{ takeId: string }> };

/** The original recording, with byte ranges so the player can seek. */
export const GET = route(async (request, { params }: Ctx) => {
  const actor = await requireActor(request);
  const take = await getTakeRow(actor.studioId, (await params).takeId);
  requireRole(actor, "read");
  return audioResponse(request, take);
});
