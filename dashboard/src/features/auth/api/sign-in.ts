import { useMutation, useQueryClient } from '@tanstack/react-query';
import { unwrap, type components } from '@headroom/sdk';
import { sdk } from '../../../lib/sdk';
import { sessionStore, type Session } from '../../../lib/session';

export interface Credentials {
  email: string;
  password: string;
}

function toSession(answer: components['schemas']['SignedIn']): Session {
  return { token: answer.token, expiresAt: answer.expiresAt, user: answer.user, organisation: answer.organisation };
}

/** Signs in; on success the session store holds the token and every cached answer of a previous user is dropped. */
export function useSignIn() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (credentials: Credentials) => unwrap(sdk.POST('/auth/sign-in', { body: credentials })),
    onSuccess: (answer) => {
      queryClient.clear();
      sessionStore.signIn(toSession(answer));
    },
  });
}

/** Ends the session on the server (best effort: a network failure still signs out here) and forgets it. */
export function useSignOut() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async () => {
      await unwrap(sdk.POST('/auth/sign-out')).catch(() => undefined);
    },
    onSettled: () => {
      sessionStore.signOut();
      queryClient.clear();
    },
  });
}

/** Accepts an invitation (sets name and password) and signs the new user in. */
export function useAcceptInvitation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: { token: string; name: string; password: string }) =>
      unwrap(sdk.POST('/auth/invitations/accept', { body })),
    onSuccess: (answer) => {
      queryClient.clear();
      sessionStore.signIn(toSession(answer));
    },
  });
}

/** Asks for a password-reset e-mail. The server answers 202 whether or not the address is known. */
export function useRequestPasswordReset() {
  return useMutation({
    mutationFn: (body: { email: string }) => unwrap(sdk.POST('/auth/password-reset', { body })),
  });
}

export function useCompletePasswordReset() {
  return useMutation({
    mutationFn: (body: { token: string; password: string }) =>
      unwrap(sdk.POST('/auth/password-reset/complete', { body })),
  });
}
