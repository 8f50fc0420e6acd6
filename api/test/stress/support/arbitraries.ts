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
  minimum?: number;
  maximum?: number;
  minLength?: number;
  maxLength?: number;
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

function typedString(s: JsonSchema): fc.Arbitrary<string> {
  const options: Array<fc.WeightedArbitrary<string>> = [{ arbitrary: adversarialString, weight: 2 }];
  if (s.format === 'date-time' || s.format === 'date') {
    options.push({ arbitrary: fc.date({ noInvalidDate: true }).map((d) => d.toISOString()), weight: 4 });
  }
  if (s.format === 'uuid') options.push({ arbitrary: fc.uuid(), weight: 4 });
  if (s.format === 'email') options.push({ arbitrary: fc.emailAddress(), weight: 4 });
  const min = s.minLength ?? 0;
  const max = Math.min(s.maxLength ?? 60, 300);
  if (max >= min) options.push({ arbitrary: fc.string({ minLength: min, maxLength: Math.min(max, min + 40) }), weight: 6 });
  if (s.maxLength !== undefined) {
    options.push({ arbitrary: fc.constantFrom('y'.repeat(s.maxLength), 'y'.repeat(s.maxLength + 1)), weight: 1 });
  }
  return fc.oneof(...options);
}

function typedNumber(s: JsonSchema, integer: boolean): fc.Arbitrary<number> {
  const edges = [s.minimum, s.maximum].filter((v): v is number => typeof v === 'number' && Math.abs(v) < 1e15);
  const near = edges.flatMap((v) => [v, v - 1, v + 1, v - 0.5, v + 0.5]);
  const inRange = integer
    ? fc.integer({ min: Math.max(s.minimum ?? -1e6, -1e9), max: Math.min(s.maximum ?? 1e6, 1e9) })
    : fc.double({ min: Math.max(s.minimum ?? -1e6, -1e12), max: Math.min(s.maximum ?? 1e6, 1e12), noNaN: true });
  return fc.oneof({ arbitrary: inRange, weight: 4 }, { arbitrary: extremeNumber, weight: 2 }, ...(near.length ? [{ arbitrary: fc.constantFrom(...near), weight: 1 }] : []));
}

/**
 * Values shaped like the schema most of the time (right keys, right types, edge-case contents) and
 * anything at all the rest of the time, so both the validator and the code behind it are exercised.
 */
export function valueFor(schema: JsonSchema | undefined, depth = 0): fc.Arbitrary<unknown> {
  if (!schema || depth > 5) return wildJson;
  const typed = typedValueFor(schema, depth);
  return fc.oneof({ arbitrary: typed, weight: 19 }, { arbitrary: wildJson, weight: 1 });
}

function typedValueFor(s: JsonSchema, depth: number): fc.Arbitrary<unknown> {
  if (s.const !== undefined) return fc.constant(s.const);
  if (s.enum && s.enum.length > 0) return fc.oneof({ arbitrary: fc.constantFrom(...s.enum), weight: 5 }, { arbitrary: adversarialString, weight: 1 });
  const alternatives = s.anyOf ?? s.oneOf;
  if (alternatives && alternatives.length > 0) return fc.oneof(...alternatives.map((a) => valueFor(a, depth + 1)));
  if (s.allOf && s.allOf.length > 0) return valueFor(s.allOf[0], depth + 1);
  const types = Array.isArray(s.type) ? s.type : s.type ? [s.type] : [];
  if (types.length > 1) return fc.oneof(...types.map((type) => typedValueFor({ ...s, type }, depth)));
  switch (types[0]) {
    case 'string':
      return typedString(s);
    case 'number':
      return typedNumber(s, false);
    case 'integer':
      return typedNumber(s, true);
    case 'boolean':
      return fc.boolean();
    case 'null':
      return fc.constant(null);
    case 'array':
      return fc.array(valueFor(s.items, depth + 1), { maxLength: 12 });
    case 'object':
      return objectFor(s, depth);
    default:
      return wildJson;
  }
}

function objectFor(s: JsonSchema, depth: number): fc.Arbitrary<Record<string, unknown>> {
  const properties = s.properties ?? {};
  const required = (s.required ?? []).filter((k) => k in properties);
  const shaped = fc.record(Object.fromEntries(Object.keys(properties).map((k) => [k, valueFor(properties[k], depth + 1)])), { requiredKeys: required });
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

/** Query-string values for a query schema: typed values as strings, repeated keys, unknown keys. */
export function queryFor(schema: JsonSchema | undefined): fc.Arbitrary<Array<[string, string]>> {
  const properties = schema?.properties ?? {};
  const known = Object.keys(properties).map((key) =>
    fc.option(
      fc.oneof(
        { arbitrary: valueFor(properties[key]).map((v) => [[key, typeof v === 'string' ? v : JSON.stringify(v) ?? '']] as Array<[string, string]>), weight: 6 },
        { arbitrary: fc.array(adversarialString, { minLength: 2, maxLength: 3 }).map((vs) => vs.map((v) => [key, v] as [string, string])), weight: 1 },
        { arbitrary: adversarialString.map((v) => [[`${key}[$ne]`, v]] as Array<[string, string]>), weight: 1 },
      ),
      { freq: 2 },
    ),
  );
  const unknown = fc.oneof({ arbitrary: fc.constant([]), weight: 4 }, { arbitrary: fc.array(fc.tuple(adversarialString, adversarialString), { minLength: 1, maxLength: 2 }), weight: 1 });
  return fc.tuple(fc.tuple(...known), unknown).map(([picked, extra]) => [...picked.flatMap((p) => p ?? []), ...extra]);
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
