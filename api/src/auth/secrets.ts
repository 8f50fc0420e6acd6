import { createHash, randomBytes, timingSafeEqual } from 'node:crypto';

/**
 * Bearer secrets: session tokens, API keys and one-time link tokens. Every one carries 256 random bits,
 * so a plain SHA-256 is enough to store them (no salt or slow hash needed: nothing to brute-force),
 * and a hash lookup reveals nothing about the secret.
 */

/** Prefix of API keys, so that leaked keys are easy to recognise and to scan for. */
export const API_KEY_PREFIX = 'hrk_';
/** Prefix of session tokens (distinguishes them from API keys at a glance and in the authenticator). */
export const SESSION_TOKEN_PREFIX = 'hrs_';

const API_KEY_FORMAT = /^hrk_([0-9a-f]{16})_([A-Za-z0-9_-]{43})$/;

/** 32 random bytes as base64url (43 characters). */
export function randomSecret(): string {
  return randomBytes(32).toString('base64url');
}

/** Lower-case hex SHA-256 of a secret: the only form in which secrets are stored. */
export function hashSecret(secret: string): string {
  return createHash('sha256').update(secret, 'utf8').digest('hex');
}

/** Compares two hex hashes in constant time (no early exit that would leak how much matched). */
export function sameHash(aHex: string, bHex: string): boolean {
  const a = Buffer.from(aHex, 'hex');
  const b = Buffer.from(bHex, 'hex');
  return a.length === b.length && timingSafeEqual(a, b);
}

export function newSessionToken(): string {
  return SESSION_TOKEN_PREFIX + randomSecret();
}

/** The public key id: 16 hex characters, shown in lists and used to look the key up. */
export function newApiKeyId(): string {
  return randomBytes(8).toString('hex');
}

/** `hrk_<keyId>_<secret>` */
export function formatApiKey(keyId: string, secret: string): string {
  return `${API_KEY_PREFIX}${keyId}_${secret}`;
}

/** Splits an API key into its id and secret, or null when it is not in our format. */
export function parseApiKey(token: string): { keyId: string; secret: string } | null {
  const m = API_KEY_FORMAT.exec(token);
  return m ? { keyId: m[1]!, secret: m[2]! } : null;
}
