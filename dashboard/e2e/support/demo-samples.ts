/**
 * Fills the demo traces with their samples through the real API (binary float32 at the trace's rate,
 * then close, which runs the analysis), unless the seed already stored them.
 */
import { DEMO_TRACES, DEMO_USERS, rawReadings } from '../../../seeds/demo.js';

async function call(baseUrl: string, token: string, path: string, init: RequestInit = {}): Promise<Response> {
  const res = await fetch(`${baseUrl}/api/v1${path}`, {
    ...init,
    headers: { Authorization: `Bearer ${token}`, ...(init.headers ?? {}) },
  });
  if (!res.ok) throw new Error(`${init.method ?? 'GET'} ${path}: ${res.status} ${await res.text()}`);
  return res;
}

export async function signInToken(baseUrl: string, role: 'admin' | 'engineer' | 'viewer'): Promise<string> {
  const user = DEMO_USERS.find((u) => u.role === role)!;
  const res = await fetch(`${baseUrl}/api/v1/auth/sign-in`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ email: user.email, password: user.password }),
  });
  if (!res.ok) throw new Error(`sign-in failed: ${res.status}`);
  return ((await res.json()) as { token: string }).token;
}

export async function fillDemoTraces(baseUrl: string): Promise<void> {
  const token = await signInToken(baseUrl, 'engineer');
  for (const demo of DEMO_TRACES) {
    const trace = (await (await call(baseUrl, token, `/traces/${demo.id}`)).json()) as {
      sampleCount: number;
      status: string;
      startTime: number | null;
    };
    if (trace.sampleCount === 0) {
      const values = rawReadings(demo);
      await call(baseUrl, token, `/traces/${demo.id}/samples`, {
        method: 'POST',
        headers: {
          'Content-Type': 'application/octet-stream',
          'Sample-Rate': String(demo.sampleRateHz),
          ...(trace.startTime !== null ? { 'Sample-Start': String(trace.startTime) } : {}),
        },
        body: new Blob([values.slice()]),
      });
    }
    if (trace.status === 'open') await call(baseUrl, token, `/traces/${demo.id}/close`, { method: 'POST' });
  }
}
