import { describe, expect, it } from 'vitest';
import { siteRoutes } from '../../../src/routes/v1/sites.js';
import { concretePath, invariantViolations, pathParamNames, type FuzzCase, type IdPool } from './fuzz-harness.js';

const getSite = siteRoutes.find((r) => r.spec.method === 'get' && r.spec.path === '/sites/{siteId}')!;
const pool: IdPool = { own: new Map([['sites', ['own-site']]]), other: new Map([['sites', ['other-site']]]), otherIds: new Set(['other-site']) };
const fuzz = (pathValues: FuzzCase['pathValues']): FuzzCase => ({ caller: 'admin', garbageToken: '', pathValues, query: [], headers: {}, body: { kind: 'none' } });
const ok = { status: 200, contentType: 'application/json', text: '{}', body: {} };

describe('the fuzz harness checks', () => {
  it('when a path is made, then parameters come from the right organisation or are encoded text', () => {
    expect(pathParamNames('/sites/{siteId}/circuits/{circuitId}')).toEqual(['siteId', 'circuitId']);
    expect(concretePath(getSite, fuzz([{ kind: 'own', index: 7 }]), pool)).toBe('/sites/own-site');
    expect(concretePath(getSite, fuzz([{ kind: 'other', index: 0 }]), pool)).toBe('/sites/other-site');
    expect(concretePath(getSite, fuzz([{ kind: 'text', value: '../x?y' }]), pool)).toBe('/sites/..%2Fx%3Fy');
  });

  it('when an answer breaks a rule, then it is reported', () => {
    const own = fuzz([{ kind: 'own', index: 0 }]);
    expect(invariantViolations(ok, own, pool, [], getSite)).toEqual([]);
    expect(invariantViolations({ ...ok, status: 500 }, own, pool, [], getSite)).toHaveLength(2);
    expect(invariantViolations({ ...ok, status: 400, contentType: 'text/html' }, own, pool, [], getSite)[0]).toMatch(/not problem details/);
    expect(invariantViolations({ ...ok, status: 400, contentType: 'application/problem+json' }, own, pool, ['sites'], getSite).join()).toMatch(/left writes behind/);
    expect(invariantViolations(ok, own, pool, ['sites'], getSite).join()).toMatch(/a GET changed sites/);
    expect(invariantViolations({ ...ok, text: 'Error\n    at find (sites.ts:12:3)' }, own, pool, [], getSite).join()).toMatch(/internals/);
    expect(invariantViolations(ok, fuzz([{ kind: 'other', index: 0 }]), pool, [], getSite).join()).toMatch(/another organisation's id answered/);
    expect(invariantViolations({ ...ok, text: '{"id":"other-site"}' }, own, pool, [], getSite).join()).toMatch(/holds another organisation's id/);
  });
});
