/**
 * Builds the dashboard for browser tests when `dist/` is missing or older than any source file. Several
 * test files may start at once, so the build runs under a lock directory (mkdir is atomic) and the others
 * wait for it.
 */
import { execFileSync } from 'node:child_process';
import { existsSync, mkdirSync, readdirSync, rmSync, statSync } from 'node:fs';
import { createRequire } from 'node:module';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

export const dashboardDir = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
export const distDir = path.join(dashboardDir, 'dist');
const lockDir = path.join(dashboardDir, '.build-lock');
const require = createRequire(import.meta.url);

function newestMtime(target: string): number {
  const info = statSync(target);
  if (!info.isDirectory()) return info.mtimeMs;
  let newest = 0;
  for (const entry of readdirSync(target)) newest = Math.max(newest, newestMtime(path.join(target, entry)));
  return newest;
}

/** Inputs of the build: our sources, the page, the config, and the SDK the dashboard bundles. */
function sourcesMtime(): number {
  const inputs = [
    'src',
    'build',
    'public',
    'index.html',
    'vite.config.ts',
    'package.json',
    '../sdk/src',
    'e2e/support/build.ts',
  ].map((p) => path.join(dashboardDir, p));
  return Math.max(...inputs.filter((p) => existsSync(p)).map(newestMtime));
}

export function isBuildStale(): boolean {
  const index = path.join(distDir, 'index.html');
  if (!existsSync(index)) return true;
  return statSync(index).mtimeMs < sourcesMtime();
}

function sleep(ms: number) {
  return new Promise((resolve) => setTimeout(resolve, ms));
}

/** Runs `vite build` if the build is stale; returns whether it built. */
export async function ensureDashboardBuilt(): Promise<boolean> {
  for (;;) {
    try {
      mkdirSync(lockDir);
      break;
    } catch {
      // Another test file is building; a lock older than 5 minutes is left over from a crash.
      if (existsSync(lockDir) && Date.now() - statSync(lockDir).mtimeMs > 300_000)
        rmSync(lockDir, { recursive: true, force: true });
      await sleep(250);
    }
  }
  try {
    if (!isBuildStale()) return false;
    const viteBin = path.join(path.dirname(require.resolve('vite/package.json')), 'bin/vite.js');
    // NODE_ENV=production whatever the caller's (vitest sets "test", which would make Vite bundle React's
    // development build): tests and the bench measure what users get.
    execFileSync(process.execPath, [viteBin, 'build', '--logLevel', 'warn'], {
      cwd: dashboardDir,
      stdio: 'inherit',
      env: { ...process.env, NODE_ENV: 'production' },
    });
    return true;
  } finally {
    rmSync(lockDir, { recursive: true, force: true });
  }
}
