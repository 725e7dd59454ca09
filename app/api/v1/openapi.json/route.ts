import { NextResponse } from "next/server";
import { openApiDocument } from "@/lib/api/openapi";
import { route } from "@/lib/api/respond";
import { appUrl } from "@/lib/env";

export const GET = route(async () => NextResponse.json(openApiDocument(appUrl())));
