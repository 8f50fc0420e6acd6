import { createHeadroom } from '@headroom/sdk';
import { getSessionToken } from './session';

/**
 * The dashboard's one API client. It runs on the API's own origin, so the base URL is the page's; the
 * session token is read on every request, so signing in or out needs no new client. The SDK retries
 * what is safe to retry (connection failures, 5xx, 429) and adds idempotency keys to POSTs.
 */
export const headroom = createHeadroom({ baseUrl: window.location.origin, token: getSessionToken });

/** The typed client: `sdk.GET('/traces/{traceId}', …)`. */
export const sdk = headroom.client;
