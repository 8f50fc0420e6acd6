/**
 * The permission matrix, enforced: generated from every /api/v1 route × no credentials × each role × each
 * API-key scope set, so a new route is covered the moment it is added to `v1Routes`. Holders must get
 * past authorisation (any answer but 401/403, and no 500), everyone else 403, and nobody 401 on a
 * public route or anything but 401 without credentials.
 */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ROLES } from '../models/user.js';
import { buildOpenApiDocument } from '../openapi/document.js';
import { v1Routes } from '../routes/v1/index.js';
import { makeTestApp, type TestApp } from '../testing/make-test-app.js';
import { PERMISSIONS } from './permissions.js';

/** The only routes anyone may call without credentials. Adding one here is a security decision. */
const PUBLIC_OPERATIONS = new Set(['signIn', 'requestPasswordReset', 'completePasswordReset', 'acceptInvitation']);

const KEY_SCOPE_SETS = [['read'], ['ingest'], ['ingest', 'read']];

type Who = (typeof ROLES)[number] | { keyScopes: string[] };
const label = (who: Who) => (typeof who === 'string' ? who : `key[${who.keyScopes.join('+')}]`);

function holds(permission: keyof typeof PERMISSIONS, who: Who): boolean {
  const rule = PERMISSIONS[permission];
  return typeof who === 'string' ? (rule.roles as readonly string[]).includes(who) : who.keyScopes.some((s) => (rule.keyScopes as readonly string[]).includes(s));
}

describe('permission matrix over every route', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await makeTestApp();
  });
  afterAll(() => t.close());

  /** A request to the route with made-up path parameters and an empty body. */
  function call(spec: (typeof v1Routes)[number]['spec'], headers: Record<string, string>) {
    const path = spec.path.replace(/\{(\w+)\}/g, '00000000-0000-4000-8000-00000000dead');
    const req = request(t.app)[spec.method](`/api/v1${path}`).set(headers);
    return spec.body ? req.send({}) : req;
  }

  it('when the route list is read, then every route names a known permission and only the listed ones are public', () => {
    expect(v1Routes.length).toBeGreaterThan(10);
    for (const { spec } of v1Routes) {
      expect(Object.keys(PERMISSIONS), spec.operationId).toContain(spec.permission);
      expect(spec.permission === 'public', `${spec.operationId} public?`).toBe(PUBLIC_OPERATIONS.has(spec.operationId));
    }
  });

  it('when the OpenAPI document is built, then each operation names its permission and accepts the matching credentials', () => {
    const doc = buildOpenApiDocument() as unknown as { paths: Record<string, Record<string, { security: Array<Record<string, string[]>>; 'x-permission': string; description: string }>> };
    for (const { spec } of v1Routes) {
      const op = doc.paths[spec.path]![spec.method]!;
      expect(op['x-permission'], spec.operationId).toBe(spec.permission);
      const rule = PERMISSIONS[spec.permission];
      const expected = spec.permission === 'public' ? [] : rule.keyScopes.length ? [{ session: [] }, { apiKey: [...rule.keyScopes] }] : [{ session: [] }];
      expect(op.security, spec.operationId).toEqual(expected);
      if (spec.permission !== 'public') expect(op.description, spec.operationId).toContain(`Permission \`${spec.permission}\``);
    }
  });

  it.each(v1Routes.map((r) => [`${r.spec.method.toUpperCase()} ${r.spec.path}`, r.spec] as const))('%s: no credentials', async (_name, spec) => {
    const res = await call(spec, {});
    if (spec.permission === 'public') {
      expect([401, 403]).not.toContain(res.status);
      expect(res.status).toBeLessThan(500);
    } else {
      expect(res.status).toBe(401);
      expect(res.body.type).toBe('/problems/unauthenticated');
    }
  });

  const callers: Who[] = [...ROLES, ...KEY_SCOPE_SETS.map((keyScopes) => ({ keyScopes }))];
  const cases = v1Routes.filter((r) => r.spec.permission !== 'public').flatMap((r) => callers.map((who) => [`${r.spec.method.toUpperCase()} ${r.spec.path} as ${label(who)}`, r.spec, who] as const));

  it.each(cases)('%s', async (_name, spec, who) => {
    // Fresh credentials each time: some holders end their own session (sign-out).
    const res = await call(spec, await t.auth(who, { fresh: true }));
    if (holds(spec.permission, who)) {
      expect([401, 403], `${res.status} ${JSON.stringify(res.body)}`).not.toContain(res.status);
      expect(res.status, JSON.stringify(res.body)).toBeLessThan(500);
    } else {
      expect(res.status, JSON.stringify(res.body)).toBe(403);
      expect(res.body.type).toBe('/problems/forbidden');
    }
  });
});
