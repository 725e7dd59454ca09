import { NextResponse } from "next/server";
import { createStudio } from "@/db/studios";
import { parseJson, route } from "@/lib/api/respond";
import { sessionUser, setActiveStudio } from "@/lib/auth/actor";
import { unauthorized } from "@/lib/errors";
import { studioNameSchema } from "@/lib/schemas/members";

/** Any signed-in person may found a studio; they become its owner and act in it. */
export const POST = route(async (request) => {
  const user = await sessionUser(request.headers);
  if (!user) throw unauthorized();
  const { name } = await parseJson(request, studioNameSchema);
  const studio = await createStudio(name, user.id);
  const response = NextResponse.json({ studio, role: "owner" }, { status: 201 });
  setActiveStudio(response, studio.id);
  return response;
});
