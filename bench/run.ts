/**
 * `npm run bench`: runs every `bench/*.bench.ts` in its own Node process (so one benchmark's heap and
 * page faults do not colour the next) and prints their figures. A name on the command line picks
 * benchmarks whose file name contains it: `npm run bench -- ingest`.
 *
 * Node is started with GLIBC_TUNABLES=glibc.malloc.hugetlb=1: on these VMs the first touch of fresh
 * memory costs ~11 µs per 4 KiB page, and transparent huge pages cut that by an order of magnitude.
 */
import { spawnSync } from 'node:child_process';
import { readdirSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const here = dirname(fileURLToPath(import.meta.url));
const filters = process.argv.slice(2);
const files = readdirSync(here)
  .filter((f) => f.endsWith('.bench.ts'))
  .filter((f) => filters.length === 0 || filters.some((x) => f.includes(x)))
  .sort();

let failed = 0;
for (const file of files) {
  console.log(`\n=== ${file} ===`);
  const result = spawnSync(process.execPath, ['--expose-gc', '--import', 'tsx', join(here, file)], {
    stdio: 'inherit',
    env: { ...process.env, GLIBC_TUNABLES: 'glibc.malloc.hugetlb=1', NODE_ENV: 'production' },
  });
  if (result.status !== 0) failed += 1;
}
if (files.length === 0) console.log('no benchmark matched');
process.exit(failed === 0 ? 0 : 1);
