import { MutationCache, QueryCache, QueryClient } from '@tanstack/react-query';
import { HeadroomApiError } from '@headroom/sdk';
import { sessionStore, type SessionStore } from './session';

/** True for an answer that says the caller is not (or no longer) signed in. */
export const isUnauthenticated = (error: unknown) => error instanceof HeadroomApiError && error.status === 401;

/**
 * No retries here: the SDK already retries what is safe to retry (connection failures, 5xx, 429), and
 * client errors (4xx) are answers, not glitches. A 401 to a signed-in request means
 * the session ended (expired, or signed out elsewhere): the session store is told, and the route guard
 * sends the user to sign in and back.
 */
export function createQueryClient(store: SessionStore = sessionStore) {
  const onError = (error: unknown) => {
    if (isUnauthenticated(error)) store.expire();
  };
  return new QueryClient({
    queryCache: new QueryCache({ onError }),
    mutationCache: new MutationCache({ onError }),
    defaultOptions: {
      queries: {
        staleTime: 15_000,
        retry: false,
      },
    },
  });
}
