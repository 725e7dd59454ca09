import { NextResponse } from "next/server";
import { z } from "zod";
import { acceptInvitation } from "@/db/studios";
import { parseJson, route } from "@/lib/api/respond";
import { sessionUser, setActiveStudio } from "@/lib/auth/actor";
import { unauthorized } from "@/lib/errors";

/** Accepts an invitation for the signed-in user and makes its studio the active one. */
export const POST = route(async (request) => {
  const user = await sessionUser(request.headers);
  if (!user) throw unauthorized();
  const { token } = await parseJson(request, z.object({ token: z.string().min(10).max(200) }));
  const { studioId } = await acceptInvitation(token, user.id, user.email);
  const response = NextResponse.json({ studioId });
  setActiveStudio(response, studioId);
  return response;
});
