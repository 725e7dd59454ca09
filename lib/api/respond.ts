import "server-only";
import { NextResponse } from "next/server";
import { z } from "zod";
import { AppError, isAppError, type FieldErrors } from "@/lib/errors";

export type ErrorBody = { error: { code: string; message: string; fields?: FieldErrors } };

/** The JSON error shape of the whole API: `{ error: { code, message, fields? } }`. */
export function errorResponse(e: AppError): NextResponse<ErrorBody> {
  const body: ErrorBody = { error: { code: e.code, message: e.message } };
  if (e.fields) body.error.fields = e.fields;
  return NextResponse.json(body, { status: e.status });
}

/** zod issues → per-field messages, keyed by the dotted path ("" for the form as a whole). */
export function fieldErrorsOf(error: z.ZodError): FieldErrors {
  const fields: FieldErrors = {};
  for (const issue of error.issues) {
    const key = issue.path.join(".");
    (fields[key] ??= []).push(issue.message);
  }
  return fields;
}

export function validationError(error: z.ZodError): AppError {
  return new AppError("validation_failed", "Some fields need attention.", fieldErrorsOf(error));
}

/** Reads and validates a JSON body; malformed JSON is 400, a body that fails the schema 422. */
export async function parseJson<S extends z.ZodType>(request: Request, schema: S): Promise<z.output<S>> {
  const type = request.headers.get("content-type") ?? "";
  if (!type.toLowerCase().includes("application/json")) {
    throw new AppError("unsupported_media_type", "Send the request body as application/json.");
  }
  let raw: unknown;
  try {
    raw = await request.json();
  } catch {
    throw new AppError("bad_request", "The request body is not valid JSON.");
  }
  const parsed = schema.safeParse(raw);
  if (!parsed.success) throw validationError(parsed.error);
  return parsed.data;
}

/** Wraps a route handler: typed errors become their status, anything else a bare 500. */
export function route<Ctx>(handler: (request: Request, ctx: Ctx) => Promise<Response>) {
  return async (request: Request, ctx: Ctx): Promise<Response> => {
    try {
      return await handler(request, ctx);
    } catch (e) {
      if (isAppError(e)) return errorResponse(e);
      console.error("[api] unexpected error", e);
      return errorResponse(new AppError("internal", "Something went wrong on our side. Try again."));
    }
  };
}
