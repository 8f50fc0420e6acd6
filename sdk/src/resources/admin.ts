import { unwrap, type HeadroomClient } from '../client.js';
import type { components, operations } from '../generated/openapi.js';
import { pageThrough, type PageIterator } from '../paginate.js';
import { callInit, type ListFilters, type RequestOptions } from './request-options.js';

type Schemas = components['schemas'];
export type User = Schemas['User'];
export type UserInvite = Schemas['UserInvite'];
export type UserUpdate = Schemas['UserUpdate'];
export type ApiKey = Schemas['ApiKey'];
export type ApiKeyCreate = Schemas['ApiKeyCreate'];
export type ApiKeyWithSecret = Schemas['ApiKeyWithSecret'];
export type AuditEvent = Schemas['AuditEvent'];
export type AuditEventFilters = ListFilters<operations['listAuditEvents']['parameters']['query']>;

/** Users of the organisation (admins only). */
export function usersResource(client: HeadroomClient) {
  return {
    list(options?: RequestOptions): PageIterator<User> {
      return pageThrough((cursor) => unwrap(client.GET('/users', { params: { query: { cursor } }, ...callInit(options) })));
    },
    get(userId: string, options?: RequestOptions): Promise<User> {
      return unwrap(client.GET('/users/{userId}', { params: { path: { userId } }, ...callInit(options) }));
    },
    /** Invites by e-mail; the invitee sets a password through the one-time link. */
    invite(invite: UserInvite, options?: RequestOptions): Promise<User> {
      return unwrap(client.POST('/users', { body: invite, ...callInit(options) }));
    },
    /** Changes the role, or deactivates (`active: false`, ending the user's sessions at once). */
    update(userId: string, changes: UserUpdate, options?: RequestOptions): Promise<User> {
      return unwrap(client.PATCH('/users/{userId}', { params: { path: { userId } }, body: changes, ...callInit(options) }));
    },
  };
}

/** API keys for integrators and scripts (admins only). The secret is shown once, at create and rotate. */
export function apiKeysResource(client: HeadroomClient) {
  return {
    list(options?: RequestOptions): PageIterator<ApiKey> {
      return pageThrough((cursor) => unwrap(client.GET('/api-keys', { params: { query: { cursor } }, ...callInit(options) })));
    },
    get(keyId: string, options?: RequestOptions): Promise<ApiKey> {
      return unwrap(client.GET('/api-keys/{keyId}', { params: { path: { keyId } }, ...callInit(options) }));
    },
    /** A new key with scopes `ingest` and/or `read`; keep `secret` now, it is never shown again. */
    create(key: ApiKeyCreate, options?: RequestOptions): Promise<ApiKeyWithSecret> {
      return unwrap(client.POST('/api-keys', { body: key, ...callInit(options) }));
    },
    /** Revokes the key; it stops working on the next request. */
    async revoke(keyId: string, options?: RequestOptions): Promise<void> {
      await unwrap(client.DELETE('/api-keys/{keyId}', { params: { path: { keyId } }, ...callInit(options) }));
    },
    /** A new secret for the key; the old one stops working. */
    rotate(keyId: string, options?: RequestOptions): Promise<ApiKeyWithSecret> {
      return unwrap(client.POST('/api-keys/{keyId}/rotate', { params: { path: { keyId } }, ...callInit(options) }));
    },
  };
}

/** The audit log: who did what and when (admins only). */
export function auditEventsResource(client: HeadroomClient) {
  return {
    list(filters: AuditEventFilters = {}, options?: RequestOptions): PageIterator<AuditEvent> {
      return pageThrough((cursor) => unwrap(client.GET('/audit-events', { params: { query: { ...filters, cursor } }, ...callInit(options) })));
    },
  };
}
