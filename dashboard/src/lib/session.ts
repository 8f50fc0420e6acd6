/**
 * The signed-in session: the bearer token and who it belongs to. Kept in memory and mirrored to
 * sessionStorage, so a reload keeps the user signed in but closing the tab ends it (the token never goes
 * to localStorage or a cookie). Components read it through `useSession()`; the SDK reads the token through
 * `getSessionToken()` on every request.
 */
import { useSyncExternalStore } from 'react';
import type { components } from '@headroom/sdk';

export type Role = components['schemas']['Role'];
export type SessionUser = components['schemas']['UserSummary'];

export interface Session {
  token: string;
  /** ISO time at which the server stops accepting the token. */
  expiresAt: string;
  user: SessionUser;
  organisation?: { id: string; name: string };
}

/** Why there is no session: never signed in, signed out, or the server refused the token (401). */
export type SignedOutReason = 'none' | 'signed-out' | 'expired';

const STORAGE_KEY = 'headroom.session';

interface SessionState {
  session: Session | null;
  reason: SignedOutReason;
}

function readStored(storage: Storage | undefined): Session | null {
  try {
    const raw = storage?.getItem(STORAGE_KEY);
    if (!raw) return null;
    const parsed = JSON.parse(raw) as Session;
    if (typeof parsed.token !== 'string' || !parsed.user) return null;
    // A token past its expiry would only earn a 401; drop it now.
    if (parsed.expiresAt && Date.parse(parsed.expiresAt) <= Date.now()) return null;
    return parsed;
  } catch {
    return null;
  }
}

function browserStorage(): Storage | undefined {
  try {
    return typeof sessionStorage === 'undefined' ? undefined : sessionStorage;
  } catch {
    return undefined; // storage disabled by the browser: memory only
  }
}

/** A tiny observable store; one per page (created below), separate ones in tests. */
export function createSessionStore(storage: Storage | undefined = browserStorage()) {
  let state: SessionState = { session: readStored(storage), reason: 'none' };
  const listeners = new Set<() => void>();

  function set(next: SessionState) {
    state = next;
    try {
      if (next.session) storage?.setItem(STORAGE_KEY, JSON.stringify(next.session));
      else storage?.removeItem(STORAGE_KEY);
    } catch {
      // Quota or privacy mode: the in-memory copy still works for this page.
    }
    for (const listener of listeners) listener();
  }

  return {
    getState: () => state,
    getToken: () => state.session?.token,
    subscribe(listener: () => void) {
      listeners.add(listener);
      return () => listeners.delete(listener);
    },
    signIn(session: Session) {
      set({ session, reason: 'none' });
    },
    /** Updates who the user is (after GET /me) without touching the token. */
    updateIdentity(user: SessionUser, organisation?: { id: string; name: string }) {
      if (!state.session) return;
      set({ session: { ...state.session, user, ...(organisation ? { organisation } : {}) }, reason: state.reason });
    },
    signOut() {
      set({ session: null, reason: 'signed-out' });
    },
    /** The server answered 401 to a request that carried our token: the session is over. */
    expire() {
      if (state.session) set({ session: null, reason: 'expired' });
    },
  };
}

export type SessionStore = ReturnType<typeof createSessionStore>;

export const sessionStore = createSessionStore();

export const getSessionToken = () => sessionStore.getToken();

export function useSessionState(): SessionState {
  return useSyncExternalStore(sessionStore.subscribe, sessionStore.getState);
}

/** The current session, or null when signed out. */
export function useSession(): Session | null {
  return useSessionState().session;
}

/** What the current user may do in the dashboard (mirrors the API's permission matrix). */
export function abilitiesOf(role: Role | undefined) {
  return {
    /** Create and edit sites, circuits, loads and traces; upload. */
    canEdit: role === 'admin' || role === 'engineer',
    /** Send reports by e-mail. */
    canSendReports: role === 'admin' || role === 'engineer',
    /** Users, API keys, audit log. */
    canAdminister: role === 'admin',
  };
}

export function useAbilities() {
  return abilitiesOf(useSession()?.user.role);
}
