import { createClient } from '@headroom/sdk';
import { getSessionToken } from './session';

/**
 * The dashboard's one API client. It runs on the API's own origin, so the base URL is the page's; the
 * session token is read on every request, so signing in or out needs no new client.
 */
export const sdk = createClient({ baseUrl: window.location.origin, token: getSessionToken });
