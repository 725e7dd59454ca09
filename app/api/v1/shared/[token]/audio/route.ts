import { resolveShareToken } from "@/db/teaching";
import { getTakeRow } from "@/db/takes";
import { audioResponse } from "@/lib/api/audio";
import { route } from "@/lib/api/respond";

type Ctx = { params: Promise<{ token: string }> };

export const GET = route(async (request, { params }: Ctx) => {
  const { takeId, studioId } = await resolveShareToken((await params).token);
  return audioResponse(request, await getTakeRow(studioId, takeId));
});
