import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  createHeadroom,
  HeadroomApiError,
  HeadroomAuthenticationError,
  HeadroomConflictError,
  HeadroomNotFoundError,
  HeadroomPermissionError,
  HeadroomValidationError,
  paginate,
  type Headroom,
} from '../src/index.js';
import { startApiServer, type ApiServer } from './api-server.js';

let api: ApiServer;
let headroom: Headroom;

beforeAll(async () => {
  api = await startApiServer();
  headroom = createHeadroom({ baseUrl: api.baseUrl, token: await api.token('engineer'), retry: { initialDelayMs: 10 } });
});
afterAll(() => api.close());

const counter20 = { label: 'Counter, left of the sink', nominalVoltageV: 120, mainsHz: 60, deviceRatingA: 20, deviceKind: 'na-thermal-magnetic', conductorSize: '12 AWG' } as const;

describe('sites, circuits and loads through the SDK', () => {
  it('when a site is created, read, changed and deleted, then each answer is the stored state', async () => {
    const site = await headroom.sites.create({ name: 'Mill Lane community hall', address: '4 Mill Lane' });
    expect(site).toMatchObject({ name: 'Mill Lane community hall', address: '4 Mill Lane', circuitCount: 0 });
    expect(await headroom.sites.get(site.id)).toEqual(site);
    const changed = await headroom.sites.update(site.id, { notes: 'Kitchen refit, phase 2' });
    expect(changed.notes).toBe('Kitchen refit, phase 2');
    await headroom.sites.delete(site.id);
    await expect(headroom.sites.get(site.id)).rejects.toBeInstanceOf(HeadroomNotFoundError);
  });

  it('when more sites exist than one page holds, then the async iterator walks every page in order', async () => {
    const names = Array.from({ length: 7 }, (_, i) => `Paging site ${i}`);
    for (const name of names) await headroom.sites.create({ name });
    const seen: string[] = [];
    for await (const site of headroom.sites.list({ limit: 2 })) if (site.name.startsWith('Paging site')) seen.push(site.name);
    expect(seen).toEqual(names);
    const pages: number[] = [];
    for await (const page of headroom.sites.list({ limit: 3 }).pages()) pages.push(page.items.length);
    expect(pages.length).toBeGreaterThanOrEqual(3);
    expect(await headroom.sites.list({ limit: 2 }).toArray({ limit: 3 })).toHaveLength(3);
    // the typed low-level form gives the same items
    const viaPaginate = await paginate(headroom.client, '/sites', { params: { query: { limit: 2 } } }).toArray();
    expect(viaPaginate.map((s) => s.name).filter((n) => n.startsWith('Paging site'))).toEqual(names);
  });

  it('when a circuit gets loads, then the check judges them and a what-if adds a load without storing it', async () => {
    const site = await headroom.sites.create({ name: 'Check site' });
    const circuit = await headroom.circuits.create(site.id, counter20);
    expect(circuit).toMatchObject({ siteId: site.id, deviceRatingA: 20 });
    expect((await headroom.circuits.list({ siteId: site.id }).toArray()).map((c) => c.id)).toEqual([circuit.id]);
    expect((await headroom.circuits.update(circuit.id, { notes: 'new breaker 2025' })).notes).toBe('new breaker 2025');

    const toaster = await headroom.loads.create(circuit.id, { name: 'Toaster oven', nameplateA: 9, connection: 'cord-and-plug' });
    expect(await headroom.loads.get(toaster.id)).toMatchObject({ name: 'Toaster oven', nameplateA: 9 });
    expect((await headroom.loads.update(toaster.id, { notes: 'on the island' })).notes).toBe('on the island');
    expect(await headroom.loads.list(circuit.id).toArray()).toHaveLength(1);

    // source: api checks.api.test.ts worked example (NEC 210.23: 9 A alone on 20 A leaves 11 A; 9 + 13 = 22 A is over)
    const alone = await headroom.checks.get(circuit.id);
    expect(alone).toMatchObject({ verdict: 'fine', headroomA: 11 });
    const withVacuum = await headroom.checks.whatIf(circuit.id, { extraLoads: [{ name: 'Shop vacuum', nameplateA: 13, connection: 'cord-and-plug', startPeakA: 30, startDurationS: 0.3 }] });
    expect(withVacuum.verdict).toBe('over-the-limit');
    expect(withVacuum.headroomA).toBeCloseTo(-2, 9);
    expect(await headroom.loads.list(circuit.id).toArray()).toHaveLength(1);

    await headroom.loads.delete(toaster.id);
    await headroom.circuits.delete(circuit.id);
    await expect(headroom.circuits.get(circuit.id)).rejects.toBeInstanceOf(HeadroomNotFoundError);
  });
});

