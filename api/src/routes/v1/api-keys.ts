import { defineRoute, type RouteDefinition } from '../define-route.js';
import { Pagination } from './schemas/common.js';
import { ApiKey, ApiKeyCreate, ApiKeyPage, ApiKeyParams, ApiKeyWithSecret } from './schemas/accounts.js';

const tags = ['API keys'];

export const apiKeyRoutes: RouteDefinition[] = [
  defineRoute(
    {
      method: 'get',
      path: '/api-keys',
      operationId: 'listApiKeys',
      summary: 'List the organisation\'s API keys (never their secrets)',
      tags,
      permission: 'admin',
      query: Pagination,
      responses: { 200: { description: 'A page of API keys', schema: ApiKeyPage } },
    },
    async ({ services, scope, query }) => ({ status: 200, body: await services.apiKeys.list(scope, query) }),
  ),
  defineRoute(
    {
      method: 'post',
      path: '/api-keys',
      operationId: 'createApiKey',
      summary: 'Create an API key',
      description: 'The answer holds the full key (`secret`) this once only; Headroom keeps only a hash of it.',
      tags,
      permission: 'admin',
      body: ApiKeyCreate,
      responses: { 201: { description: 'The new key and its secret', schema: ApiKeyWithSecret } },
    },
    async ({ services, scope, body }) => ({ status: 201, body: await services.apiKeys.create(scope, body) }),
  ),
  defineRoute(
    {
      method: 'get',
      path: '/api-keys/{keyId}',
      operationId: 'getApiKey',
      summary: 'Get an API key (never its secret)',
      tags,
      permission: 'admin',
      params: ApiKeyParams,
      responses: { 200: { description: 'The key', schema: ApiKey } },
    },
    async ({ services, scope, params }) => ({ status: 200, body: await services.apiKeys.get(scope, params.keyId) }),
  ),
  defineRoute(
    {
      method: 'delete',
      path: '/api-keys/{keyId}',
      operationId: 'revokeApiKey',
      summary: 'Revoke an API key',
      description: 'The next request with the key is refused (401). The key stays in the list as `revoked`.',
      tags,
      permission: 'admin',
      params: ApiKeyParams,
      responses: { 204: { description: 'Revoked' } },
    },
    async ({ services, scope, params }) => {
      await services.apiKeys.revoke(scope, params.keyId);
    },
  ),
  defineRoute(
    {
      method: 'post',
      path: '/api-keys/{keyId}/rotate',
      operationId: 'rotateApiKey',
      summary: 'Rotate an API key: a new secret for the same key',
      description: 'The old secret stops working at once; name, scopes and expiry stay. The new secret is shown this once only.',
      tags,
      permission: 'admin',
      params: ApiKeyParams,
      responses: { 200: { description: 'The key and its new secret', schema: ApiKeyWithSecret }, 409: { description: 'The key is revoked or expired' } },
    },
    async ({ services, scope, params }) => ({ status: 200, body: await services.apiKeys.rotate(scope, params.keyId) }),
  ),
];
