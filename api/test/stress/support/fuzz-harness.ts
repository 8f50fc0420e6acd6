/**
 * Throws generated requests at one route of a test app and checks what must hold for every request:
 * an answer (no hang), never a 5xx, errors as problem details, nothing written when the answer is an
 * error, and never another organisation's rows.
 */
import { createHash, randomUUID } from 'node:crypto';
import fc from 'fast-check';
import request from 'supertest';
import type { RouteDefinition } from '../../../src/routes/define-route.js';
import { mintCredentials } from '../../../src/testing/credentials.js';
import type { TestApp } from '../../../src/testing/make-test-app.js';
import { CONTENT_TYPES, adversarialString, binaryBody, csvText, headerValue, jsonSchemaOf, jsonText, ndjsonText, queryFor, validSampleText, valueFor, wildJson } from './arbitraries.js';

/** Who sends the request. */
export type Caller = 'admin' | 'engineer' | 'viewer' | 'ingest-key' | 'read-key' | 'none' | 'garbage';

type PathValue = { kind: 'own'; index: number } | { kind: 'other'; index: number } | { kind: 'text'; value: string };

type Body =
  | { kind: 'none' }
  | { kind: 'json'; value: unknown }
  | { kind: 'text'; contentType: string; text: string }
  | { kind: 'binary'; contentType: string; bytes: Buffer }
  | { kind: 'multipart'; field: string; filename: string; contentType: string; content: Buffer; fields: Array<[string, string]> };

export interface FuzzCase {
  caller: Caller;
  garbageToken: string;
  pathValues: PathValue[];
  query: Array<[string, string]>;
  headers: Record<string, string>;
  body: Body;
}

const CALLERS: Caller[] = ['admin', 'engineer', 'viewer', 'ingest-key', 'read-key', 'none', 'garbage'];

/** Path parameter names of an OpenAPI path, in order. */
export function pathParamNames(path: string): string[] {
  return [...path.matchAll(/\{([A-Za-z0-9_]+)\}/g)].map((m) => m[1]!);
}

const FILENAMES = ['trace.csv', '../../../../etc/passwd', '..\\..\\boot.ini', '/absolute/path.csv', 'a'.repeat(600) + '.csv', 'nul\u0000byte.csv', 'CON', '.htaccess', 'trace.csv.exe', '=cmd.csv', 'ünïcödé 😀.csv', ''];

function bodyArbitrary(route: RouteDefinition): fc.Arbitrary<Body> {
  const { spec } = route;
  const text = (contentType: fc.Arbitrary<string>, body: fc.Arbitrary<string>) =>
    fc.tuple(contentType, body).map(([ct, t]): Body => ({ kind: 'text', contentType: ct, text: t }));
  const anyType = fc.constantFrom(...CONTENT_TYPES);
  const options: Array<fc.WeightedArbitrary<Body>> = [
    { arbitrary: fc.constant<Body>({ kind: 'none' }), weight: 1 },
    { arbitrary: wildJson.map((value): Body => ({ kind: 'json', value })), weight: 1 },
    { arbitrary: text(anyType, fc.oneof(jsonText, ndjsonText, csvText, adversarialString)), weight: 2 },
    { arbitrary: fc.tuple(anyType, binaryBody).map(([ct, bytes]): Body => ({ kind: 'binary', contentType: ct, bytes })), weight: 1 },
  ];
  if (spec.body) {
    options.push({ arbitrary: valueFor(jsonSchemaOf(spec.body)).map((value): Body => ({ kind: 'json', value })), weight: 15 });
  }
  const rawTypes = Object.keys(spec.rawBody?.contentTypes ?? {});
  if (rawTypes.some((t) => t.includes('csv') || t.includes('ndjson'))) {
    options.push({ arbitrary: validSampleText.filter((b) => rawTypes.includes(b.contentType)).map((b): Body => ({ kind: 'text', ...b })), weight: 6 });
  }
  for (const [contentType, media] of Object.entries(spec.rawBody?.contentTypes ?? {})) {
    if (contentType.startsWith('multipart/')) {
      const fieldSchema = jsonSchemaOf(media.schema);
      const fields = Object.entries(fieldSchema?.properties ?? {}).filter(([, s]) => (s as { format?: string }).format !== 'binary');
      const fieldNames = Object.entries(fieldSchema?.properties ?? {})
        .filter(([, s]) => (s as { format?: string }).format === 'binary')
        .map(([name]) => name);
      options.push({
        arbitrary: fc
          .record({
            field: fc.constantFrom(...(fieldNames.length ? fieldNames : ['file']), 'other'),
            filename: fc.oneof(fc.constantFrom(...FILENAMES), adversarialString),
            contentType: fc.constantFrom('text/csv', 'application/octet-stream', 'text/plain', 'image/png'),
            content: fc.oneof(
              { arbitrary: validSampleText.filter((b) => b.contentType === 'text/csv').map((b) => Buffer.from(b.text)), weight: 3 },
              { arbitrary: csvText.map((t) => Buffer.from(t)), weight: 2 },
              { arbitrary: binaryBody, weight: 1 },
              { arbitrary: fc.constant(Buffer.alloc(0)), weight: 1 },
            ),
            fields: fc.tuple(...fields.map(([name, s]) => fc.option(valueFor(s as never, name).map((v) => [name, typeof v === 'string' ? v : JSON.stringify(v) ?? ''] as [string, string]), { freq: 8 }))),
          })
          .map(({ field, filename, contentType: ct, content, fields: fs }): Body => ({
            kind: 'multipart',
            field,
            filename,
            contentType: ct,
            content,
            fields: fs.filter((f): f is [string, string] => f !== null),
          })),
        weight: 8,
      });
      continue;
    }
    const sameType = fc.constant(contentType);
    if (media.binary) {
      options.push({ arbitrary: binaryBody.map((bytes): Body => ({ kind: 'binary', contentType, bytes })), weight: 4 });
    } else if (contentType.includes('csv')) {
      options.push({ arbitrary: text(sameType, csvText), weight: 4 });
    } else if (contentType.includes('ndjson')) {
      options.push({ arbitrary: text(sameType, ndjsonText), weight: 4 });
    } else {
      const shaped = valueFor(jsonSchemaOf(media.schema)).map((v) => JSON.stringify(v) ?? '');
      options.push({ arbitrary: text(sameType, fc.oneof(shaped, jsonText)), weight: 4 });
    }
  }
  return fc.oneof(...options);
}

