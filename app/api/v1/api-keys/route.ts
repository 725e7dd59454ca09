import { NextResponse } from "next/server";
import { z } from "zod";
import { createApiKey, listApiKeys } from "@/db/api-keys";
import { parseJson, route } from "@/lib/api/respond";
import { requireActor, requireRole } from "@/lib/auth/actor";
import { ROLE_RANK } from "@/lib/auth/permissions";
import { AppError, forbidden } from "@/lib/errors";
import { roleSchema } from "@/lib/schemas/members";

const keyDto = (k: Awaited<ReturnType<typeof listApiKeys>>[number]) => ({
  id: k.id,
  name: k.name,
  prefix: k.prefix,
  role: k.role,
  createdAt: k.createdAt.toISOString(),
  lastUsedAt: k.lastUsedAt?.toISOString(),
  createdBy: k.createdBy ?? undefined,
});

export const GET = route(async (request) => {
  const actor = await requireActor(request);
  requireRole(actor, "manageApiKeys");
  return NextResponse.json({ apiKeys: (await listApiKeys(actor.studioId)).map(keyDto) });
});

export const POST = route(async (request) => {
  const actor = await requireActor(request);
  requireRole(actor, "manageApiKeys");
  if (actor.via === "apiKey") throw forbidden("API keys are created in the browser, not with another key.");
  const input = await parseJson(
    request,
    z.object({ name: z.string().trim().min(1, "Give the key a name.").max(80, "Keep the name to 80 characters or fewer."), role: roleSchema }),
  );
  if (ROLE_RANK[input.role] > ROLE_RANK[actor.role]) {
    throw new AppError("forbidden", "A key cannot have a higher role than yours.", { role: ["Higher than your own role."] });
  }
  const { row, key } = await createApiKey(actor.studioId, input.name, input.role, actor.user.id);
  return NextResponse.json({ apiKey: keyDto(row), key }, { status: 201 });
});
