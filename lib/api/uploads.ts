import "server-only";
import { EngineError } from "@/lib/engine/errors";
import { uploadLimits } from "@/lib/config";
import { AppError } from "@/lib/errors";
import { sniffAudio } from "@/lib/storage/sniff";
import { checkAudioOffThread } from "./decode-thread";
import type { NewTake } from "@/db/takes";

const ENGINE_MESSAGES: Partial<Record<string, string>> = {
  not_audio: "This file is not audio that Tapernote can read.",
  unsupported_format: "This kind of WAV or FLAC file is not supported. Export it as 16- or 24-bit PCM WAV.",
  truncated: "The file is cut short or damaged.",
  empty: "The file holds no audio.",
  bad_samples: "The file contains invalid samples (not a number or infinite).",
};

function mb(bytes: number): string {
  return `${Math.round(bytes / 1024 / 1024)} MB`;
}

/** A take's name from the form, else the file name without its extension (display only; never a path). */
function takeName(given: FormDataEntryValue | null, fileName: string): string {
  const raw = typeof given === "string" && given.trim() ? given : fileName.replace(/\.[^.]*$/, "");
  // keep letters, numbers and ordinary punctuation; drop path separators and control characters
  const clean = raw.replace(/[\u0000-\u001f\u007f/\\]+/g, " ").replace(/\s+/g, " ").trim().slice(0, 120);
  return clean || "Untitled take";
}

/**
 * Reads an upload (multipart: `file`, optional `analysis` WAV rendering, optional `name`,
 * optional `settings` JSON), checks size, real content type (magic bytes) and length, and
 * decodes the audio the engine will read. 413 too large, 415 wrong type, 422 unreadable or too long.
 */
export async function readUpload(request: Request): Promise<Omit<NewTake, "studioId" | "projectId" | "createdByUserId">> {
  const limits = uploadLimits();
  const declared = Number(request.headers.get("content-length") ?? 0);
  // an original plus its WAV rendering may together be about twice the file limit
  if (declared > limits.maxBytes * 2 + 1024 * 1024) {
    throw new AppError("payload_too_large", `The upload is larger than the limit of ${mb(limits.maxBytes)}.`);
  }
  const type = request.headers.get("content-type") ?? "";
  if (!type.toLowerCase().startsWith("multipart/form-data")) {
    throw new AppError("unsupported_media_type", "Send the take as multipart/form-data with the audio in the field `file`.");
  }
  let form: FormData;
  try {
    form = await request.formData();
  } catch {
    throw new AppError("bad_request", "The upload could not be read (malformed multipart body).");
  }
  const file = form.get("file");
  if (!(file instanceof File)) {
    throw new AppError("validation_failed", "Choose an audio file to upload.", { file: ["Choose an audio file to upload."] });
  }
  if (file.size > limits.maxBytes) throw new AppError("payload_too_large", `The file is larger than the limit of ${mb(limits.maxBytes)}.`);
  if (file.size === 0) throw new AppError("validation_failed", "The file is empty.", { file: ["The file is empty."] });
  const originalBytes = new Uint8Array(await file.arrayBuffer());
  const kind = sniffAudio(originalBytes);
  if (!kind) throw new AppError("unsupported_media_type", "This file is not WAV, FLAC, MP3, OGG or M4A audio.");

  let analysisBytes = originalBytes;
  let analysisFile: NewTake["analysisFile"];
  if (!kind.serverDecodes) {
    const rendering = form.get("analysis");
    if (!(rendering instanceof File)) {
      throw new AppError(
        "unsupported_media_type",
        `The server reads WAV and FLAC only. Upload ${kind.ext.toUpperCase()} from the web page (it converts in the browser), or send a WAV rendering in the field \`analysis\`.`,
      );
    }
    if (rendering.size > limits.maxBytes) throw new AppError("payload_too_large", `The WAV rendering is larger than the limit of ${mb(limits.maxBytes)}.`);
    analysisBytes = new Uint8Array(await rendering.arrayBuffer());
    const renderingKind = sniffAudio(analysisBytes);
    if (!renderingKind?.serverDecodes) throw new AppError("unsupported_media_type", "The field `analysis` must hold a WAV or FLAC file.");
    analysisFile = { bytes: analysisBytes, ext: renderingKind.ext };
  }

  let decoded;
  try {
    // every sample is read (a truncated file or NaN samples answer 422 now, not in the job), on
    // a thread of its own: tens of milliseconds per take would otherwise hold up every request
    decoded = await checkAudioOffThread(analysisBytes, limits.maxDurationSec);
  } catch (e) {
    if (e instanceof EngineError) {
      if (e.code === "too_long") {
        throw new AppError("validation_failed", `The take is longer than the limit of ${limits.maxDurationSec / 60} minutes.`, { file: [e.message] });
      }
      const message = ENGINE_MESSAGES[e.code] ?? "The audio could not be read.";
      throw new AppError("validation_failed", message, { file: [message] });
    }
    throw e;
  }

  let settings: unknown = {};
  const settingsField = form.get("settings");
  if (typeof settingsField === "string" && settingsField.trim()) {
    try {
      settings = JSON.parse(settingsField);
    } catch {
      throw new AppError("validation_failed", "The settings are not valid JSON.", { settings: ["Not valid JSON."] });
    }
  }

  return {
    name: takeName(form.get("name"), file.name || "take"),
    original: { bytes: originalBytes, ext: kind.ext, mime: kind.mime },
    analysisFile,
    decoded: { durationSec: decoded.durationSec, sampleRateHz: decoded.sourceRateHz, channels: decoded.channels },
    settings,
  };
}
