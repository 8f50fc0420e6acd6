import { describe, expect, it } from 'vitest';
import { formatApiKey, hashSecret, newApiKeyId, parseApiKey, randomSecret, sameHash } from './secrets.js';

describe('secrets', () => {
  it('when an API key is formatted, then parsing gives back its id and secret', () => {
    const keyId = newApiKeyId();
    const secret = randomSecret();
    expect(parseApiKey(formatApiKey(keyId, secret))).toEqual({ keyId, secret });
  });

  it('when a key is not in our format, then parsing refuses it', () => {
    const good = formatApiKey('0123456789abcdef', randomSecret());
    for (const bad of ['', 'hrk_', good.slice(0, -1), good + 'x', good.replace('hrk_', 'hrx_'), good.replace('0123', 'XYZ1'), `Bearer ${good}`]) {
      expect(parseApiKey(bad)).toBeNull();
    }
  });

  it('when hashes are compared, then only equal ones match', () => {
    // source: FIPS 180-4 test vector, SHA-256("abc")
    expect(hashSecret('abc')).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
    expect(sameHash(hashSecret('a'), hashSecret('a'))).toBe(true);
    expect(sameHash(hashSecret('a'), hashSecret('b'))).toBe(false);
    expect(sameHash(hashSecret('a'), 'abcd')).toBe(false);
  });
});
