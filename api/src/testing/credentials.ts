import { randomUUID } from 'node:crypto';
import bcrypt from 'bcryptjs';
import type { Scope } from '../auth/scope.js';
import type { KeyScope } from '../models/api-key.js';
import type { Role } from '../models/user.js';
import type { Services } from '../services/index.js';

/** A role (a user of that role with a session) or an API key with these scopes. */
export type Who = Role | { keyScopes: string[] };

/**
 * Real credentials for tests, through the same services as production: a new user of the role in the
 * organisation with a signed-in session, or a new API key with the scopes. Returns the request headers.
 */
export async function mintCredentials(services: Services, organisationId: string, who: Who): Promise<Record<string, string>> {
  const system: Scope = { organisationId, actor: { kind: 'system', id: 'system' } };
  if (typeof who === 'string') {
    const id = randomUUID();
    const user = await services.db.models.User.create({
      id,
      organisationId,
      email: `${who}-${id.slice(0, 8)}@test.headroom.test`,
      name: `Test ${who}`,
      role: who,
      // Low cost: the password is never used, the hash only marks the account as set up.
      passwordHash: await bcrypt.hash(randomUUID(), 4),
    });
    const { token } = await services.sessions.create(user);
    return { Authorization: `Bearer ${token}` };
  }
  const { secret } = await services.apiKeys.create(system, { name: `Test key (${who.keyScopes.join(', ')})`, scopes: who.keyScopes as KeyScope[] });
  return { Authorization: `Bearer ${secret}` };
}

/** Credentials minted once per role or scope set and reused (each one is a user or key in the database). */
export function credentialCache(services: Services, organisationId: string) {
  const cache = new Map<string, Promise<Record<string, string>>>();
  return (who: Who, options: { fresh?: boolean } = {}) => {
    if (options.fresh) return mintCredentials(services, organisationId, who);
    const key = typeof who === 'string' ? who : `key:${[...who.keyScopes].sort().join(',')}`;
    let headers = cache.get(key);
    if (!headers) {
      headers = mintCredentials(services, organisationId, who);
      cache.set(key, headers);
    }
    return headers;
  };
}
