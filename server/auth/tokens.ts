/**
 * Single-use links (invitations, password resets): 32 random bytes sent by e-mail, only their SHA-256
 * stored. A plain hash suffices because the token has 256 bits of entropy (no dictionary to guess).
 */
import { createHash, randomBytes, timingSafeEqual } from 'node:crypto';

export function randomToken(): string {
  return randomBytes(32).toString('base64url');
}

export function hashToken(token: string): string {
  return createHash('sha256').update(token, 'utf8').digest('hex');
}

/** Constant-time string comparison (CSRF header vs cookie). */
export function sameSecret(a: string, b: string): boolean {
  const x = Buffer.from(a, 'utf8');
  const y = Buffer.from(b, 'utf8');
  return x.length === y.length && timingSafeEqual(x, y);
}
