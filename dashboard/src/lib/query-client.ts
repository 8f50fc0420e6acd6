import { QueryClient } from '@tanstack/react-query';
import { HeadroomApiError } from '@headroom/sdk';

/** Client errors (4xx) are answers, not glitches: do not retry them. */
export function createQueryClient() {
  return new QueryClient({
    defaultOptions: {
      queries: {
        staleTime: 15_000,
        retry: (count, error) => !(error instanceof HeadroomApiError && error.status < 500) && count < 2,
      },
    },
  });
}
