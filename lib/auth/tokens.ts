import { createHash, randomBytes } from "node:crypto";

/** A new random token (256 bits, URL-safe) and the SHA-256 hash that is all the database keeps. */
export function newToken(bytes = 32): { token: string; hash: string } {
  const token = randomBytes(bytes).toString("base64url");
  return { token, hash: hashToken(token) };
}

export function hashToken(token: string): string {
  return createHash("sha256").update(token, "utf8").digest("hex");
}
