import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { unwrap, type components } from '@headroom/sdk';
import { sdk } from '../../../lib/sdk';

export type ApiKey = components['schemas']['ApiKey'];
export type KeyScope = components['schemas']['KeyScope'];

export const apiKeysOptions = () =>
  queryOptions({
    queryKey: ['api-keys', 'list'],
    queryFn: () => unwrap(sdk.GET('/api-keys', { params: { query: { limit: 500 } } })),
  });

export const useApiKeys = () => useQuery(apiKeysOptions());

/** The answer carries the secret once; it is handed to the caller and never cached. */
export function useCreateApiKey() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ expiresAt, ...rest }: { name: string; scopes: KeyScope[]; expiresAt: string | null }) =>
      unwrap(sdk.POST('/api-keys', { body: { ...rest, ...(expiresAt ? { expiresAt } : {}) } })),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['api-keys'] }),
  });
}

export function useRevokeApiKey() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (keyId: string) => unwrap(sdk.DELETE('/api-keys/{keyId}', { params: { path: { keyId } } })),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['api-keys'] }),
  });
}

export function useRotateApiKey() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (keyId: string) => unwrap(sdk.POST('/api-keys/{keyId}/rotate', { params: { path: { keyId } } })),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['api-keys'] }),
  });
}
