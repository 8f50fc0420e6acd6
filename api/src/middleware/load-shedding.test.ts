import express from 'express';
import { once } from 'node:events';
import type { AddressInfo } from 'node:net';
import { afterEach, describe, expect, it } from 'vitest';
import { problemDetails } from './problem-details.js';
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
  app.use(problemDetails);
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
    expect(await refused.json()).toMatchObject({ type: '/problems/unavailable', status: 503, retryAfterS: 2 });

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
});
