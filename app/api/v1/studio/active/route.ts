import { NextResponse } from "next/server";
import { z } from "zod";
import { getMembership } from "@/db/studios";
import { parseJson, route } from "@/lib/api/respond";
import { sessionUser, setActiveStudio } from "@/lib/auth/actor";
import { notFound, unauthorized } from "@/lib/errors";

/** Chooses the studio the browser session acts in (the studio switcher). */
export const PUT = route(async (request) => {
  const user = await sessionUser(request.headers);
  if (!user) throw unauthorized();
  const { studioId } = await parseJson(request, z.object({ studioId: z.string().min(1).max(100) }));
  const membership = await getMembership(user.id, studioId);
  if (!membership) throw notFound("This studio");
  const response = NextResponse.json({ studio: { id: membership.studioId, name: membership.studioName }, role: membership.role });
  setActiveStudio(response, membership.studioId);
  return response;
});
