/**
 * Browser-side checks and conversion of a chosen audio file before upload. The server
 * checks everything again (by content, not by name); these checks only spare the person
 * an upload that would be refused.
 */
import { encodeWavPcm16Mono, mixToMono } from "./wav-encode";

export type AudioKind = "wav" | "flac" | "mp3" | "ogg" | "mp4";

/** The MIME type the API lists for each kind (`GET /api/v1/limits` → acceptedTypes). */
export const KIND_MIME: Record<AudioKind, string> = {
  wav: "audio/wav",
  flac: "audio/flac",
  mp3: "audio/mpeg",
  ogg: "audio/ogg",
  mp4: "audio/mp4",
};

export const KIND_LABEL: Record<AudioKind, string> = {
  wav: "WAV",
  flac: "FLAC",
  mp3: "MP3",
  ogg: "OGG",
  mp4: "M4A",
};

/** What the file input offers; the content is still checked by its first bytes. */
export const ACCEPT_ATTRIBUTE = ".wav,.flac,.mp3,.ogg,.oga,.opus,.m4a,.mp4,.aac,audio/wav,audio/x-wav,audio/flac,audio/mpeg,audio/ogg,audio/mp4";

/** The server decodes these itself; the others need a WAV rendering made here. */
export function serverDecodes(kind: AudioKind): boolean {
  return kind === "wav" || kind === "flac";
}

/**
 * The container from the first bytes (magic numbers): RIFF…WAVE, fLaC, OggS, ISO BMFF
 * `ftyp` at offset 4, MP3 with an ID3v2 tag or an MPEG audio frame sync (11 set bits
 * followed by a layer other than 00, which is how ADTS AAC differs).
 */
export function sniffAudioKind(head: Uint8Array): AudioKind | null {
  const ascii = (offset: number, length: number) =>
    String.fromCharCode(...head.subarray(offset, offset + length));
  if (head.length >= 12 && ascii(0, 4) === "RIFF" && ascii(8, 4) === "WAVE") return "wav";
  if (head.length >= 4 && ascii(0, 4) === "fLaC") return "flac";
  if (head.length >= 4 && ascii(0, 4) === "OggS") return "ogg";
  if (head.length >= 8 && ascii(4, 4) === "ftyp") return "mp4";
  if (head.length >= 3 && ascii(0, 3) === "ID3") return "mp3";
  if (head.length >= 2 && head[0] === 0xff && (head[1]! & 0xe0) === 0xe0 && (head[1]! & 0x06) !== 0) return "mp3";
  return null;
}

export async function readAudioKind(file: File): Promise<AudioKind | null> {
  const head = new Uint8Array(await file.slice(0, 16).arrayBuffer());
  return sniffAudioKind(head);
}

/** Rate of the WAV rendering: above twice the engine's 16 kHz analysis rate, small enough to upload. */
export const RENDER_SAMPLE_RATE_HZ = 22050;

export class BrowserDecodeError extends Error {
  constructor(message: string) {
    super(message);
    this.name = "BrowserDecodeError";
  }
}

/**
 * Decodes a compressed take with the Web Audio API, mixes it to mono and encodes a
 * 16-bit PCM WAV at {@link RENDER_SAMPLE_RATE_HZ} (decodeAudioData on an
 * OfflineAudioContext resamples to that context's rate).
 */
export async function renderAnalysisWav(file: File): Promise<{ wav: Blob; durationSec: number }> {
  const Offline = globalThis.OfflineAudioContext;
  if (typeof Offline !== "function") {
    throw new BrowserDecodeError("This browser has no Web Audio API, so it cannot prepare this file. Upload a WAV or FLAC instead.");
  }
  const context = new Offline({ numberOfChannels: 1, length: 1, sampleRate: RENDER_SAMPLE_RATE_HZ });
  let buffer: AudioBuffer;
  try {
    buffer = await context.decodeAudioData(await file.arrayBuffer());
  } catch {
    throw new BrowserDecodeError(
      "This browser cannot decode this file (its codec may not be supported here). Try another browser, or convert it to WAV or FLAC and upload that.",
    );
  }
  if (buffer.length === 0) throw new BrowserDecodeError("The file decodes to no sound at all.");
  const channels = Array.from({ length: buffer.numberOfChannels }, (_, c) => buffer.getChannelData(c));
  const bytes = encodeWavPcm16Mono(mixToMono(channels), buffer.sampleRate);
  return { wav: new Blob([bytes as BlobPart], { type: "audio/wav" }), durationSec: buffer.duration };
}
