import { NextResponse } from "next/server";
import { renameStudio } from "@/db/studios";
import { parseJson, route } from "@/lib/api/respond";
import { requireActor, requireRole } from "@/lib/auth/actor";
import { can, ACTIONS } from "@/lib/auth/permissions";
import { studioNameSchema } from "@/lib/schemas/members";

/** The active studio, the caller's role in it and what that role allows. */
export const GET = route(async (request) => {
  const actor = await requireActor(request);
  requireRole(actor, "read");
  return NextResponse.json({
    studio: { id: actor.studioId, name: actor.studioName },
    role: actor.role,
    allowed: ACTIONS.filter((a) => can(actor.role, a)),
    studios: actor.memberships.map((m) => ({ id: m.studioId, name: m.studioName, role: m.role })),
  });
});

export const PATCH = route(async (request) => {
  const actor = await requireActor(request);
  requireRole(actor, "manageMembers");
  const { name } = await parseJson(request, studioNameSchema);
  await renameStudio(actor.studioId, name);
  return NextResponse.json({ studio: { id: actor.studioId, name } });
});