/** Every part of a hostile request to one route. */
export function fuzzCaseArbitrary(route: RouteDefinition): fc.Arbitrary<FuzzCase> {
  const pathValue: fc.Arbitrary<PathValue> = fc.oneof(
    { arbitrary: fc.nat().map((index): PathValue => ({ kind: 'own', index })), weight: 6 },
    { arbitrary: fc.nat().map((index): PathValue => ({ kind: 'other', index })), weight: 1 },
    { arbitrary: adversarialString.map((value): PathValue => ({ kind: 'text', value })), weight: 2 },
  );
  const headers = fc.record(
    {
      'idempotency-key': fc.oneof(fc.uuid(), headerValue),
      'x-request-id': headerValue,
      accept: fc.constantFrom('application/json', 'text/csv', 'application/pdf', '*/*', 'text/html', 'application/problem+json'),
      'accept-encoding': fc.constantFrom('gzip', 'br', 'identity', '*'),
      range: fc.constantFrom('bytes=0-10', 'bytes=-1', 'bytes=99999999-'),
      'if-none-match': headerValue,
    },
    { requiredKeys: [] },
  );
  return fc.record({
    caller: fc.oneof({ arbitrary: fc.constantFrom<Caller>('admin', 'engineer'), weight: 6 }, { arbitrary: fc.constantFrom(...CALLERS), weight: 2 }),
    garbageToken: fc.oneof(headerValue, fc.constantFrom('hrk_', 'hrk_x_y', 'hrk_00000000-0000-0000-0000-000000000000_secret', 'Basic dXNlcjpwYXNz', 'Bearer', 'a.b.c')),
    pathValues: fc.array(pathValue, { minLength: pathParamNames(route.spec.path).length, maxLength: pathParamNames(route.spec.path).length }),
    query: queryFor(jsonSchemaOf(route.spec.query)),
    headers: fc
      .tuple(headers, fc.oneof({ arbitrary: fc.constant(undefined), weight: 9 }, { arbitrary: fc.constantFrom('gzip', 'deflate', 'br', 'identity', 'bogus'), weight: 1 }))
      .map(([h, encoding]) => Object.fromEntries(Object.entries({ ...h, 'content-encoding': encoding }).filter(([, v]) => v !== undefined)) as Record<string, string>),
    body: bodyArbitrary(route),
  });
}

