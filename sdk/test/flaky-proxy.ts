import { createServer, request as httpRequest, type IncomingMessage, type Server, type ServerResponse } from 'node:http';
import type { AddressInfo } from 'node:net';

/**
 * What the proxy does with one request:
 * - `pass`: forward it and relay the answer;
 * - `drop-before`: close the connection without forwarding (the API never sees it);
 * - `drop-after`: forward it, let the API finish (and store), then close the connection instead of
 *   answering, so the client cannot know whether it worked;
 * - `429` / `503`: answer that status (with `Retry-After: 0`) without forwarding.
 */
export type ProxyAction = 'pass' | 'drop-before' | 'drop-after' | '429' | '503';

export interface ProxyRequestRecord {
  method: string;
  url: string;
  idempotencyKey: string | undefined;
  action: ProxyAction;
}

/** A proxy on 127.0.0.1 in front of the API that misbehaves as `script` says, request by request. */
export async function startFlakyProxy(upstreamOrigin: string, script: (request: { method: string; url: string; index: number }) => ProxyAction) {
  const upstream = new URL(upstreamOrigin);
  const records: ProxyRequestRecord[] = [];
  const server: Server = createServer((req: IncomingMessage, res: ServerResponse) => {
    const index = records.length;
    const action = script({ method: req.method ?? 'GET', url: req.url ?? '/', index });
    records.push({ method: req.method ?? 'GET', url: req.url ?? '/', idempotencyKey: req.headers['idempotency-key'] as string | undefined, action });
    if (action === 'drop-before') {
      req.socket.destroy();
      return;
    }
    if (action === '429' || action === '503') {
      req.resume();
      req.on('end', () => {
        res.writeHead(Number(action), { 'Content-Type': 'application/problem+json', 'Retry-After': '0' });
        res.end(JSON.stringify({ type: action === '429' ? '/problems/rate-limited' : '/problems/unavailable', title: 'Scripted', status: Number(action), detail: `proxy answered ${action}` }));
      });
      return;
    }
    const forward = httpRequest({ host: upstream.hostname, port: upstream.port, method: req.method, path: req.url, headers: req.headers }, (answer) => {
      if (action === 'drop-after') {
        // Read the whole answer so the API has finished, then hang up on the client.
        answer.resume();
        answer.on('end', () => req.socket.destroy());
        return;
      }
      res.writeHead(answer.statusCode ?? 502, answer.headers);
      answer.pipe(res);
    });
    forward.on('error', () => req.socket.destroy());
    req.pipe(forward);
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  return {
    baseUrl: `http://127.0.0.1:${(server.address() as AddressInfo).port}`,
    records,
    async close() {
      server.closeAllConnections();
      await new Promise((resolve) => server.close(resolve));
    },
  };
}
