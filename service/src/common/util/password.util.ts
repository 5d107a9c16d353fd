import { createHash, randomBytes } from 'node:crypto';
import { hash, verify } from '@node-rs/argon2';

/** argon2id with the library's defaults (19 MiB, 2 passes: the OWASP cheat sheet's minimum). */
export function hashPassword(plain: string): Promise<string> {
  return hash(plain);
}
export async function verifyPassword(stored: string | null | undefined, plain: string): Promise<boolean> {
  if (!stored) return false;
  try {
    return await verify(stored, plain);
  } catch {
    return false;
  }
}
/** A random URL-safe secret and its SHA-256 hex hash (what we store). */
export function newSecret(bytes = 32): { secret: string; hash: string } {
  const secret = randomBytes(bytes).toString('base64url');
  return { secret, hash: sha256(secret) };
}
export function sha256(text: string): string {
  return createHash('sha256').update(text).digest('hex');
}
