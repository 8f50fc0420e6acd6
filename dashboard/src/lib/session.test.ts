import { describe, expect, it } from 'vitest';
import { HeadroomApiError } from '@headroom/sdk';
import { abilitiesOf, createSessionStore, type Session } from './session';
import { createQueryClient } from './query-client';

const session = (expiresInMs = 3_600_000): Session => ({
  token: 'tok-123',
  expiresAt: new Date(Date.now() + expiresInMs).toISOString(),
  user: { id: 'u1', email: 'e@x.test', name: 'E', role: 'engineer' },
});

describe('session store', () => {
  it('when signed in, then the token survives a reload through sessionStorage', () => {
    sessionStorage.clear();
    createSessionStore(sessionStorage).signIn(session());
    const reloaded = createSessionStore(sessionStorage);
    expect(reloaded.getToken()).toBe('tok-123');
  });

  it('when the stored token is past its expiry, then a reload starts signed out', () => {
    sessionStorage.clear();
    createSessionStore(sessionStorage).signIn(session(-1000));
    expect(createSessionStore(sessionStorage).getToken()).toBeUndefined();
  });

  it('when signed out, then storage is cleared and the reason is recorded', () => {
    sessionStorage.clear();
    const store = createSessionStore(sessionStorage);
    store.signIn(session());
    store.signOut();
    expect(sessionStorage.length).toBe(0);
    expect(store.getState()).toEqual({ session: null, reason: 'signed-out' });
  });

  it('when a query answers 401, then the session expires', async () => {
    sessionStorage.clear();
    const store = createSessionStore(sessionStorage);
    store.signIn(session());
    const client = createQueryClient(store);
    const problem = { type: '/problems/unauthenticated', title: 'Not signed in', status: 401, detail: 'expired' };
    await client
      .fetchQuery({ queryKey: ['x'], queryFn: () => Promise.reject(new HeadroomApiError(problem)) })
      .catch(() => undefined);
    expect(store.getState().reason).toBe('expired');
    expect(store.getToken()).toBeUndefined();
  });

  it('when a query fails with 404, then the session is kept', async () => {
    sessionStorage.clear();
    const store = createSessionStore(sessionStorage);
    store.signIn(session());
    const client = createQueryClient(store);
    const problem = { type: '/problems/not-found', title: 'Not found', status: 404, detail: 'no' };
    await client
      .fetchQuery({ queryKey: ['y'], queryFn: () => Promise.reject(new HeadroomApiError(problem)) })
      .catch(() => undefined);
    expect(store.getToken()).toBe('tok-123');
  });
});

describe('abilities', () => {
  it('when the role is viewer, then nothing may be edited or administered', () => {
    expect(abilitiesOf('viewer')).toEqual({ canEdit: false, canSendReports: false, canAdminister: false });
    expect(abilitiesOf('engineer')).toEqual({ canEdit: true, canSendReports: true, canAdminister: false });
    expect(abilitiesOf('admin').canAdminister).toBe(true);
  });
});
