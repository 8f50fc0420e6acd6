import { readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import type { Scope } from './scope.js';
import { holds, permissionTableMarkdown, PERMISSIONS, type Permission } from './permissions.js';

const readme = readFileSync(path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../../README.md'), 'utf8');

describe('permission matrix', () => {
  it('when the README is read, then its matrix is the one in the code (regenerate it from permissionTableMarkdown())', () => {
    const between = /<!-- permission-matrix:start -->\n([\s\S]*?)\n<!-- permission-matrix:end -->/.exec(readme);
    expect(between, 'README markers').not.toBeNull();
    expect(between![1]).toBe(permissionTableMarkdown());
  });

  it('when roles and keys are checked, then the issue\'s rules hold: viewers read, engineers write, admins administer', () => {
    const user = (role: 'admin' | 'engineer' | 'viewer'): Scope => ({ organisationId: 'o', actor: { kind: 'user', id: 'u', role } });
    const key = (...scopes: string[]): Scope => ({ organisationId: 'o', actor: { kind: 'key', id: 'k', scopes } });
    expect(holds(user('viewer'), 'read')).toBe(true);
    expect(holds(user('viewer'), 'write')).toBe(false);
    expect(holds(user('viewer'), 'report')).toBe(false);
    expect(holds(user('engineer'), 'write')).toBe(true);
    expect(holds(user('engineer'), 'report')).toBe(true);
    expect(holds(user('engineer'), 'admin')).toBe(false);
    expect(holds(user('admin'), 'admin')).toBe(true);
    expect(holds(key('ingest'), 'ingest')).toBe(true);
    expect(holds(key('ingest'), 'read')).toBe(false);
    expect(holds(key('read'), 'read')).toBe(true);
    expect(holds(key('read'), 'ingest')).toBe(false);
    // No key scope reaches administration, writing or e-mailing.
    for (const p of ['admin', 'write', 'report', 'session'] as Permission[]) expect(holds(key('read', 'ingest'), p), p).toBe(false);
    // Admins hold everything people can hold.
    for (const p of Object.keys(PERMISSIONS) as Permission[]) expect(holds(user('admin'), p), p).toBe(true);
  });
});
