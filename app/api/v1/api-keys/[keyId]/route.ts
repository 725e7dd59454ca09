import { NextResponse } from "next/server";
import { revokeApiKey } from "@/db/api-keys";
import { route } from "@/lib/api/respond";
import { requireActor, requireRole } from "@/lib/auth/actor";

type Ctx = { params: Promise<{ keyId: string }> };

export const DELETE = route(async (request, { params }: Ctx) => {
  const actor = await requireActor(request);
  requireRole(actor, "manageApiKeys");
  await revokeApiKey(actor.studioId, (await params).keyId);
  return new NextResponse(null, { status: 204 });
});
