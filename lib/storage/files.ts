import { createHash } from "node:crypto";
import { mkdir, readFile, rename, rm, writeFile } from "node:fs/promises";
import path from "node:path";
import { dataDir } from "@/lib/config";

/**
 * Audio files on local disk under DATA_DIR. A file's key is `<takeId>/<kind>-<sha256>.<ext>`:
 * built from ids and the content hash only, never from the uploader's file name, so no
 * path traversal is possible. Keys are checked again before every access.
 */
const KEY_PATTERN = /^[0-9a-f-]{36}\/(original|analysis)-[0-9a-f]{64}\.(wav|flac|mp3|ogg|m4a|webm)$/;

export function isStorageKey(key: string): boolean {
  return KEY_PATTERN.test(key);
}

export function storagePath(key: string): string {
  if (!isStorageKey(key)) throw new Error("invalid storage key");
  return path.join(dataDir(), key);
}

export function sha256(bytes: Uint8Array): string {
  return createHash("sha256").update(bytes).digest("hex");
}

/** The same digest computed on libuv's thread pool (Web Crypto), so a 200 MB upload does not hold up the event loop. */
export async function sha256Async(bytes: Uint8Array): Promise<string> {
  return Buffer.from(await crypto.subtle.digest("SHA-256", bytes as Uint8Array<ArrayBuffer>)).toString("hex");
}

/** Writes bytes atomically (temp file + rename) and returns the key. */
export async function storeFile(takeId: string, kind: "original" | "analysis", ext: string, bytes: Uint8Array): Promise<{ key: string; sha256: string }> {
  const hash = await sha256Async(bytes);
  const key = `${takeId}/${kind}-${hash}.${ext}`;
  const full = storagePath(key);
  await mkdir(path.dirname(full), { recursive: true });
  const tmp = `${full}.${process.pid}.${Date.now()}.tmp`;
  await writeFile(tmp, bytes);
  await rename(tmp, full);
  return { key, sha256: hash };
}

export async function readStored(key: string): Promise<Uint8Array> {
  return new Uint8Array(await readFile(storagePath(key)));
}

/** Removes every file of a take (its folder). */
export async function deleteTakeFiles(takeId: string): Promise<void> {
  if (!/^[0-9a-f-]{36}$/.test(takeId)) throw new Error("invalid take id");
  await rm(path.join(dataDir(), takeId), { recursive: true, force: true });
}
