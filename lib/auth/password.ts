import bcrypt from "bcryptjs";

/** bcrypt with cost 10 (OWASP's minimum recommendation for bcrypt, from memory). */
const COST = 10;

export function hashPassword(plain: string): Promise<string> {
  return bcrypt.hash(plain, COST);
}

export function verifyPassword(plain: string, hash: string | null): Promise<boolean> {
  if (!hash) return Promise.resolve(false);
  return bcrypt.compare(plain, hash);
}
