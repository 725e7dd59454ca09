import { NextResponse } from "next/server";
import { changeMemberRole, listMembers, removeMember } from "@/db/studios";
import { memberDto } from "@/lib/api/dto";
import { parseJson, route } from "@/lib/api/respond";
import { requireActor, requireRole } from "@/lib/auth/actor";
import { notFound } from "@/lib/errors";
import { changeRoleSchema } from "@/lib/schemas/members";

type Ctx = { params: Promise<{ memberId: string }> };

async function memberInStudio(studioId: string, memberId: string) {
  const member = (await listMembers(studioId)).find((m) => m.id === memberId);
  if (!member) throw notFound("This member");
  return member;
}

export const PATCH = route(async (request, { params }: Ctx) => {
  const actor = await requireActor(request);
  const { memberId } = await params;
  await memberInStudio(actor.studioId, memberId);
  requireRole(actor, "manageMembers");
  const { role } = await parseJson(request, changeRoleSchema);
  const member = await changeMemberRole(actor.studioId, memberId, role);
  return NextResponse.json({ member: memberDto(member) });
});

export const DELETE = route(async (request, { params }: Ctx) => {
  const actor = await requireActor(request);
  const { memberId } = await params;
  await memberInStudio(actor.studioId, memberId);
  requireRole(actor, "manageMembers");
  await removeMember(actor.studioId, memberId);
  return new NextResponse(null, { status: 204 });
});
