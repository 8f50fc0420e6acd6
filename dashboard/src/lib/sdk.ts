import { createClient } from '@headroom/sdk';

/** The dashboard's one API client. It runs on the API's own origin, so the base URL is the page's. */
export const sdk = createClient({ baseUrl: window.location.origin });
