import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import type { Config } from '../../api/src/config/config.js';
import { makeTestApp, type TestApp } from '../../api/src/testing/make-test-app.js';

/** The real API, in this process, listening on an ephemeral 127.0.0.1 port over a temporary database. */
export interface ApiServer {
  /** Origin to give the SDK (`http://127.0.0.1:PORT`). */
  baseUrl: string;
  t: TestApp;
  /** A bearer token for a user of this role, or an API key with these scopes. */
  token(who?: Parameters<TestApp['auth']>[0]): Promise<string>;
  close(): Promise<void>;
}

export async function startApiServer(options: { config?: Partial<Config> } = {}): Promise<ApiServer> {
  const t = await makeTestApp({ file: true, ...(options.config ? { config: options.config } : {}) });
  const server: Server = await new Promise((resolve) => {
    const s = t.app.listen(0, '127.0.0.1', () => resolve(s));
  });
  return {
    baseUrl: `http://127.0.0.1:${(server.address() as AddressInfo).port}`,
    t,
    async token(who = 'engineer') {
      const headers = await t.auth(who);
      return (headers.Authorization ?? '').replace(/^Bearer /, '');
    },
    async close() {
      server.closeAllConnections();
      await new Promise((resolve) => server.close(resolve));
      await t.close();
    },
  };
}