describe('reports', () => {
  it('when a circuit\'s and a site\'s reports are fetched and one is e-mailed, then the bytes and the mail arrive', async () => {
    const site = await headroom.sites.create({ name: 'Report site' });
    const circuit = await headroom.circuits.create(site.id, counter20);
    await headroom.loads.create(circuit.id, { name: 'Toaster oven', nameplateA: 9, connection: 'cord-and-plug' });
    const pdf = await headroom.reports.circuit(circuit.id);
    // source: ISO 32000-1 §7.5.2: a PDF file begins with the header "%PDF-"
    expect(new TextDecoder().decode(pdf.bytes.subarray(0, 5))).toBe('%PDF-');
    expect(pdf).toMatchObject({ contentType: 'application/pdf', filename: expect.stringMatching(/\.pdf$/) });
    const csv = await headroom.reports.site(site.id, 'csv');
    expect(csv.contentType).toMatch(/^text\/csv/);
    expect(new TextDecoder().decode(csv.bytes)).toContain('Toaster oven');
    const sent = await headroom.reports.emailCircuit(circuit.id, { to: 'client@example.test' });
    expect(sent).toMatchObject({ to: 'client@example.test', verdict: 'fine' });
    const mail = await api.t.mailbox!.waitFor((m) => m.to.includes('client@example.test'));
    expect(mail.subject).toBe(sent.subject);
  });
});

describe('analysis without storage', () => {
  it('when a steady 10 A RMS series is analysed, then min, max and mean are 10 A', async () => {
    // common practice, no source: the statistics of a constant series are that constant
    const t = Array.from({ length: 50 }, (_, i) => 1_700_000_000_000 + i * 1000);
    const result = await headroom.analyze({ kind: 'rms', t, a: new Float32Array(50).fill(10) });
    expect(result).toMatchObject({ sampleCount: 50, firstAt: t[0], lastAt: t[49] });
    expect(result.statistics).toMatchObject({ count: 50, minA: 10, maxA: 10 });
    expect(result.statistics.meanA).toBeCloseTo(10, 9);
  });
});

describe('typed errors carry the problem body', () => {
  it('when a field is invalid, then HeadroomValidationError points at it', async () => {
    const error = await headroom.sites.create({ name: '' }).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(HeadroomValidationError);
    expect(error).toBeInstanceOf(HeadroomApiError);
    const e = error as HeadroomValidationError;
    expect(e.status).toBe(400);
    expect(e.problem.type).toBe('/problems/validation');
    expect(e.fieldErrors).toContainEqual(expect.objectContaining({ pointer: '/name' }));
    expect(e.requestId).toBeTruthy();
    expect(e.message).toMatch(/\/name/);
  });

  it('when the token is wrong, then HeadroomAuthenticationError (401)', async () => {
    const stranger = createHeadroom({ baseUrl: api.baseUrl, token: 'not-a-real-token' });
    await expect(stranger.sites.list().toArray()).rejects.toBeInstanceOf(HeadroomAuthenticationError);
  });

  it('when a viewer writes, then HeadroomPermissionError (403) with the API\'s message', async () => {
    const viewer = createHeadroom({ baseUrl: api.baseUrl, token: await api.token('viewer') });
    const error = await viewer.sites.create({ name: 'Not allowed' }).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(HeadroomPermissionError);
    expect((error as HeadroomPermissionError).problem.detail).toMatch(/permission/);
  });

  it('when a check cannot be judged, then HeadroomConflictError (409)', async () => {
    const site = await headroom.sites.create({ name: 'Conflict site' });
    // source: IEC 60898-1 scope In ≤ 125 A: a 160 A device is outside the trip models, the check answers 409
    const circuit = await headroom.circuits.create(site.id, { ...counter20, deviceKind: 'iec-c', deviceRatingA: 160, nominalVoltageV: 230, mainsHz: 50 });
    await headroom.loads.create(circuit.id, { name: 'Heater', nameplateA: 10, connection: 'fastened-in-place' });
    const error = await headroom.checks.get(circuit.id).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(HeadroomConflictError);
  });
});

describe('account and admin', () => {
  it('when an engineer asks who they are, then the user and organisation come back', async () => {
    const me = await headroom.account.me();
    expect(me.user?.role).toBe('engineer');
    expect(me.organisation.id).toBe(api.t.organisationId);
  });

  it('when an admin creates, lists, rotates and revokes a key, then the key works until revoked', async () => {
    const admin = createHeadroom({ baseUrl: api.baseUrl, token: await api.token('admin') });
    const created = await admin.apiKeys.create({ name: 'Gateway on the panel', scopes: ['ingest', 'read'] });
    expect(created.secret).toBeTruthy();
    expect((await admin.apiKeys.list().toArray()).map((k) => k.id)).toContain(created.apiKey.id);
    const rotated = await admin.apiKeys.rotate(created.apiKey.id);
    expect(rotated.secret).not.toBe(created.secret);
    const gateway = createHeadroom({ baseUrl: api.baseUrl, token: rotated.secret });
    expect((await gateway.account.me()).apiKey?.id).toBe(created.apiKey.id);
    await admin.apiKeys.revoke(created.apiKey.id);
    await expect(gateway.account.me()).rejects.toBeInstanceOf(HeadroomAuthenticationError);
    const events = await admin.auditEvents.list({ action: 'api-key.revoked' }).toArray();
    expect(events.length).toBeGreaterThan(0);
  });

  it('when an admin invites a user and changes the role, then the list shows it', async () => {
    const admin = createHeadroom({ baseUrl: api.baseUrl, token: await api.token('admin') });
    const user = await admin.users.invite({ email: 'new.apprentice@example.test', name: 'New apprentice', role: 'viewer' });
    const changed = await admin.users.update(user.id, { role: 'engineer' });
    expect(changed.role).toBe('engineer');
    expect((await admin.users.list().toArray()).map((u) => u.email)).toContain('new.apprentice@example.test');
    await expect(headroom.users.list().toArray()).rejects.toBeInstanceOf(HeadroomPermissionError);
  });
});
