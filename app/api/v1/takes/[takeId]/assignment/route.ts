import { NextResponse } from "next/server";
import { z } from "zod";
import { deleteAssignment, getAssignment, setAssignment } from "@/db/teaching";
import { getTakeNotes, getTakeRow } from "@/db/takes";
import { parseJson, route } from "@/lib/api/respond";
import { requireActor, requireRole } from "@/lib/auth/actor";
import { AppError, notFound } from "@/lib/errors";
import { alignToAssignment } from "@/lib/music/align";
import { AssignmentFileError, detectAssignmentFormat, parseAssignmentFile } from "@/lib/music/assignment-files";

type Ctx = { params: Promise<{ takeId: string }> };
const MAX_ASSIGNMENT_BYTES = 5 * 1024 * 1024;

/** The take's assignment and how the take compares with it (aligned by dynamic time warping). */
export const GET = route(async (request, { params }: Ctx) => {
  const actor = await requireActor(request);
  const take = await getTakeRow(actor.studioId, (await params).takeId);
  requireRole(actor, "read");
  const found = await getAssignment(take.id);
  if (!found) throw notFound("An assignment for this take");
  const played = await getTakeNotes(actor.studioId, take.id);
  const result = alignToAssignment(played.notes, found.notes);
  return NextResponse.json({ assignment: found.info, result });
});

/** Attaches the expected notes: a MIDI or MusicXML file (multipart `file`), or another take's notes (JSON). */
export const PUT = route(async (request, { params }: Ctx) => {
  const actor = await requireActor(request);
  const take = await getTakeRow(actor.studioId, (await params).takeId);
  requireRole(actor, "edit");
  const type = (request.headers.get("content-type") ?? "").toLowerCase();
  if (type.startsWith("multipart/form-data")) {
    const form = await request.formData().catch(() => {
      throw new AppError("bad_request", "The upload could not be read.");
    });
    const file = form.get("file");
    if (!(file instanceof File)) throw new AppError("validation_failed", "Choose a MIDI or MusicXML file.", { file: ["Choose a MIDI or MusicXML file."] });
    if (file.size > MAX_ASSIGNMENT_BYTES) throw new AppError("payload_too_large", "An assignment file may be at most 5 MB.");
    const bytes = new Uint8Array(await file.arrayBuffer());
    let format;
    let notes;
    try {
      format = detectAssignmentFormat(bytes);
      notes = parseAssignmentFile(bytes);
    } catch (e) {
      if (e instanceof AssignmentFileError) {
        if (e.code === "unrecognised_format") throw new AppError("unsupported_media_type", "Upload a Standard MIDI File (.mid) or an uncompressed MusicXML file (.musicxml).");
        throw new AppError("validation_failed", e.message, { file: [e.message] });
      }
      throw e;
    }
    const name = String(form.get("name") ?? "").trim().slice(0, 120) || file.name.replace(/\.[^.]*$/, "").slice(0, 120) || "Assignment";
    const info = await setAssignment(take.id, { name, sourceFormat: format === "midi" ? "midi" : "musicxml", notes }, actor.user.id);
    return NextResponse.json({ assignment: info }, { status: 201 });
  }
  const body = await parseJson(request, z.object({ fromTakeId: z.string().min(1), revision: z.number().int().min(1).optional(), name: z.string().trim().max(120).optional() }));
  const source = await getTakeRow(actor.studioId, body.fromTakeId);
  const notes = await getTakeNotes(actor.studioId, source.id, { revision: body.revision });
  const info = await setAssignment(
    take.id,
    { name: body.name || `${source.name}${notes.revision ? ` (revision ${notes.revision})` : ""}`, sourceFormat: "take", notes: notes.notes.map(({ onsetSec, offsetSec, pitch, voice }) => ({ onsetSec, offsetSec, pitch, voice })) },
    actor.user.id,
  );
  return NextResponse.json({ assignment: info }, { status: 201 });
});

export const DELETE = route(async (request, { params }: Ctx) => {
  const actor = await requireActor(request);
  const take = await getTakeRow(actor.studioId, (await params).takeId);
  requireRole(actor, "edit");
  await deleteAssignment(take.id);
  return new NextResponse(null, { status: 204 });
});