/** Ids of rows in the test organisation and in a second one, by table. */
export interface IdPool {
  own: Map<string, string[]>;
  other: Map<string, string[]>;
  /** Every id of the second organisation, to look for in answers. */
  otherIds: Set<string>;
}

/** The table a path parameter refers to: `siteId` -> `sites`, `keyId` -> `api_keys` (shortest match). */
function tableForParam(param: string, tables: string[]): string | undefined {
  const stem = param.replace(/Id$/, '').replace(/([a-z])([A-Z])/g, '$1_$2').toLowerCase();
  return tables.filter((t) => t.toLowerCase().includes(stem)).sort((a, b) => a.length - b.length)[0];
}

function pick(list: string[] | undefined, index: number): string | undefined {
  return list && list.length > 0 ? list[index % list.length] : undefined;
}

function encodeSegment(value: string): string {
  try {
    return encodeURIComponent(value);
  } catch {
    // Lone surrogates cannot be percent-encoded as UTF-8; send the replacement character.
    return encodeURIComponent(value.replace(/[\uD800-\uDFFF]/g, '\uFFFD'));
  }
}

export function concretePath(route: RouteDefinition, fuzz: FuzzCase, pool: IdPool): string {
  const names = pathParamNames(route.spec.path);
  const tables = [...new Set([...pool.own.keys(), ...pool.other.keys()])];
  let i = 0;
  return route.spec.path.replace(/\{([A-Za-z0-9_]+)\}/g, () => {
    const name = names[i]!;
    const v = fuzz.pathValues[i++]!;
    const table = tableForParam(name, tables);
    const value =
      v.kind === 'text' ? v.value : (pick(table ? (v.kind === 'own' ? pool.own : pool.other).get(table) : undefined, v.index) ?? randomUUID());
    return encodeSegment(value);
  });
}

/** Credentials per caller, minted on demand and dropped after anything that may have revoked them. */
export class Callers {
  private cache = new Map<Caller, Record<string, string>>();
  constructor(private t: TestApp) {}

  async headers(caller: Caller, garbageToken: string): Promise<Record<string, string>> {
    if (caller === 'none') return {};
    if (caller === 'garbage') return { Authorization: garbageToken.startsWith('Basic ') ? garbageToken : `Bearer ${garbageToken}` };
    let h = this.cache.get(caller);
    if (!h) {
      const who = caller === 'ingest-key' ? { keyScopes: ['ingest'] } : caller === 'read-key' ? { keyScopes: ['read'] } : caller;
      h = await mintCredentials(this.t.app.locals.services, this.t.organisationId, who);
      this.cache.set(caller, h);
    }
    return h;
  }

  forget(): void {
    this.cache.clear();
  }
}

/**
 * The whole stored state as one hash per table. Columns that record use rather than data (when and
 * from where a key or session was last used, the addresses a key was used from) and the audit log
 * (which records refusals on purpose) are
 * left out: an error may touch those.
 */
export async function stateDigest(t: TestApp): Promise<Map<string, string>> {
  const qi = t.db.sequelize.getQueryInterface();
  const tables = ((await qi.showAllTables()) as Array<string | { tableName: string }>).map((x) => (typeof x === 'string' ? x : x.tableName));
  const digest = new Map<string, string>();
  for (const table of tables.sort()) {
    if (/audit|address|schema_migrations|sqlite_/i.test(table)) continue;
    const [rows] = await t.db.sequelize.query(`SELECT * FROM "${table}"`);
    const hash = createHash('sha256');
    const lines = (rows as Array<Record<string, unknown>>).map((row) =>
      JSON.stringify(Object.entries(row).filter(([column]) => !/^last(Used|Seen)/i.test(column)).sort(([a], [b]) => a.localeCompare(b))),
    );
    for (const line of lines.sort()) hash.update(line);
    digest.set(table, `${rows.length}:${hash.digest('hex').slice(0, 16)}`);
  }
  return digest;
}

export function changedTables(before: Map<string, string>, after: Map<string, string>): string[] {
  const names = new Set([...before.keys(), ...after.keys()]);
  return [...names].filter((n) => before.get(n) !== after.get(n));
}

