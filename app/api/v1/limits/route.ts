import { NextResponse } from "next/server";
import { route } from "@/lib/api/respond";
import { uploadLimits } from "@/lib/config";
import { ACCEPTED_MIME_TYPES } from "@/lib/storage/sniff";

export const GET = route(async () => {
  const limits = uploadLimits();
  return NextResponse.json({ ...limits, acceptedTypes: ACCEPTED_MIME_TYPES });
});
