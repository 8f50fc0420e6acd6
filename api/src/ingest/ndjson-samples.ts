/**
 * `application/x-ndjson` sample bodies: one `{"t": ..., "a": ...}` object per line, streamed (blank
 * lines are skipped). `t` is epoch ms, an ISO 8601 string or seconds from the trace start (the same
 * format on every line); `a` is the reading. Errors name the line (and column, for bad JSON).
 */
import type { ProblemFieldError } from '../errors/problem.js';
import { invalidSamples, malformedAt } from './body-errors.js';
import { ByteLineSplitter, splitBody } from './line-splitter.js';
import { growableFloat32, growableFloat64, readingProblem, type SampleSink } from './sample-sink.js';
import { scanJsonNumber, type ScannedNumber } from './decimal-text.js';
import { TimestampError, type TimestampReader } from './timestamps.js';

/** Samples gathered before they are handed to the writer. */
const PUSH_SAMPLES = 1 << 16;

/** Where `plainRecord` puts what it read (one reader per body, so no object per line). */
interface PlainRecord {
  t: number;
  a: number;
}

const scanned: ScannedNumber = { value: 0, end: 0 };

function skipSpaces(buf: Buffer, i: number, end: number): number {
  while (i < end && (buf[i] === 32 || buf[i] === 9)) i++;
  return i;
}

/**
 * Reads the usual line, `{"t": <number>, "a": <number>}` (either order, spaces allowed), straight from
 * the body's bytes: no string, no JSON.parse and no object per line. False for anything else (a string
 * timestamp, another member, a malformed line), which then goes through JSON.parse and its checks and
 * messages.
 */
function plainRecord(buf: Buffer, start: number, end: number, out: PlainRecord): boolean {
  let i = skipSpaces(buf, start, end);
  if (i >= end || buf[i] !== 123) return false; // {
  let seen = 0;
  for (let member = 0; member < 2; member++) {
    i = skipSpaces(buf, i + 1, end);
    if (i + 3 > end || buf[i] !== 34 || buf[i + 2] !== 34) return false; // "t" or "a"
    const key = buf[i + 1];
    const bit = key === 116 ? 1 : key === 97 ? 2 : 0;
    if (bit === 0 || seen & bit) return false;
    seen |= bit;
    i = skipSpaces(buf, i + 3, end);
    if (i >= end || buf[i] !== 58) return false; // :
    // What follows the number is checked next: "01" reads as 0 followed by "1", which is refused there.
    if (!scanJsonNumber(buf, skipSpaces(buf, i + 1, end), end, scanned)) return false;
    if (bit === 1) out.t = scanned.value;
    else out.a = scanned.value;
    i = skipSpaces(buf, scanned.end, end);
    if (i >= end || buf[i] !== (member === 0 ? 44 : 125)) return false; // , then }
  }
  return skipSpaces(buf, i + 1, end) === end;
}

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

  /** Checks a line's reading and time and keeps them. */
  const accept = (t: number | string, a: number, line: number): void => {
    const problem = readingProblem(a);
    if (problem) fail([{ detail: `a is ${problem}`, line }]);
    let us: number;
    try {
      us = typeof t === 'number' ? timestamps.fromNumber(t) : timestamps.fromText(t);
    } catch (err) {
      if (err instanceof TimestampError) return fail([{ detail: `t: ${err.message}`, line }]);
      throw err;
    }
    if (!(us > lastUs)) fail([{ detail: 'timestamps must increase: t is not after the previous line\'s', line }]);
    lastUs = us;
    times.push(us);
    values.push(a);
  };

  const plain: PlainRecord = { t: 0, a: 0 };
  const splitter = new ByteLineSplitter((buf, start, end, line) => {
    if (plainRecord(buf, start, end, plain)) return accept(plain.t, plain.a, line);
    const text = buf.toString('utf8', start, end);
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
    accept(t as number | string, a as number, line);
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
