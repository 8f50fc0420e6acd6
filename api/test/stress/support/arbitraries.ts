/**
 * fast-check arbitraries for hostile requests: adversarial strings, values shaped by a route's own zod
 * schema (so many requests get past validation and reach the services), and raw bodies in every format
 * the API reads (JSON, NDJSON, CSV, binary) or might be sent by mistake.
 */
import fc from 'fast-check';
import { z } from 'zod';

/** Strings that have broken web services before: injections, traversals, encodings, extremes. */
export const NASTY_STRINGS = [
  '',
  ' ',
  '0',
  '-1',
  'null',
  'undefined',
  'NaN',
  'Infinity',
  '1e309',
  '-0',
  '9007199254740993',
  'true',
  "' OR '1'='1",
  "'; DROP TABLE sites; --",
  '"; DROP TABLE traces; --',
  '1; SELECT pg_sleep(5)',
  "x' UNION SELECT id, email, passwordHash FROM users --",
  'name; DELETE FROM users',
  'createdAt DESC, (SELECT 1)',
  '-createdAt',
  'id) OR (1=1',
  '%',
  '_',
  '\\',
  '%00',
  '\u0000',
  '../../../../etc/passwd',
  '..\\..\\windows\\win.ini',
  '/etc/shadow',
  'file:///etc/passwd',
  '%2e%2e%2f%2e%2e%2fetc%2fpasswd',
  '<script>alert(1)</script>',
  '{{7*7}}',
  '${7*7}',
  '=HYPERLINK("http://attacker.test","x")',
  '=cmd|\' /C calc\'!A0',
  '+1+1',
  '@SUM(1,1)',
  '-2+3',
  '\t=1+1',
  '__proto__',
  'constructor',
  'prototype',
  '😀🔌⚡',
  'Ω μA °C',
  '\uFEFFbom',
  '\uD800',
  'a'.repeat(300),
  'x'.repeat(70_000),
  '2026-02-30T25:61:61Z',
  '0000-01-01T00:00:00Z',
  '+275760-09-13T00:00:00.001Z',
  '1970-01-01',
  '00000000-0000-0000-0000-000000000000',
];

/** Any string, weighted towards the nasty ones. */
export const adversarialString: fc.Arbitrary<string> = fc.oneof(
  { arbitrary: fc.constantFrom(...NASTY_STRINGS), weight: 4 },
  { arbitrary: fc.string({ maxLength: 40 }), weight: 3 },
  { arbitrary: fc.string({ unit: 'grapheme', maxLength: 40 }), weight: 2 },
  { arbitrary: fc.string({ unit: 'binary', maxLength: 40 }), weight: 1 },
);

/** Printable ASCII only: what an HTTP client can put in a header value. */
export const headerValue: fc.Arbitrary<string> = fc.oneof(
  fc.stringMatching(/^[\x20-\x7e]{0,120}$/),
  fc.constantFrom('', ' ', 'a'.repeat(4000), "' OR 1=1 --", '../../etc/passwd', '=1+1', '__proto__'),
);

export const extremeNumber: fc.Arbitrary<number> = fc.oneof(
  fc.constantFrom(0, -0, 1, -1, 0.5, 1e-300, -1e-300, 1e308, -1e308, Number.MAX_SAFE_INTEGER, Number.MIN_SAFE_INTEGER, 2 ** 31, -(2 ** 31), 2 ** 63),
  fc.double({ noNaN: true, noDefaultInfinity: true }),
  fc.integer(),
);

/** `[[[…]]]` nested `depth` deep; printed short so fast-check's reporter does not overflow its stack. */
function deeplyNested(depth: number): unknown {
  const value = JSON.parse('['.repeat(depth) + ']'.repeat(depth)) as unknown[];
  Object.defineProperty(value, fc.toStringMethod, { value: () => `<array nested ${depth} deep>` });
  return value;
}

