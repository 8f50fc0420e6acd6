/**
 * The real server (api/src/server.ts) as a child process on a given SQLite file and port, for the crash
 * and load runs: started, waited for until /readyz answers, and killed with any signal.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { once } from 'node:events';
import { createServer } from 'node:net';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const repoRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../../..');

export async function freePort(): Promise<number> {
  const server = createServer();
  server.listen(0, '127.0.0.1');
  await once(server, 'listening');
  const address = server.address();
  server.close();
  if (!address || typeof address === 'string') throw new Error('no port');
  return address.port;
}

export const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

export class ServerProcess {
  child: ChildProcess | undefined;
  output = '';
  constructor(
    private databaseFile: string,
    readonly port: number,
    /** Extra environment (rate limits, load shedding…). */
    private env: Record<string, string> = {},
  ) {}

  async start(): Promise<number> {
    const started = performance.now();
    this.child = spawn(process.execPath, ['--import', 'tsx', 'api/src/server.ts'], {
      cwd: repoRoot,
      env: {
        ...process.env,
        DATABASE_FILE: this.databaseFile,
        PORT: String(this.port),
        HOST: '127.0.0.1',
        SEED_DEMO: 'false',
        LOG_LEVEL: 'warn',
        NODE_ENV: 'production',
        GLIBC_TUNABLES: 'glibc.malloc.hugetlb=1',
        ...this.env,
      },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    const keep = (chunk: Buffer) => {
      this.output = (this.output + chunk.toString()).slice(-20_000);
    };
    this.child.stdout!.on('data', keep);
    this.child.stderr!.on('data', keep);
    for (let i = 0; i < 600; i++) {
      if (this.child.exitCode !== null) throw new Error(`The server exited at start:\n${this.output}`);
      try {
        const res = await fetch(`http://127.0.0.1:${this.port}/readyz`);
        if (res.ok) return performance.now() - started;
      } catch {
        // not listening yet
      }
      await sleep(50);
    }
    throw new Error(`The server did not become ready:\n${this.output}`);
  }

  async kill(signal: NodeJS.Signals): Promise<void> {
    const child = this.child;
    if (!child || child.exitCode !== null || child.signalCode !== null) return;
    const exited = once(child, 'exit');
    child.kill(signal);
    await exited;
  }

  /** True while the process runs. */
  get running(): boolean {
    return this.child !== undefined && this.child.exitCode === null && this.child.signalCode === null;
  }
}
