/** Password hashing with argon2id (RFC 9106), via the argon2 package's defaults for memory and time. */
import argon2 from 'argon2';

// Under vitest only, cheaper parameters (common practice, like test-only password hashers): API tests
// create hundreds of accounts on two cores. Never true in `npm start` (vitest sets VITEST itself).
const cheap = process.env.VITEST === 'true' ? { memoryCost: 4096, timeCost: 2, parallelism: 1 } : {};

export function hashPassword(password: string): Promise<string> {
  return argon2.hash(password, { type: argon2.argon2id, ...cheap });
}

// Verified against when the e-mail is unknown, so a wrong e-mail costs as long as a wrong password
// (no account enumeration by timing). Computed once, lazily.
let dummyHash: Promise<string> | undefined;

export async function verifyPassword(hash: string | null, password: string): Promise<boolean> {
  if (!hash) {
    dummyHash ??= hashPassword('lariat-no-such-account-placeholder');
    await argon2.verify(await dummyHash, password);
    return false;
  }
  try {
    return await argon2.verify(hash, password);
  } catch {
    return false;
  }
}
