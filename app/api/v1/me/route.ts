import { NextResponse } from "next/server";
import { route } from "@/lib/api/respond";
import { sessionUser } from "@/lib/auth/actor";
import { unauthorized } from "@/lib/errors";

export const GET = route(async (request) => {
  const user = await sessionUser(request.headers);
  if (!user) throw unauthorized();
  return NextResponse.json({ user });
});
