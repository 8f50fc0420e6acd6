import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { Problem } from '../errors/problem.js';
import { readNdjsonSamples } from './ndjson-samples.js';
import { collectingSink } from './test-support.js';
import { TimestampReader } from './timestamps.js';

const collect = collectingSink;

async function* body(text: string) {
  yield Buffer.from(text);
}

async function* pieces(text: string, size: number) {
  const buf = Buffer.from(text);
  for (let i = 0; i < buf.length; i += size) yield buf.subarray(i, i + size);
}

async function read(text: string, pieceBytes?: number) {
  const sink = collect();
  await readNdjsonSamples(pieceBytes ? pieces(text, pieceBytes) : body(text), new TimestampReader({ traceStartUs: null }), sink);
  return sink;
}

/** What the body must give, read the plain way (source: JSON.parse, ECMA-262, is the reference). */
function expected(lines: string[]) {
  const records = lines.map((l) => JSON.parse(l) as { t: number; a: number });
  return { times: records.map((r) => Math.round(r.t * 1000)), values: records.map((r) => Math.fround(r.a)) };
}

describe('NDJSON sample bodies', () => {
  it('when lines are plain {"t","a"} objects in any spacing, order and number form, then they read as JSON.parse reads them', async () => {
    const space = fc.constantFrom('', ' ', '  ', '\t');
    const reading = fc.double({ min: -1e6, max: 1e6, noNaN: true });
    const line = fc
      .tuple(space, space, space, space, fc.boolean(), reading, fc.constantFrom('plain', 'exponent'))
      .map(([s1, s2, s3, s4, aFirst, a, form]) => ({ s1, s2, s3, s4, aFirst, a: form === 'exponent' ? a.toExponential() : JSON.stringify(a) }));
    await fc.assert(
      fc.asyncProperty(fc.array(line, { minLength: 1, maxLength: 50 }), async (parts) => {
        const lines = parts.map((p, k) => {
          const t = `"t":${p.s2}${1_772_438_400_000 + k * 50}`;
          const a = `"a":${p.s3}${p.a}`;
          return `${p.s1}{${p.s2}${p.aFirst ? a : t}${p.s3},${p.s4}${p.aFirst ? t : a}${p.s4}}${p.s1}`;
        });
        const sink = await read(lines.join('\n') + '\n');
        expect(sink).toMatchObject(expected(lines));
      }),
      { numRuns: 300 },
    );
  });

  it('when a line is almost plain but not valid JSON, then it is refused naming the line, as JSON.parse would', async () => {
    for (const bad of ['{"t":01,"a":1}', '{"t":1,"a":+1}', '{"t":1,"a":1.}', '{"t":1,"a":.5}', '{"t":1,"a":1,}', '{"t":1,"t":2}', '{"t":1 "a":1}']) {
      const err = await read(`{"t":1772438400000,"a":1}\n${bad.replace('"t":1,', '"t":1772438400050,').replace('"t":1 ', '"t":1772438400050 ')}\n`).catch((e: unknown) => e);
      expect(err, bad).toBeInstanceOf(Problem);
      const problem = err as Problem;
      expect(`${problem.message} ${JSON.stringify(problem.errors)}`, bad).toMatch(/at line 2,|"line":2/);
    }
  });

  it('when lines use string timestamps or spacing JSON allows, then they still read', async () => {
    const sink = await read('{"t":"2026-03-02T08:00:00Z","a":8.5}\n\n{ "a" : 8.25 , "t" : "2026-03-02T08:00:00.05Z" }\r\n');
    expect(sink.values).toEqual([8.5, 8.25]);
    expect(sink.times).toEqual([Date.parse('2026-03-02T08:00:00Z') * 1000, Date.parse('2026-03-02T08:00:00.050Z') * 1000]);
  });

  it('when a body arrives in pieces of any size (lines, CRLF and UTF-8 characters cut between them), then the same samples and errors come out', async () => {
    const text = '{"t":1772438400000,"a":1.5}\r\n\n{ "a" : -2e-3 ,\r"t" : 1772438400050 }\r\n{"t":1772438400100,"a":3}';
    const { values, times } = await read(text);
    const whole = { values, times };
    expect(whole.values).toEqual([1.5, Math.fround(-2e-3), 3]);
    const refused = `${text}\n{"t":1772438400200,"a":4,"é":1}\n`;
    for (const size of [1, 2, 3, 7, 1000]) {
      expect(await read(text, size), `pieces of ${size}`).toMatchObject(whole);
      const err = (await read(refused, size).catch((e: unknown) => e)) as Problem;
      expect(JSON.stringify(err.errors), `pieces of ${size}`).toContain('unknown member \\"é\\"');
      expect(err.errors?.[0]).toMatchObject({ line: 5 });
    }
  });

  it('when a line is longer than the limit, then the body is refused naming that line', async () => {
    async function* endless() {
      yield Buffer.from('{"t":1772438400000,"a":1}\n{"t":');
      for (let i = 0; i < 20; i++) yield Buffer.alloc(64 * 1024, 0x31);
    }
    const err = (await readNdjsonSamples(endless(), new TimestampReader({ traceStartUs: null }), collect()).catch((e: unknown) => e)) as Problem;
    expect(err).toBeInstanceOf(Problem);
    expect(err.message).toMatch(/line 2\b.*too long|too long.*line 2\b/);
  });
});
