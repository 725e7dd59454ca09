import { NextResponse } from "next/server";
import { addComment, listComments, listenerEmails } from "@/db/teaching";
import { getTakeRow } from "@/db/takes";
import { parseJson, route } from "@/lib/api/respond";
import { requireActor, requireRole } from "@/lib/auth/actor";
import { can } from "@/lib/auth/permissions";
import { appUrl } from "@/lib/env";
import { forbidden } from "@/lib/errors";
import { sendMail } from "@/lib/mail/mailer";
import { commentMail } from "@/lib/mail/templates";
import { newCommentSchema } from "@/lib/schemas/comments";

type Ctx = { params: Promise<{ takeId: string }> };

export const GET = route(async (request, { params }: Ctx) => {
  const actor = await requireActor(request);
  const take = await getTakeRow(actor.studioId, (await params).takeId);
  requireRole(actor, "read");
  const comments = await listComments(take.id);
  return NextResponse.json({ comments: comments.map(({ authorUserId, ...c }) => ({ ...c, mine: authorUserId === actor.user.id })) });
});

/** Editors comment on the take, a note or a range; listeners reply. New comments are e-mailed to the studio's listeners. */
export const POST = route(async (request, { params }: Ctx) => {
  const actor = await requireActor(request);
  const take = await getTakeRow(actor.studioId, (await params).takeId);
  requireRole(actor, "read");
  const input = await parseJson(request, newCommentSchema);
  if (!input.parentId && !can(actor.role, "edit")) throw forbidden("Listeners reply to comments; only teachers (editors) start a new one.");
  const created = await addComment(take.id, input, actor.user.id);
  const { authorUserId: _author, ...dto } = created;
  if (!input.parentId) {
    const url = `${appUrl()}/projects/${take.projectId}/takes/${take.id}/replay`;
    for (const listener of await listenerEmails(actor.studioId)) {
      if (listener.email === actor.user.email) continue;
      await sendMail({ to: listener.email, ...commentMail(actor.user.name, take.name, input.body, url) }).catch((e) => console.error("[comments] notice e-mail failed", e));
    }
  }
  return NextResponse.json({ comment: { ...dto, mine: true } }, { status: 201 });
});
