import { execFileSync } from 'node:child_process';
import { createRequire } from 'node:module';
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

const require = createRequire(import.meta.url);
const sdkDir = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');

describe('generated types', () => {
  it('when regenerated from openapi.yaml, then they equal the committed file (run `npm run openapi`)', () => {
    const out = path.join(mkdtempSync(path.join(tmpdir(), 'sdk-gen-')), 'openapi.d.ts');
    execFileSync(process.execPath, [path.join(path.dirname(require.resolve('openapi-typescript/package.json')), 'bin/cli.js'), '../openapi.yaml', '--default-non-nullable', 'false', '-o', out], { cwd: sdkDir, stdio: 'pipe' });
    expect(readFileSync(out, 'utf8')).toBe(readFileSync(path.join(sdkDir, 'src/generated/openapi.d.ts'), 'utf8'));
  });

  it('when the list of operations that keep Idempotency-Keys is regenerated, then it equals the committed file', () => {
    const out = path.join(mkdtempSync(path.join(tmpdir(), 'sdk-gen-')), 'idempotent-operations.ts');
    execFileSync(process.execPath, ['--import', 'tsx', 'scripts/idempotent-operations.ts', '../openapi.yaml', out], { cwd: sdkDir, stdio: 'pipe' });
    expect(readFileSync(out, 'utf8')).toBe(readFileSync(path.join(sdkDir, 'src/generated/idempotent-operations.ts'), 'utf8'));
  });
});
