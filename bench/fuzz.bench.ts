/**
 * Fuzzing, long run (`npm run bench -- fuzz`): the route fuzzer of api/test/stress/fuzz-routes.test.ts
 * with 10,000 cases (FUZZ_CASES) instead of the few hundred `npm test` runs, and its answers tallied by
 * route. Exits non-zero on any broken invariant (5xx, hang, partial write, cross-organisation answer).
 */
import { spawnSync } from 'node:child_process';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const cases = process.env.FUZZ_CASES ?? '10000';
const started = performance.now();
const result = spawnSync('npx', ['vitest', 'run', '--project', 'api', 'api/test/stress/fuzz-routes.test.ts'], {
  cwd: root,
  stdio: 'inherit',
  env: { ...process.env, FUZZ_CASES: cases, FUZZ_REPORT: '1', NODE_ENV: 'test' },
});
console.log(`${cases} fuzz cases in ${((performance.now() - started) / 1000).toFixed(0)} s: ${result.status === 0 ? 'PASS' : 'FAIL'}`);
process.exit(result.status ?? 1);
