import { OpenAPIRegistry, OpenApiGeneratorV31, extendZodWithOpenApi } from "@asteasolutions/zod-to-openapi";
import { z } from "zod";
import { settingsSchema } from "@/lib/engine/settings";
import { changeRoleSchema, inviteSchema, roleSchema, studioNameSchema } from "@/lib/schemas/members";
import { noteSchema, putNotesSchema } from "@/lib/schemas/notes";
import { createProjectSchema, updateProjectSchema } from "@/lib/schemas/project";

extendZodWithOpenApi(z);

/**
 * The API's machine-readable description, generated from the same zod schemas the
 * handlers parse with (request bodies) and from schemas of the DTOs they return.
 */
const errorSchema = z.object({
  error: z.object({ code: z.string(), message: z.string(), fields: z.record(z.string(), z.array(z.string())).optional() }),
});
const projectDto = z.object({ id: z.string(), name: z.string(), description: z.string(), createdAt: z.string(), updatedAt: z.string() });
const analysisDto = z.object({
  id: z.string(),
  takeId: z.string(),
  state: z.enum(["queued", "analysing", "ready", "failed"]),
  progress: z.number().min(0).max(100),
  error: z.string().optional(),
  settings: z.record(z.string(), z.unknown()),
  createdAt: z.string(),
  startedAt: z.string().optional(),
  finishedAt: z.string().optional(),
});
const takeDto = z.object({
  id: z.string(),
  projectId: z.string(),
  name: z.string(),
  durationSec: z.number(),
  sampleRateHz: z.number().int(),
  channels: z.number().int(),
  originalMime: z.string(),
  originalBytes: z.number().int(),
  createdAt: z.string(),
  analysis: analysisDto.nullable(),
  noteCount: z.number().int().nullable(),
});
const notesDto = z.object({
  source: z.enum(["draft", "revision"]),
  revision: z.number().int().optional(),
  referenceHz: z.number(),
  notes: z.array(noteSchema),
});
const memberDto = z.object({ id: z.string(), userId: z.string(), name: z.string(), email: z.string(), role: roleSchema, joinedAt: z.string() });
const apiKeyDto = z.object({ id: z.string(), name: z.string(), prefix: z.string(), role: roleSchema, createdAt: z.string(), lastUsedAt: z.string().optional() });

type Method = "get" | "post" | "put" | "patch" | "delete";
type Op = {
  method: Method;
  path: string;
  summary: string;
  body?: z.ZodType;
  multipart?: z.ZodType;
  ok: { status: number; schema?: z.ZodType; description?: string };
  errors: number[];
};

const id = (name: string) => z.object({ [name]: z.string() });
const ERROR_TEXT: Record<number, string> = {
  400: "Malformed request",
  401: "Not signed in, or the API key is not valid",
  402: "No export credits left (code no_credits)",
  403: "The caller's role does not allow this",
  404: "Not found in the caller's studio",
  409: "Conflicts with the current state",
  413: "Too large",
  415: "Unsupported content type",
  422: "Validation failed (see error.fields)",
  429: "Too many requests",
};

