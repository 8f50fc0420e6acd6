import express from 'express';
import { once } from 'node:events';
import type { AddressInfo } from 'node:net';
import pino from 'pino';
import { afterEach, describe, expect, it } from 'vitest';
import { loadShedding } from './load-shedding.js';

/** An app whose one route waits until the test lets it answer. */
async function heldApp(maxInFlight: number) {
  const waiting: Array<() => void> = [];
  const shedding = loadShedding({ maxInFlight, retryAfterS: 2 });
  const app = express();
  app.use(shedding);
  app.get('/work', async (_req, res) => {
    await new Promise<void>((resolve) => waiting.push(resolve));
    res.json({ done: true });
  });
  const server = app.listen(0, '127.0.0.1');
  await once(server, 'listening');
  const url = `http://127.0.0.1:${(server.address() as AddressInfo).port}/work`;
  return { url, waiting, shedding, close: () => new Promise((resolve) => server.close(resolve)) };
}

const until = async (check: () => boolean) => {
  for (let i = 0; i < 200 && !check(); i++) await new Promise((resolve) => setTimeout(resolve, 10));
};

describe('load shedding', () => {
  let close: (() => Promise<unknown>) | undefined;
  afterEach(async () => {
    await close?.();
  });

  it('when the limit is reached, then the next request gets 503 with Retry-After at once, and passes again after one ends', async () => {
    const h = await heldApp(2);
    close = h.close;
    const first = fetch(h.url);
    const second = fetch(h.url);
    await until(() => h.waiting.length === 2);
    const refused = await fetch(h.url);
    expect(refused.status).toBe(503);
    expect(refused.headers.get('retry-after')).toBe('2');
    expect(refused.headers.get('content-type')).toMatch(/application\/problem\+json/);
    expect(await refused.json()).toMatchObject({ type: '/problems/unavailable', status: 503, instance: '/work', retryAfterS: 2 });
    expect(h.shedding.refused()).toBe(1);

    h.waiting.shift()!();
    expect((await first).status).toBe(200);
    await until(() => h.shedding.inFlight() === 1);
    const third = fetch(h.url);
    await until(() => h.waiting.length === 2);
    for (const release of h.waiting.splice(0)) release();
    expect((await second).status).toBe(200);
    expect((await third).status).toBe(200);
    await until(() => h.shedding.inFlight() === 0);
    expect(h.shedding.inFlight()).toBe(0);
  });

  it('when clients hang up before their answer, then their places are given back', async () => {
    const h = await heldApp(3);
    close = h.close;
    const controllers = [new AbortController(), new AbortController(), new AbortController()];
    const calls = controllers.map((c) => fetch(h.url, { signal: c.signal }).catch(() => 'aborted'));
    await until(() => h.waiting.length === 3);
    expect(h.shedding.inFlight()).toBe(3);
    for (const c of controllers) c.abort();
    expect(await Promise.all(calls)).toEqual(['aborted', 'aborted', 'aborted']);
    await until(() => h.shedding.inFlight() === 0);
    expect(h.shedding.inFlight()).toBe(0);
    for (const release of h.waiting.splice(0)) release();
  });

  it('when many requests are refused, then the log gets one summary line, not one per request', async () => {
    const lines: string[] = [];
    const logger = pino({ level: 'info' }, { write: (line: string) => lines.push(line) });
    const shedding = loadShedding({ maxInFlight: 0, logger, summaryEveryMs: 60_000 });
    const app = express();
    app.use(shedding);
    const server = app.listen(0, '127.0.0.1');
    await once(server, 'listening');
    close = () => new Promise((resolve) => server.close(resolve));
    const url = `http://127.0.0.1:${(server.address() as AddressInfo).port}/`;
    const answers = await Promise.all(Array.from({ length: 20 }, () => fetch(url).then((r) => r.status)));
    expect(answers).toEqual(Array(20).fill(503));
    expect(shedding.refused()).toBe(20);
    expect(lines).toHaveLength(1);
    expect(JSON.parse(lines[0]!)).toMatchObject({ msg: 'load shedding: requests refused with 503', refused: 1, maxInFlight: 0 });
  });
});
