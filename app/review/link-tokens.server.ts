import { createHash, randomBytes } from "node:crypto";

/** A link token: the mail carries the token, the database only its SHA-256. */
export function newToken() {
  const token = randomBytes(32).toString("base64url");
  return { token, hash: hashToken(token) };
}

export function hashToken(token: string) {
  return createHash("sha256").update(token).digest("hex");
}
