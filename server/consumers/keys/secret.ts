/**
 * Consumer API keys: `lariat_` + 32 random bytes (base64url). Only the SHA-256 is stored: the key has
 * 256 bits of entropy, so a slow password hash would add nothing but latency to every API call.
 */
import { createHash, randomBytes } from 'node:crypto';

export const KEY_PREFIX = 'lariat_';
const SHOWN = KEY_PREFIX.length + 6;

export function newApiKey(): { key: string; hash: string; prefix: string } {
  const key = `${KEY_PREFIX}${randomBytes(32).toString('base64url')}`;
  return { key, hash: hashApiKey(key), prefix: key.slice(0, SHOWN) };
}

export function hashApiKey(key: string): string {
  return createHash('sha256').update(key, 'utf8').digest('hex');
}

/** Cheap shape check before touching the database. */
export function looksLikeApiKey(text: string): boolean {
  return /^lariat_[A-Za-z0-9_-]{43}$/.test(text);
}
