/** Audio container by its magic bytes (the real content, never the file name or the client's MIME type). */
export type AudioKind = { ext: "wav" | "flac" | "mp3" | "ogg" | "m4a" | "webm"; mime: string; serverDecodes: boolean };

const ascii = (b: Uint8Array, at: number, n: number) => String.fromCharCode(...b.subarray(at, at + n));

export function sniffAudio(bytes: Uint8Array): AudioKind | null {
  if (bytes.length < 12) return null;
  const tag = ascii(bytes, 0, 4);
  if ((tag === "RIFF" || tag === "RF64") && ascii(bytes, 8, 4) === "WAVE") return { ext: "wav", mime: "audio/wav", serverDecodes: true };
  if (tag === "fLaC") return { ext: "flac", mime: "audio/flac", serverDecodes: true };
  if (tag === "OggS") return { ext: "ogg", mime: "audio/ogg", serverDecodes: false };
  if (ascii(bytes, 4, 4) === "ftyp") return { ext: "m4a", mime: "audio/mp4", serverDecodes: false };
  if (bytes[0] === 0x1a && bytes[1] === 0x45 && bytes[2] === 0xdf && bytes[3] === 0xa3) return { ext: "webm", mime: "audio/webm", serverDecodes: false };
  if (ascii(bytes, 0, 3) === "ID3") return { ext: "mp3", mime: "audio/mpeg", serverDecodes: false };
  // MPEG audio frame sync: 11 set bits, layer bits not 00
  if (bytes[0] === 0xff && (bytes[1]! & 0xe0) === 0xe0 && (bytes[1]! & 0x06) !== 0) return { ext: "mp3", mime: "audio/mpeg", serverDecodes: false };
  return null;
}

export const ACCEPTED_MIME_TYPES = ["audio/wav", "audio/flac", "audio/mpeg", "audio/ogg", "audio/mp4", "audio/webm"] as const;