/** Any JSON value, including deep nesting and prototype-polluting keys. */
export const wildJson: fc.Arbitrary<unknown> = fc.oneof(
  { arbitrary: fc.jsonValue({ maxDepth: 4 }), weight: 5 },
  { arbitrary: fc.constantFrom(null, [], {}, '', 0, true, { __proto__: { admin: true } }, JSON.parse('{"__proto__":{"polluted":1}}'), { constructor: { prototype: { polluted: 1 } } }), weight: 2 },
  { arbitrary: extremeNumber, weight: 1 },
  { arbitrary: adversarialString, weight: 2 },
  // Deep nesting, which naive recursive code turns into a stack overflow.
  { arbitrary: fc.integer({ min: 100, max: 1000 }).map(deeplyNested), weight: 1 },
);

type JsonSchema = {
  type?: string | string[];
  enum?: unknown[];
  const?: unknown;
  anyOf?: JsonSchema[];
  oneOf?: JsonSchema[];
  allOf?: JsonSchema[];
  properties?: Record<string, JsonSchema>;
  required?: string[];
  items?: JsonSchema;
  format?: string;
  pattern?: string;
  minimum?: number;
  maximum?: number;
  exclusiveMinimum?: number;
  exclusiveMaximum?: number;
  minLength?: number;
  maxLength?: number;
  minItems?: number;
  maxItems?: number;
};

/** A zod schema as JSON Schema (input side), or undefined when zod cannot describe it. */
export function jsonSchemaOf(schema: z.ZodType | undefined): JsonSchema | undefined {
  if (!schema) return undefined;
  try {
    return z.toJSONSchema(schema, { io: 'input', unrepresentable: 'any' }) as JsonSchema;
  } catch {
    return undefined;
  }
}

/**
 * Two ways to walk a schema. `valid`: values the schema accepts as far as its JSON Schema says (bounds,
 * lengths, enums, required keys, no unknown keys), so requests reach the services and the database with
 * edge-case contents. `hostile`: the same shapes with out-of-range, wrong-typed, missing and unknown
 * parts mixed in, so the validators and their messages are exercised.
 */
type Mode = 'valid' | 'hostile';

/** Field names that hold instants: epoch milliseconds or ISO 8601. */
const TIME_FIELD = /(time|start|^from$|^to$|At$|date)/i;

const instant = fc.oneof(
  fc.integer({ min: 1_500_000_000_000, max: 2_000_000_000_000 }),
  fc.date({ noInvalidDate: true, min: new Date('2001-01-01'), max: new Date('2099-01-01') }).map((d) => d.toISOString()),
);

function typedString(s: JsonSchema, mode: Mode, name: string): fc.Arbitrary<string> {
  const min = s.minLength ?? 0;
  const max = Math.min(s.maxLength ?? 60, 300);
  const valid: Array<fc.WeightedArbitrary<string>> = [];
  if (s.format === 'date-time' || s.format === 'date' || TIME_FIELD.test(name)) valid.push({ arbitrary: instant.map(String), weight: 4 });
  if (s.format === 'uuid') valid.push({ arbitrary: fc.uuid(), weight: 4 });
  if (s.format === 'email') valid.push({ arbitrary: fc.emailAddress(), weight: 4 });
  if (s.pattern) {
    try {
      valid.push({ arbitrary: fc.stringMatching(new RegExp(s.pattern)).filter((x) => x.length >= min && x.length <= max), weight: 4 });
    } catch {
      // a pattern fast-check cannot generate from
    }
  }
  // Trimmed schemas refuse leading or trailing blanks counted in the length; keep a visible character at each end.
  if (max >= min) valid.push({ arbitrary: fc.string({ minLength: Math.max(min, 1), maxLength: Math.max(Math.min(max, min + 40), 1) }).map((x) => `a${x.trim()}z`.slice(0, Math.max(max, 1))), weight: 6 });
  if (mode === 'valid') return fc.oneof(...valid);
  return fc.oneof(
    ...valid,
    { arbitrary: adversarialString, weight: 3 },
    ...(s.maxLength !== undefined ? [{ arbitrary: fc.constantFrom('y'.repeat(s.maxLength), 'y'.repeat(s.maxLength + 1)), weight: 1 }] : []),
  );
}

