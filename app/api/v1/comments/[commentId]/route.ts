import { NextResponse } from "next/server";
import { deleteComment, getComment } from "@/db/teaching";
import { route } from "@/lib/api/respond";
import { requireActor, requireRole } from "@/lib/auth/actor";
import { can } from "@/lib/auth/permissions";
import { forbidden } from "@/lib/errors";

type Ctx = { params: Promise<{ commentId: string }> };

/** Authors delete their own comments; editors delete any (with its replies). */
export const DELETE = route(async (request, { params }: Ctx) => {
  const actor = await requireActor(request);
  const found = await getComment(actor.studioId, (await params).commentId);
  requireRole(actor, "read");
  if (found.authorUserId !== actor.user.id && !can(actor.role, "edit")) throw forbidden("Only the author or a teacher may delete this comment.");
  await deleteComment(found.id);
  return new NextResponse(null, { status: 204 });
});
