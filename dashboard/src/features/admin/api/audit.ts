import { keepPreviousData, useInfiniteQuery } from '@tanstack/react-query';
import { unwrap, type components } from '@headroom/sdk';
import { sdk } from '../../../lib/sdk';

export type AuditEvent = components['schemas']['AuditEvent'];
export type AuditAction = AuditEvent['action'];

/** The audit log, newest first, a page at a time ("Load more" follows the cursor). */
export function useAuditEvents(action: AuditAction | '') {
  return useInfiniteQuery({
    queryKey: ['audit', 'list', { action }],
    queryFn: ({ pageParam }) =>
      unwrap(
        sdk.GET('/audit-events', {
          params: { query: { limit: 50, ...(action ? { action } : {}), ...(pageParam ? { cursor: pageParam } : {}) } },
        }),
      ),
    initialPageParam: '' as string,
    getNextPageParam: (last) => last.nextCursor ?? undefined,
    placeholderData: keepPreviousData,
  });
}
