import bcrypt from 'bcryptjs';

/**
 * bcrypt cost factor: 2^11 rounds, about 0.15 s per hash in bcryptjs on a current server core — slow
 * enough to make offline guessing expensive, fast enough for sign-in. (OWASP Password Storage Cheat
 * Sheet: a work factor of 10 or more for bcrypt.)
 */
export const BCRYPT_COST = 11;

/** bcrypt reads at most 72 bytes of a password; longer ones are refused rather than silently cut. */
export const PASSWORD_MAX_BYTES = 72;
export const PASSWORD_MIN_LENGTH = 10;

export function hashPassword(password: string): Promise<string> {
  return bcrypt.hash(password, BCRYPT_COST);
}

// A real hash, compared against when the account does not exist, so a wrong e-mail takes as long as a
// wrong password and sign-in does not tell which accounts exist. Made on first use, not at import.
let dummyHash: Promise<string> | undefined;

/** True when the password matches the stored hash (a null hash never matches, in the same time). */
export async function verifyPassword(password: string, hash: string | null): Promise<boolean> {
  dummyHash ??= bcrypt.hash('no account has this password', BCRYPT_COST);
  const matches = await bcrypt.compare(password, hash ?? (await dummyHash));
  return hash !== null && matches;
}
