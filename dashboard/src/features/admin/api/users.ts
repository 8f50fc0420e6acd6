import { keepPreviousData, queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { unwrap, type components } from '@headroom/sdk';
import { sdk } from '../../../lib/sdk';

export type User = components['schemas']['User'];
export type Role = components['schemas']['Role'];

export const usersOptions = (q: string) =>
  queryOptions({
    queryKey: ['users', 'list', { q }],
    queryFn: () => unwrap(sdk.GET('/users', { params: { query: { limit: 500, ...(q ? { q } : {}) } } })),
  });

export const useUsers = (q: string) => useQuery({ ...usersOptions(q), placeholderData: keepPreviousData });

export function useInviteUser() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: { email: string; name: string; role: Role }) => unwrap(sdk.POST('/users', { body })),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['users'] }),
  });
}

export function useUpdateUser() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ userId, ...body }: { userId: string; role?: Role; active?: boolean }) =>
      unwrap(sdk.PATCH('/users/{userId}', { params: { path: { userId } }, body })),
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: ['users'] }),
        queryClient.invalidateQueries({ queryKey: ['audit'] }),
      ]),
  });
}