function typedNumber(s: JsonSchema, integer: boolean, mode: Mode, name: string): fc.Arbitrary<number> {
  const tiny = integer ? 1 : 1e-9;
  const lo = s.minimum ?? (s.exclusiveMinimum !== undefined ? s.exclusiveMinimum + tiny : TIME_FIELD.test(name) ? 1_500_000_000_000 : -1e6);
  const hi = s.maximum ?? (s.exclusiveMaximum !== undefined ? s.exclusiveMaximum - tiny : TIME_FIELD.test(name) ? 2_000_000_000_000 : 1e6);
  const min = Math.max(lo, -1e13);
  const max = Math.max(min, Math.min(hi, 1e13));
  const inRange = integer ? fc.integer({ min: Math.ceil(min), max: Math.max(Math.ceil(min), Math.floor(max)) }) : fc.double({ min, max, noNaN: true, noDefaultInfinity: true });
  if (mode === 'valid') return inRange;
  const edges = [s.minimum, s.maximum, s.exclusiveMinimum, s.exclusiveMaximum].filter((v): v is number => typeof v === 'number' && Math.abs(v) < 1e15);
  const near = edges.flatMap((v) => [v, v - 1, v + 1, v - 0.5, v + 0.5]);
  return fc.oneof({ arbitrary: inRange, weight: 4 }, { arbitrary: extremeNumber, weight: 2 }, ...(near.length ? [{ arbitrary: fc.constantFrom(...near), weight: 1 }] : []));
}

/**
 * Values for a schema: most cases valid as far as the schema says, the rest hostile (see Mode), so both
 * the code behind the validators and the validators themselves are exercised.
 */
export function valueFor(schema: JsonSchema | undefined, name = ''): fc.Arbitrary<unknown> {
  if (!schema) return wildJson;
  return fc.oneof({ arbitrary: shapedValue(schema, 0, 'valid', name), weight: 1 }, { arbitrary: shapedValue(schema, 0, 'hostile', name), weight: 1 });
}

function shapedValue(s: JsonSchema | undefined, depth: number, mode: Mode, name: string): fc.Arbitrary<unknown> {
  if (!s || depth > 6) return mode === 'valid' ? fc.constant(null) : wildJson;
  const typed = typedValueFor(s, depth, mode, name);
  return mode === 'valid' ? typed : fc.oneof({ arbitrary: typed, weight: 12 }, { arbitrary: wildJson, weight: 1 });
}

function typedValueFor(s: JsonSchema, depth: number, mode: Mode, name: string): fc.Arbitrary<unknown> {
  if (s.const !== undefined) return fc.constant(s.const);
  if (s.enum && s.enum.length > 0) {
    return mode === 'valid' ? fc.constantFrom(...s.enum) : fc.oneof({ arbitrary: fc.constantFrom(...s.enum), weight: 5 }, { arbitrary: adversarialString, weight: 1 });
  }
  const alternatives = s.anyOf ?? s.oneOf;
  if (alternatives && alternatives.length > 0) return fc.oneof(...alternatives.map((a) => shapedValue(a, depth + 1, mode, name)));
  if (s.allOf && s.allOf.length > 0) return shapedValue(s.allOf[0], depth + 1, mode, name);
  const types = Array.isArray(s.type) ? s.type : s.type ? [s.type] : [];
  if (types.length > 1) return fc.oneof(...types.map((type) => typedValueFor({ ...s, type }, depth, mode, name)));
  switch (types[0]) {
    case 'string':
      return typedString(s, mode, name);
    case 'number':
      return typedNumber(s, false, mode, name);
    case 'integer':
      return typedNumber(s, true, mode, name);
    case 'boolean':
      return fc.boolean();
    case 'null':
      return fc.constant(null);
    case 'array':
      return fc.array(shapedValue(s.items, depth + 1, mode, name), { minLength: s.minItems ?? 0, maxLength: Math.min(s.maxItems ?? 12, 12) });
    case 'object':
      return objectFor(s, depth, mode);
    default:
      return mode === 'valid' ? fc.constant(null) : wildJson;
  }
}

