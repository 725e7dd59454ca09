import { createHash, randomBytes, randomUUID } from "node:crypto";

export const newId = (): string => randomUUID();

/** A URL-safe random token (256 bits) and the SHA-256 hex that is stored instead of it. */
export function newToken(): { token: string; tokenHash: string } {
  const token = randomBytes(32).toString("base64url");
  return { token, tokenHash: sha256Hex(token) };
}

export function sha256Hex(value: string): string {
  return createHash("sha256").update(value).digest("hex");
}
