/**
 * `application/x-ndjson` sample bodies: one `{"t": ..., "a": ...}` object per line, streamed (blank
 * lines are skipped). `t` is epoch ms, an ISO 8601 string or seconds from the trace start (the same
 * format on every line); `a` is the reading. Errors name the line (and column, for bad JSON).
 */
import type { ProblemFieldError } from '../errors/problem.js';
import { invalidSamples, malformedAt } from './body-errors.js';
import { LineSplitter, splitBody } from './line-splitter.js';
import { growableFloat32, growableFloat64, readingProblem, type SampleSink } from './sample-sink.js';
import { TimestampError, type TimestampReader } from './timestamps.js';

/** Samples gathered before they are handed to the writer. */
const PUSH_SAMPLES = 1 << 16;

/** Column (1-based) of a JSON.parse error, from the position in its message when there is one. */
function jsonErrorColumn(message: string, text: string): number {
  const m = /position (\d+)/.exec(message);
  return m ? Number(m[1]) + 1 : text.length + 1;
}

export async function readNdjsonSamples(chunks: AsyncIterable<Buffer>, timestamps: TimestampReader, sink: SampleSink): Promise<number> {
  const times = growableFloat64();
  const values = growableFloat32();
  let lastUs = Number.NEGATIVE_INFINITY;
  let total = 0;
  const fail = (errors: ProblemFieldError[]): never => {
    throw invalidSamples(errors);
  };

  const splitter = new LineSplitter((text, line) => {
    if (text.trim() === '') return;
    let record: unknown;
    try {
      record = JSON.parse(text);
    } catch (err) {
      const message = (err as Error).message;
      throw malformedAt(`not valid JSON (${message})`, line, jsonErrorColumn(message, text));
    }
    if (typeof record !== 'object' || record === null || Array.isArray(record)) {
      fail([{ detail: 'each line must be an object {"t": ..., "a": ...}', line }]);
    }
    const { t, a } = record as Record<string, unknown>;
    for (const key in record as object) {
      if (key !== 't' && key !== 'a') fail([{ detail: `unknown member "${key}"; each line holds t and a`, line }]);
    }
    if (typeof t !== 'number' && typeof t !== 'string') fail([{ detail: 't must be a timestamp (number or string)', line }]);
    if (typeof a !== 'number') fail([{ detail: a === undefined ? 'a is missing' : 'a must be a number', line }]);
    const problem = readingProblem(a as number);
    if (problem) fail([{ detail: `a is ${problem}`, line }]);
    let us: number;
    try {
      us = typeof t === 'number' ? timestamps.fromNumber(t) : timestamps.fromText(t as string);
    } catch (err) {
      if (err instanceof TimestampError) return fail([{ detail: `t: ${err.message}`, line }]);
      throw err;
    }
    if (!(us > lastUs)) fail([{ detail: 'timestamps must increase: t is not after the previous line\'s', line }]);
    lastUs = us;
    times.push(us);
    values.push(a as number);
  });

  const flush = async () => {
    if (values.length === 0) return;
    await sink.pushExplicit(values.view(), times.view());
    total += values.length;
    times.dropFirst(times.length);
    values.dropFirst(values.length);
  };

  await splitBody(chunks, splitter, async () => {
    if (values.length >= PUSH_SAMPLES) await flush();
  }, 'NDJSON');
  await flush();
  if (total === 0) throw invalidSamples([{ detail: 'the body holds no samples', line: 1 }]);
  return total;
}
