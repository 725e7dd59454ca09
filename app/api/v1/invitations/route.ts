import { NextResponse } from "next/server";
import { createInvitation, listPendingInvitations } from "@/db/studios";
import { invitationDto } from "@/lib/api/dto";
import { parseJson, route } from "@/lib/api/respond";
import { requireActor, requireRole } from "@/lib/auth/actor";
import { appUrl } from "@/lib/env";
import { sendMail } from "@/lib/mail/mailer";
import { invitationMail } from "@/lib/mail/templates";
import { ROLE_LABEL } from "@/lib/auth/permissions";
import { inviteSchema } from "@/lib/schemas/members";

export const GET = route(async (request) => {
  const actor = await requireActor(request);
  requireRole(actor, "manageMembers");
  const invitations = await listPendingInvitations(actor.studioId);
  return NextResponse.json({ invitations: invitations.map(invitationDto) });
});

export const POST = route(async (request) => {
  const actor = await requireActor(request);
  requireRole(actor, "manageMembers");
  const { email, role } = await parseJson(request, inviteSchema);
  const { invitation, token } = await createInvitation(actor.studioId, email, role, actor.user.id);
  const url = `${appUrl()}/invitations/${encodeURIComponent(token)}`;
  await sendMail({ to: email, ...invitationMail(actor.studioName, actor.user.name, ROLE_LABEL[role].toLowerCase(), url) });
  return NextResponse.json({ invitation: invitationDto(invitation) }, { status: 201 });
});