function objectFor(s: JsonSchema, depth: number, mode: Mode): fc.Arbitrary<Record<string, unknown>> {
  const properties = s.properties ?? {};
  const required = (s.required ?? []).filter((k) => k in properties);
  const shaped = fc.record(Object.fromEntries(Object.keys(properties).map((k) => [k, shapedValue(properties[k], depth + 1, mode, k)])), { requiredKeys: required });
  if (mode === 'valid') return shaped;
  return fc
    .tuple(
      shaped,
      // Now and then a required key goes missing, or an unknown one comes along.
      fc.oneof({ arbitrary: fc.constant(undefined), weight: 6 }, { arbitrary: fc.constantFrom(...(required.length ? required : [''])), weight: 1 }),
      fc.oneof({ arbitrary: fc.constant(null), weight: 6 }, { arbitrary: fc.tuple(adversarialString, wildJson), weight: 1 }),
    )
    .map(([value, dropped, extra]) => {
      const out: Record<string, unknown> = { ...value };
      if (dropped) delete out[dropped];
      if (extra) out[extra[0]] = extra[1];
      return out;
    });
}

const asQueryValue = (v: unknown) => (typeof v === 'string' ? v : (JSON.stringify(v) ?? ''));

/**
 * Query strings for a query schema: half the time only known parameters with values the schema
 * accepts, otherwise hostile values, repeated keys, operator-looking keys and unknown keys.
 */
export function queryFor(schema: JsonSchema | undefined): fc.Arbitrary<Array<[string, string]>> {
  const properties = schema?.properties ?? {};
  const keys = Object.keys(properties);
  const valid = fc
    .tuple(...keys.map((key) => fc.option(shapedValue(properties[key], 0, 'valid', key).map((v) => [key, asQueryValue(v)] as [string, string]), { freq: 2 })))
    .map((picked) => picked.filter((p): p is [string, string] => p !== null));
  const known = keys.map((key) =>
    fc.option(
      fc.oneof(
        { arbitrary: shapedValue(properties[key], 0, 'hostile', key).map((v) => [[key, asQueryValue(v)]] as Array<[string, string]>), weight: 6 },
        { arbitrary: fc.array(adversarialString, { minLength: 2, maxLength: 3 }).map((vs) => vs.map((v) => [key, v] as [string, string])), weight: 1 },
        { arbitrary: adversarialString.map((v) => [[`${key}[$ne]`, v]] as Array<[string, string]>), weight: 1 },
      ),
      { freq: 2 },
    ),
  );
  const unknown = fc.oneof({ arbitrary: fc.constant([]), weight: 4 }, { arbitrary: fc.array(fc.tuple(adversarialString, adversarialString), { minLength: 1, maxLength: 2 }), weight: 1 });
  const hostile = fc.tuple(fc.tuple(...known), unknown).map(([picked, extra]) => [...picked.flatMap((p) => p ?? []), ...extra]);
  return fc.oneof(valid, hostile);
}

/** Column names an uploader might use, plus hostile ones. */
const CSV_HEADERS = ['t', 'time', 'timestamp', 'a', 'amps', 'current', 'value', 'offsetS', '=1+1', '', 'time,extra', '"quoted"'];

function csvCell(): fc.Arbitrary<string> {
  return fc.oneof(
    fc.date({ noInvalidDate: true, min: new Date('1990-01-01'), max: new Date('2100-01-01') }).map((d) => d.toISOString()),
    extremeNumber.map(String),
    fc.constantFrom('', 'NaN', '-', '1,5', '"1.5"', '"unterminated', '=SUM(A1:A9)', '1e400', '0x10', ' 3 '),
    adversarialString,
  );
}