const OPS: Op[] = [
  { method: "get", path: "/api/v1/projects", summary: "List the studio's projects", ok: { status: 200, schema: z.object({ projects: z.array(projectDto) }) }, errors: [401, 403] },
  { method: "post", path: "/api/v1/projects", summary: "Create a project", body: createProjectSchema, ok: { status: 201, schema: z.object({ project: projectDto }) }, errors: [401, 403, 409, 415, 422] },
  { method: "get", path: "/api/v1/projects/{projectId}", summary: "Get a project", ok: { status: 200, schema: z.object({ project: projectDto }) }, errors: [401, 404] },
  { method: "patch", path: "/api/v1/projects/{projectId}", summary: "Rename a project", body: updateProjectSchema, ok: { status: 200, schema: z.object({ project: projectDto }) }, errors: [401, 403, 404, 409, 422] },
  { method: "delete", path: "/api/v1/projects/{projectId}", summary: "Delete a project and its takes for good", ok: { status: 204 }, errors: [401, 403, 404] },
  { method: "get", path: "/api/v1/projects/{projectId}/takes", summary: "List a project's takes", ok: { status: 200, schema: z.object({ takes: z.array(takeDto) }) }, errors: [401, 404] },
  {
    method: "post",
    path: "/api/v1/projects/{projectId}/takes",
    summary: "Upload a take (WAV or FLAC; other formats with a WAV rendering in `analysis`) and queue its analysis",
    multipart: z.object({ file: z.string(), analysis: z.string().optional(), name: z.string().optional(), settings: z.string().optional() }),
    ok: { status: 201, schema: z.object({ take: takeDto, analysis: analysisDto }) },
    errors: [400, 401, 403, 404, 413, 415, 422],
  },
  { method: "get", path: "/api/v1/takes/{takeId}", summary: "Get a take and its latest analysis", ok: { status: 200, schema: z.object({ take: takeDto, analysis: analysisDto.nullable() }) }, errors: [401, 404] },
  { method: "delete", path: "/api/v1/takes/{takeId}", summary: "Delete a take for good (files, analyses, drafts, revisions)", ok: { status: 204 }, errors: [401, 403, 404] },
  { method: "get", path: "/api/v1/takes/{takeId}/audio", summary: "The original recording (byte ranges supported)", ok: { status: 200, description: "audio bytes" }, errors: [401, 404] },
  { method: "get", path: "/api/v1/takes/{takeId}/analyses", summary: "List a take's analyses, newest first", ok: { status: 200, schema: z.object({ analyses: z.array(analysisDto) }) }, errors: [401, 404] },
  { method: "post", path: "/api/v1/takes/{takeId}/analyses", summary: "Re-analyse with other settings", body: z.object({ settings: settingsSchema.partial().optional() }), ok: { status: 202, schema: z.object({ analysis: analysisDto }) }, errors: [401, 403, 404, 422] },
  { method: "get", path: "/api/v1/analyses/{analysisId}", summary: "Get an analysis (state, progress, error)", ok: { status: 200, schema: z.object({ analysis: analysisDto }) }, errors: [401, 404] },
  { method: "post", path: "/api/v1/analyses/{analysisId}/cancel", summary: "Cancel a queued or running analysis", ok: { status: 200, schema: z.object({ analysis: analysisDto }) }, errors: [401, 403, 404, 409] },
  { method: "get", path: "/api/v1/takes/{takeId}/notes", summary: "The take's notes: the latest revision, else the latest ready draft (query: revision=n for one revision, revision=0 for the draft, curves=1 for pitch curves)", ok: { status: 200, schema: notesDto }, errors: [400, 401, 404] },
  { method: "put", path: "/api/v1/takes/{takeId}/notes", summary: "Save corrected notes as the next revision", body: putNotesSchema, ok: { status: 201, schema: z.object({ revision: z.object({ number: z.number().int(), noteCount: z.number().int(), createdAt: z.string() }) }) }, errors: [401, 403, 404, 409, 422] },
  {
    method: "get",
    path: "/api/v1/takes/{takeId}/export",
    summary: "Export the notes as MIDI, MusicXML or CSV (query: format, revision, pitchBend=1, quantize=1/16, tempo, timeSignature); MIDI and MusicXML use one export credit",
    ok: { status: 200, description: "the file" },
    errors: [401, 402, 403, 404, 422],
  },
  { method: "get", path: "/api/v1/credits", summary: "Export credits: balance (allowance left included), purchases, ledger", ok: { status: 200 }, errors: [401] },
  { method: "post", path: "/api/v1/billing/checkout", summary: "Start buying an export pack (owners): returns the checkout URL", body: z.object({ pack: z.enum(["pack25", "pack100"]) }), ok: { status: 200, schema: z.object({ url: z.string() }) }, errors: [401, 403, 422] },
  { method: "get", path: "/api/v1/studio", summary: "The active studio and the caller's role", ok: { status: 200 }, errors: [401] },
  { method: "patch", path: "/api/v1/studio", summary: "Rename the studio", body: studioNameSchema, ok: { status: 200 }, errors: [401, 403, 422] },
  { method: "get", path: "/api/v1/members", summary: "List members", ok: { status: 200, schema: z.object({ members: z.array(memberDto) }) }, errors: [401] },
  { method: "patch", path: "/api/v1/members/{memberId}", summary: "Change a member's role", body: changeRoleSchema, ok: { status: 200, schema: z.object({ member: memberDto }) }, errors: [401, 403, 404, 409, 422] },
  { method: "delete", path: "/api/v1/members/{memberId}", summary: "Remove a member", ok: { status: 204 }, errors: [401, 403, 404, 409] },
  { method: "post", path: "/api/v1/invitations", summary: "Invite someone by e-mail", body: inviteSchema, ok: { status: 201 }, errors: [401, 403, 409, 422] },
  { method: "get", path: "/api/v1/api-keys", summary: "List the studio's API keys", ok: { status: 200, schema: z.object({ apiKeys: z.array(apiKeyDto) }) }, errors: [401, 403] },
  { method: "post", path: "/api/v1/api-keys", summary: "Create an API key (the key is returned once)", body: z.object({ name: z.string(), role: roleSchema }), ok: { status: 201, schema: z.object({ apiKey: apiKeyDto, key: z.string() }) }, errors: [401, 403, 422] },
  { method: "delete", path: "/api/v1/api-keys/{keyId}", summary: "Revoke an API key", ok: { status: 204 }, errors: [401, 403, 404] },
];

export function openApiDocument(serverUrl: string) {
  const registry = new OpenAPIRegistry();
  registry.registerComponent("securitySchemes", "apiKey", { type: "http", scheme: "bearer", description: "A studio API key: `Authorization: Bearer tn_…`" });
  registry.registerComponent("securitySchemes", "session", { type: "apiKey", in: "cookie", name: "tapernote.session_token" });
  const errorRef = registry.register("Error", errorSchema);
  for (const op of OPS) {
    const params = [...op.path.matchAll(/\{(\w+)\}/g)].map((m) => m[1]!);
    const responses: Record<string, { description: string; content?: Record<string, { schema: z.ZodType }> }> = {
      [op.ok.status]: {
        description: op.ok.description ?? "OK",
        ...(op.ok.schema ? { content: { "application/json": { schema: op.ok.schema } } } : {}),
      },
    };
    for (const status of op.errors) responses[status] = { description: ERROR_TEXT[status]!, content: { "application/json": { schema: errorRef } } };
    registry.registerPath({
      method: op.method,
      path: op.path,
      summary: op.summary,
      security: [{ apiKey: [] }, { session: [] }],
      request: {
        ...(params.length ? { params: params.reduce((s, p) => s.extend(id(p).shape), z.object({})) } : {}),
        ...(op.body ? { body: { content: { "application/json": { schema: op.body } } } } : {}),
        ...(op.multipart ? { body: { content: { "multipart/form-data": { schema: op.multipart } } } } : {}),
      },
      responses,
    });
  }
  return new OpenApiGeneratorV31(registry.definitions).generateDocument({
    openapi: "3.1.0",
    info: { title: "Tapernote API", version: "1", description: "Takes, analyses and notes of a studio. Errors: `{ error: { code, message, fields? } }`." },
    servers: [{ url: serverUrl }],
  });
}
