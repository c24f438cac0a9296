import { createHash, randomBytes, timingSafeEqual } from "node:crypto";

/** A URL-safe random token with 256 bits of entropy, with an optional readable prefix. */
export function newToken(prefix = ""): string {
  return prefix + randomBytes(32).toString("base64url");
}

/** Tokens are stored only as SHA-256: a leaked table does not leak working links. */
export function hashToken(token: string): string {
  return createHash("sha256").update(token, "utf8").digest("hex");
}

export function sameHash(a: string, b: string): boolean {
  const ba = Buffer.from(a, "hex");
  const bb = Buffer.from(b, "hex");
  return ba.length === bb.length && timingSafeEqual(ba, bb);
}
