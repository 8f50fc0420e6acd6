import { randomUUID } from 'node:crypto';
import { parse } from 'csv-parse/sync';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { makeTestApp, type TestApp } from '../../testing/make-test-app.js';
import { binaryBody, pdfText } from '../../testing/pdf-response.js';

const counter = { label: 'Counter, left (K3)', nominalVoltageV: 120, mainsHz: 60, deviceRatingA: 20, deviceKind: 'na-thermal-magnetic', conductorSize: '14 AWG', conductorMaterial: 'cu' };

describe('reports', () => {
  let t: TestApp;
  let siteId: string;
  let circuitId: string;

  beforeAll(async () => {
    t = await makeTestApp();
    const auth = await t.auth();
    siteId = (await request(t.app).post('/api/v1/sites').set(auth).send({ name: 'Millpond Café', address: '2 Weir Lane', clientContact: 'J. Ashdown' })).body.id;
    circuitId = (await request(t.app).post(`/api/v1/sites/${siteId}/circuits`).set(auth).send(counter)).body.id;
    for (const load of [
      { name: 'Toaster oven', nameplateA: 9, connection: 'cord-and-plug' },
      { name: 'Shop vacuum', nameplateA: 13, connection: 'cord-and-plug', startPeakA: 30, startDurationS: 0.3 },
      { name: '=HYPERLINK("http://evil.test")', nameplateA: 0.5, connection: 'cord-and-plug' },
      { name: '-2+3 lamp', nameplateA: 0.5, connection: 'cord-and-plug' },
    ]) {
      await request(t.app).post(`/api/v1/circuits/${circuitId}/loads`).set(auth).send(load).expect(201);
    }
  });
  afterAll(() => t.close());

  it('when a circuit PDF is asked, then a parseable PDF carries the verdict, reasons with edition, loads, cautions, date and preparer', async () => {
    const res = await request(t.app).get(`/api/v1/circuits/${circuitId}/report`).query({ format: 'pdf' }).set(await t.auth()).buffer(true).parse(binaryBody);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/pdf');
    expect(res.headers['content-disposition']).toMatch(/^attachment; filename="headroom-counter-left-k3-\d{4}-\d{2}-\d{2}\.pdf"$/);
    const body = res.body as Buffer;
    expect(body.subarray(0, 5).toString()).toBe('%PDF-');
    const { text } = await pdfText(body);
    // derived by hand: 9 + 13 + 0.5 + 0.5 = 23 A > 20 A → over the limit (NEC 210.23)
    expect(text).toContain('Verdict: Over the limit');
    expect(text).toContain('NFPA 70 (2023) 210.23');
    expect(text).toContain('240.4(D)'); // 14 AWG Cu on 20 A: the circuit's warning
    for (const name of ['Toaster oven', 'Shop vacuum', 'Millpond Café', 'J. Ashdown']) expect(text).toContain(name);
    expect(text).toMatch(/Prepared by Test engineer \(engineer-[0-9a-f]{8}@test\.headroom\.test\) on \d{4}-\d{2}-\d{2} \d{2}:\d{2} UTC/);
    expect(text).toContain('qualified persons');
    expect(text).toContain('authority having jurisdiction');
    expect(text).toContain('measurement category');
    expect(text).toContain('Worst aligned start: Shop vacuum');
  });

  it('when a circuit CSV is asked, then figures are numbers and formula-like text is escaped', async () => {
    const res = await request(t.app).get(`/api/v1/circuits/${circuitId}/report`).query({ format: 'csv' }).set(await t.auth('viewer'));
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('text/csv; charset=utf-8');
    const rows = parse(res.text, { columns: true }) as Record<string, string>[];
    expect(rows.find((r) => r.item === 'verdict')).toMatchObject({ record: 'circuit', value: 'over-the-limit' });
    // numbers are left alone even when negative: 20 − 23 = −3 A (derived)
    expect(rows.find((r) => r.item === 'headroomA')!.value).toBe('-3');
    // source: OWASP "CSV Injection": text cells beginning with = + - @ get a leading apostrophe
    const loadNames = new Set(rows.filter((r) => r.record === 'load').map((r) => r.load));
    expect(loadNames).toContain(`'=HYPERLINK("http://evil.test")`);
    expect(loadNames).toContain("'-2+3 lamp");
    expect(loadNames).toContain('Toaster oven');
    const vacuumStart = rows.find((r) => r.record === 'start-up' && r.load === 'Shop vacuum' && r.item === 'stackedPeakA');
    expect(Number(vacuumStart!.value)).toBeCloseTo(30 + 9 + 0.5 + 0.5, 9);
    expect(rows.some((r) => r.record === 'caution' && r.item === 'qualified-persons')).toBe(true);
  });

  it('when a site report is asked, then every circuit is summarised and one that cannot be judged is listed with the reason', async () => {
    const auth = await t.auth();
    const feeder = (await request(t.app).post(`/api/v1/sites/${siteId}/circuits`).set(auth).send({ label: 'Sub-board feeder', nominalVoltageV: 230, mainsHz: 50, deviceRatingA: 160, deviceKind: 'iec-c' })).body.id;
    await request(t.app).post(`/api/v1/circuits/${feeder}/loads`).set(auth).send({ name: 'Sub-board', nameplateA: 90, connection: 'fastened-in-place' }).expect(201);
    await request(t.app).post(`/api/v1/sites/${siteId}/circuits`).set(auth).send({ label: 'Spare way', nominalVoltageV: 120, mainsHz: 60, deviceRatingA: 15, deviceKind: 'na-thermal-magnetic' }).expect(201);
    const res = await request(t.app).get(`/api/v1/sites/${siteId}/report`).set(auth).buffer(true).parse(binaryBody);
    expect(res.status).toBe(200);
    const { text, pages } = await pdfText(res.body as Buffer);
    expect(text).toContain('Headroom site report: Millpond Café');
    expect(text).toContain('Counter, left (K3)');
    expect(text).toContain('Spare way');
    expect(text).toContain('not judged');
    expect(text).toContain('Verdict: Fine'); // the spare way has no loads
    expect(pages).toBeGreaterThanOrEqual(3);
    const csv = await request(t.app).get(`/api/v1/sites/${siteId}/report`).query({ format: 'csv' }).set(auth);
    const rows = parse(csv.text, { columns: true }) as Record<string, string>[];
    expect(rows.filter((r) => r.record === 'circuit' && r.item === 'verdict').map((r) => [r.circuit, r.value])).toEqual([
      ['Counter, left (K3)', 'over-the-limit'],
      ['Spare way', 'fine'],
      ['Sub-board feeder', 'not judged'],
    ]);
  });

  it('when the report is e-mailed, then the fake mail server receives the PDF with the verdict and cautions in the text', async () => {
    const res = await request(t.app)
      .post(`/api/v1/circuits/${circuitId}/report/email`)
      .set(await t.auth())
      .send({ to: 'client@example.test', message: 'As discussed on site.' });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ to: 'client@example.test', verdict: 'over-the-limit' });
    const mail = await t.mailbox!.waitFor((m) => m.to.includes('client@example.test'));
    expect(mail.subject).toBe('Headroom report: Counter, left (K3) (Millpond Café) - Over the limit');
    expect(mail.text).toContain('As discussed on site.');
    expect(mail.text).toContain('Verdict: Over the limit');
    expect(mail.text).toContain('NFPA 70 2023 210.23');
    expect(mail.text).toContain('qualified persons');
    expect(mail.organisationId).toBe(t.organisationId);
    const [attachment] = mail.attachments;
    expect(attachment).toMatchObject({ contentType: 'application/pdf', filename: res.body.filename });
    expect((await pdfText(attachment!.content)).text).toContain('Verdict: Over the limit');
  });

  it('when a viewer or a read key e-mails a report, then 403; a bad address is a 400 on /to; another organisation\'s circuit is 404', async () => {
    const url = `/api/v1/circuits/${circuitId}/report/email`;
    const before = t.mailbox!.messages().length;
    expect((await request(t.app).post(url).set(await t.auth('viewer')).send({ to: 'a@example.test' })).status).toBe(403);
    expect((await request(t.app).post(url).set(await t.auth({ keyScopes: ['read'] })).send({ to: 'a@example.test' })).status).toBe(403);
    const bad = await request(t.app).post(url).set(await t.auth()).send({ to: 'not an address' });
    expect(bad.status).toBe(400);
    expect(bad.body.errors[0].pointer).toBe('/to');
    expect((await request(t.app).post('/api/v1/circuits/no-such-circuit/report/email').set(await t.auth()).send({ to: 'a@example.test' })).status).toBe(404);
    expect(t.mailbox!.messages().length).toBe(before);
  });

  it('when the format is unknown, then 400 names the parameter', async () => {
    const res = await request(t.app).get(`/api/v1/circuits/${circuitId}/report`).query({ format: 'docx' }).set(await t.auth());
    expect(res.status).toBe(400);
    expect(res.body.errors[0].parameter).toBe('format');
  });

  it('when the circuit or site belongs to another organisation, then 404; an ingest key gets 403', async () => {
    const m = t.db.models;
    const otherOrg = randomUUID();
    await m.Organisation.create({ id: otherOrg, name: 'Other' });
    const site = await m.Site.create({ id: randomUUID(), organisationId: otherOrg, name: 'Theirs', address: null, clientContact: null, notes: null });
    const theirs = await m.Circuit.create({ id: randomUUID(), organisationId: otherOrg, siteId: site.id, ...counter, deviceKind: 'na-thermal-magnetic', conductorMaterial: 'cu', feedsOtherOutlets: true, necEdition: 2023, notes: null });
    const auth = await t.auth();
    expect((await request(t.app).get(`/api/v1/circuits/${theirs.id}/report`).set(auth)).status).toBe(404);
    expect((await request(t.app).get(`/api/v1/sites/${site.id}/report`).query({ format: 'csv' }).set(auth)).status).toBe(404);
    expect((await request(t.app).get(`/api/v1/circuits/${circuitId}/report`).set(await t.auth({ keyScopes: ['ingest'] }))).status).toBe(403);
  });
});

describe('report e-mail without a working mail server', () => {
  it('when the mail server refuses the connection, then 503 and nothing half-done is reported as sent', async () => {
    // Port 1 on the loopback interface: nothing listens there, so the connection is refused at once.
    const t = await makeTestApp({ config: { smtpUrl: 'smtp://127.0.0.1:1' } });
    try {
      const auth = await t.auth();
      const siteId = (await request(t.app).post('/api/v1/sites').set(auth).send({ name: 'Quiet site' })).body.id;
      const circuitId = (await request(t.app).post(`/api/v1/sites/${siteId}/circuits`).set(auth).send(counter)).body.id;
      const res = await request(t.app).post(`/api/v1/circuits/${circuitId}/report/email`).set(auth).send({ to: 'client@example.test' });
      expect(res.status).toBe(503);
      expect(res.body.type).toBe('/problems/unavailable');
    } finally {
      await t.close();
    }
  });
});