/** Collects ids by table for the test organisation and the other one. */
export async function collectIds(t: TestApp, otherOrganisationId: string): Promise<IdPool> {
  const qi = t.db.sequelize.getQueryInterface();
  const tables = ((await qi.showAllTables()) as Array<string | { tableName: string }>).map((x) => (typeof x === 'string' ? x : x.tableName));
  const pool: IdPool = { own: new Map(), other: new Map(), otherIds: new Set() };
  for (const table of tables) {
    const columns = await qi.describeTable(table);
    if (!('id' in columns)) continue;
    const orgColumn = table === 'organisations' ? 'id' : 'organisationId' in columns ? 'organisationId' : undefined;
    if (!orgColumn) continue;
    const [rows] = await t.db.sequelize.query(`SELECT "id", "${orgColumn}" AS org FROM "${table}"`);
    for (const row of rows as Array<{ id: string; org: string }>) {
      const side = row.org === t.organisationId ? pool.own : row.org === otherOrganisationId ? pool.other : undefined;
      if (!side) continue;
      side.set(table, [...(side.get(table) ?? []), String(row.id)]);
      if (side === pool.other) pool.otherIds.add(String(row.id));
    }
  }
  return pool;
}

export interface Outcome {
  status: number;
  contentType: string;
  text: string;
  body: unknown;
}

/** Sends one fuzz case with the caller's headers (resolved beforehand); a hang fails on the deadline. */
export async function send(t: TestApp, route: RouteDefinition, fuzz: FuzzCase, pool: IdPool, auth: Record<string, string>): Promise<Outcome & { url: string }> {
  const url = `/api/v1${concretePath(route, fuzz, pool)}`;
  const query = new URLSearchParams();
  for (const [k, v] of fuzz.query) query.append(k.replace(/[\uD800-\uDFFF]/g, '\uFFFD'), v.replace(/[\uD800-\uDFFF]/g, '\uFFFD'));
  const qs = query.toString();
  const fullUrl = qs ? `${url}?${qs}` : url;
  let req = request(t.app)[route.spec.method](fullUrl).timeout({ response: 15_000, deadline: 20_000 });
  req = req.set(auth);
  // content-encoding only makes sense with a body; send it with one to test inflation of bad bytes.
  const { 'content-encoding': encoding, ...headers } = fuzz.headers;
  req = req.set(headers);
  const body = fuzz.body;
  switch (body.kind) {
    case 'none':
      break;
    case 'json':
      req = req.set('Content-Type', 'application/json').send(JSON.stringify(body.value) ?? 'null');
      break;
    case 'text':
      req = req.set('Content-Type', body.contentType).send(body.text);
      break;
    case 'binary':
      req = req.set('Content-Type', body.contentType).send(body.bytes);
      break;
    case 'multipart':
      for (const [name, value] of body.fields) req = req.field(name, value);
      req = req.attach(body.field, body.content, { filename: body.filename || 'x', contentType: body.contentType });
      break;
  }
  if (encoding && body.kind !== 'none' && body.kind !== 'multipart') req = req.set('Content-Encoding', encoding);
  const res = await req.ok(() => true);
  return { url: `${route.spec.method.toUpperCase()} ${fullUrl.slice(0, 300)}`, status: res.status, contentType: String(res.headers['content-type'] ?? ''), text: res.text ?? '', body: res.body };
}

/** Returns the broken invariants for one answer (empty when all hold). */
export function invariantViolations(outcome: Outcome, fuzz: FuzzCase, pool: IdPool, changed: string[], route: RouteDefinition): string[] {
  const problems: string[] = [];
  if (outcome.status >= 500) problems.push(`answered ${outcome.status}: ${outcome.text.slice(0, 300)}`);
  if (outcome.status >= 400) {
    // Node's HTTP parser answers 431 (headers too large) itself, before Express sees the request.
    if (outcome.status !== 431 && !outcome.contentType.includes('application/problem+json')) {
      problems.push(`error ${outcome.status} is not problem details (${outcome.contentType})`);
    }
    if (changed.length > 0) problems.push(`error ${outcome.status} left writes behind in ${changed.join(', ')}`);
  }
  if (route.spec.method === 'get' && changed.length > 0) problems.push(`a GET changed ${changed.join(', ')}`);
  if (/\bat .*\.(ts|js):\d+:\d+/.test(outcome.text) || /SQLITE_|sequelize|syntax error at or near/i.test(outcome.text)) {
    problems.push('the answer shows internals (stack trace or SQL)');
  }
  const sentOtherId = fuzz.pathValues.some((v) => v.kind === 'other');
  if (sentOtherId && outcome.status < 300) problems.push(`another organisation's id answered ${outcome.status}`);
  for (const id of pool.otherIds) {
    if (outcome.text.includes(id) && !sentOtherId) problems.push(`the answer holds another organisation's id ${id}`);
  }
  return problems;
}
