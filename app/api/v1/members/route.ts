import { NextResponse } from "next/server";
import { listMembers } from "@/db/studios";
import { memberDto } from "@/lib/api/dto";
import { route } from "@/lib/api/respond";
import { requireActor, requireRole } from "@/lib/auth/actor";

export const GET = route(async (request) => {
  const actor = await requireActor(request);
  requireRole(actor, "read");
  const members = await listMembers(actor.studioId);
  return NextResponse.json({ members: members.map(memberDto) });
});
