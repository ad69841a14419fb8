import { createHash, randomBytes } from "node:crypto";

/** Personal API tokens look like `hmx_<43 base64url chars>`; only their SHA-256 is stored. */
export const TOKEN_PREFIX = "hmx_";

export function generateSecretToken(prefix = TOKEN_PREFIX): string {
  return `${prefix}${randomBytes(32).toString("base64url")}`;
}

export function hashToken(token: string): string {
  return createHash("sha256").update(token, "utf8").digest("hex");
}
