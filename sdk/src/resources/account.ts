import { unwrap, type HeadroomClient } from '../client.js';
import type { components } from '../generated/openapi.js';
import { callInit, type RequestOptions } from './request-options.js';

type Schemas = components['schemas'];
/**
 * `GET /me`. The generated type reads `user` as never-null (the document gives it as allOf with a null
 * branch, which the type generator cannot express); it is null when the caller is an API key.
 */
export type Me = Omit<Schemas['Me'], 'user'> & { user: Schemas['UserSummary'] | null };
export type SignedIn = Schemas['SignedIn'];

/** Who the caller is, and sessions for people (API keys need none of this). */
export function accountResource(client: HeadroomClient) {
  return {
    /** The signed-in user (or null for an API key), the organisation and the key in use. */
    async me(options?: RequestOptions): Promise<Me> {
      const me: Me = await unwrap(client.GET('/me', callInit(options)));
      return me;
    },
    /** Signs in with e-mail and password; the answer's `token` is the bearer token for later calls. */
    signIn(email: string, password: string, options?: RequestOptions): Promise<SignedIn> {
      return unwrap(client.POST('/auth/sign-in', { body: { email, password }, ...callInit(options) }));
    },
    /** Ends the current session on the server. */
    async signOut(options?: RequestOptions): Promise<void> {
      await unwrap(client.POST('/auth/sign-out', callInit(options)));
    },
  };
}
