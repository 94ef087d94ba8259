import { createHash, randomBytes } from "node:crypto";

/** A URL-safe single-use token; only its hash is stored, so a database leak gives no working link. */
export function newToken(): { token: string; hash: string } {
  const token = randomBytes(32).toString("base64url");
  return { token, hash: hashToken(token) };
}

export function hashToken(token: string): string {
  return createHash("sha256").update(token).digest("hex");
}
