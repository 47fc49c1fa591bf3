import { createHash, randomBytes } from "node:crypto";

/** 32 random bytes as base64url (43 characters) and the SHA-256 hex we store instead of it. */
export function newToken(): { token: string; hash: string } {
  const token = randomBytes(32).toString("base64url");
  return { token, hash: hashToken(token) };
}

export const hashToken = (token: string) => createHash("sha256").update(token).digest("hex");
