import { queryOptions, useQuery } from '@tanstack/react-query';
import { useEffect } from 'react';
import { unwrap } from '@headroom/sdk';
import { sdk } from '../../../lib/sdk';
import { sessionStore } from '../../../lib/session';

export const meOptions = () =>
  queryOptions({
    queryKey: ['me'],
    queryFn: () => unwrap(sdk.GET('/me')),
    staleTime: 60_000,
  });

/**
 * Checks the stored session against the server and keeps the user's name and role current (an admin
 * may have changed the role since sign-in). A 401 here ends the session through the query client.
 */
export function useCurrentIdentity(enabled: boolean) {
  const me = useQuery({ ...meOptions(), enabled });
  const data = me.data;
  useEffect(() => {
    if (data?.user) sessionStore.updateIdentity(data.user, data.organisation);
  }, [data]);
  return me;
}