/** Text bodies: CSV (a header row and cells), NDJSON (one value per line), JSON text, or lines of junk. */
export const csvText: fc.Arbitrary<string> = fc
  .tuple(fc.subarray(CSV_HEADERS, { minLength: 1, maxLength: 3 }), fc.array(fc.array(csvCell(), { minLength: 1, maxLength: 4 }), { maxLength: 30 }), fc.constantFrom('\n', '\r\n', '\r'))
  .map(([headers, rows, eol]) => [headers.join(','), ...rows.map((r) => r.join(','))].join(eol));

const sampleLike = fc.oneof(
  fc.record({ t: fc.oneof(extremeNumber, adversarialString), a: fc.oneof(extremeNumber, adversarialString) }, { requiredKeys: [] }),
  fc.tuple(extremeNumber, extremeNumber),
  extremeNumber,
  wildJson,
);

export const ndjsonText: fc.Arbitrary<string> = fc
  .array(fc.oneof({ arbitrary: sampleLike.map((v) => JSON.stringify(v) ?? 'null'), weight: 5 }, { arbitrary: adversarialString, weight: 1 }), { maxLength: 40 })
  .map((lines) => lines.join('\n'));

export const jsonText: fc.Arbitrary<string> = fc.oneof(
  fc.oneof(fc.array(sampleLike, { maxLength: 40 }), fc.record({ samples: fc.array(sampleLike, { maxLength: 40 }) }), wildJson).map((v) => JSON.stringify(v) ?? ''),
  fc.constantFrom('{', '[1,2', '{"a":1}{"b":2}', '\uFEFF[1]', 'null', '"x"', '[1e400]', ' '),
  // Nesting far deeper than any client sends: parsers and validators must not recurse into a crash.
  fc.integer({ min: 5_000, max: 100_000 }).map((depth) => `{"samples":${'['.repeat(depth)}${']'.repeat(depth)}}`),
);

/** Well-formed sample batches (increasing times after any fixture's samples, finite readings), as the formats want them. */
const validSeries = fc
  .tuple(fc.integer({ min: 1_800_000_000_000, max: 1_900_000_000_000 }), fc.array(fc.double({ min: -500, max: 500, noNaN: true }), { minLength: 1, maxLength: 300 }), fc.integer({ min: 1, max: 60_000 }))
  .map(([start, a, stepMs]) => ({ t: a.map((_, i) => start + i * stepMs), a }));

export const validSampleText: fc.Arbitrary<{ contentType: string; text: string }> = fc.oneof(
  validSeries.map((s) => ({ contentType: 'application/json', text: JSON.stringify(s) })),
  validSeries.map((s) => ({ contentType: 'application/x-ndjson', text: s.t.map((t, i) => JSON.stringify({ t, a: s.a[i] })).join('\n') })),
  validSeries.map((s) => ({ contentType: 'text/csv', text: `time,amps\n${s.t.map((t, i) => `${new Date(t).toISOString()},${s.a[i]}`).join('\n')}\n` })),
);

/** Binary bodies: random bytes, float64 samples with NaN and infinities, odd lengths. */
export const binaryBody: fc.Arbitrary<Buffer> = fc.oneof(
  fc.uint8Array({ maxLength: 2048 }).map((a) => Buffer.from(a)),
  fc.float64Array({ maxLength: 256 }).map((a) => Buffer.from(a.buffer, a.byteOffset, a.byteLength)),
  fc.float32Array({ maxLength: 256 }).map((a) => Buffer.from(a.buffer, a.byteOffset, a.byteLength)),
  fc.integer({ min: 1, max: 15 }).map((n) => Buffer.alloc(n, 0xff)),
);

/** Content types a client might send, right or wrong. */
export const CONTENT_TYPES = [
  'application/json',
  'application/json; charset=utf-8',
  'application/json; charset=utf-16',
  'application/json; charset=bogus',
  'application/x-ndjson',
  'application/ndjson',
  'text/csv',
  'text/csv; charset=latin1',
  'application/octet-stream',
  'text/plain',
  'application/xml',
  'application/x-www-form-urlencoded',
  'multipart/form-data; boundary=zzz',
  'multipart/form-data',
  'image/png',
  '*/*',
  'application/merge-patch+json',
];
