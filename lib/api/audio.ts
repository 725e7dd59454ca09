import "server-only";
import { createReadStream } from "node:fs";
import { stat } from "node:fs/promises";
import { Readable } from "node:stream";
import { AppError } from "@/lib/errors";
import { storagePath } from "@/lib/storage/files";

/** Streams a take's original recording, honouring a byte Range so players can seek. */
export async function audioResponse(request: Request, take: { originalKey: string; originalMime: string }): Promise<Response> {
  const file = storagePath(take.originalKey);
  const size = (await stat(file)).size;
  const headers: Record<string, string> = {
    "content-type": take.originalMime,
    "accept-ranges": "bytes",
    "cache-control": "private, max-age=3600",
    "content-disposition": "inline",
  };
  const range = request.headers.get("range");
  let start = 0;
  let end = size - 1;
  let status = 200;
  if (range) {
    const m = range.match(/^bytes=(\d*)-(\d*)$/);
    if (!m || (m[1] === "" && m[2] === "")) throw new AppError("bad_request", "Malformed Range header.");
    if (m[1] === "") start = Math.max(0, size - Number(m[2]));
    else {
      start = Number(m[1]);
      end = m[2] ? Math.min(Number(m[2]), size - 1) : size - 1;
    }
    if (start > end || start >= size) {
      return new Response(null, { status: 416, headers: { "content-range": `bytes */${size}` } });
    }
    status = 206;
    headers["content-range"] = `bytes ${start}-${end}/${size}`;
  }
  headers["content-length"] = String(end - start + 1);
  const body = Readable.toWeb(createReadStream(file, { start, end })) as ReadableStream<Uint8Array>;
  return new Response(body, { status, headers });
}
