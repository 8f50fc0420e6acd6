/**
 * `application/json` sample bodies, parsed as a stream (the body is never held whole):
 *
 *   { "t": [...], "a": [...] }                 timestamps (epoch ms, ISO 8601 strings or seconds
 *                                              from the trace start) and readings, pairwise;
 *   { "start": ..., "rate": ..., "values": [...] }  readings at a uniform rate from `start` (epoch ms
 *                                              or ISO 8601; omitted or null: continue the stored run,
 *                                              or the trace's start time); `rate` defaults to the
 *                                              trace's sample rate.
 *
 * A byte-level tokenizer written for these two shapes: it keeps its state between the body's
 * Buffers (a token cut by a Buffer boundary is carried over), tracks line and column for errors, and
 * reads numbers without building strings. Runs of plain numbers, the bulk of a body, go to the
 * WebAssembly number-run reader (number-run.ts); every other element, and every error, is this
 * reader's (Clinger's fast path: up to 15 significant digits and a power of ten up to 22 give the
 * correctly rounded double; anything else goes through Number()). Pairs are handed to the writer as
 * soon as both arrays have them, so with `t` before `a` only the timestamps are buffered.
 */
import { Problem, type ProblemFieldError } from '../errors/problem.js';
import { invalidSamples, malformedAt } from './body-errors.js';
import { parseJsonNumber } from './decimal-text.js';
import { forgetNumberRunInput, NUMBER_RUN_CAPACITY, numberRunEnd, numberRunValues, readNumberRun } from './number-run.js';
import { growableFloat32, growableFloat64, MAX_ABS_READING, readingProblem, type SampleSink, type UniformStart } from './sample-sink.js';
import { TimestampError, type TimestampReader } from './timestamps.js';

export interface JsonSampleOptions {
  timestamps: TimestampReader;
  /** The trace's sample rate, used when `rate` is absent. */
  defaultRateHz: number | null;
  /** Where `values` start when `start` is absent or null. */
  defaultStart: UniformStart | null;
}

type Key = 't' | 'a' | 'values' | 'start' | 'rate';
const KEYS: ReadonlySet<string> = new Set(['t', 'a', 'values', 'start', 'rate']);

const enum State {
  Start,
  KeyOrEnd,
  Key,
  Colon,
  Value,
  ItemOrEnd,
  Item,
  CommaOrArrayEnd,
  CommaOrEnd,
  Done,
}

/** Why a timestamp is refused when it does not come after the one before. */
const NOT_INCREASING = 'timestamps must increase: this one is not after the previous one';

/** A token longer than this (bytes) is refused rather than carried over without bound. */
const MAX_TOKEN_BYTES = 4096;

class JsonSampleParser {
  private state = State.Start;
  private key: Key | null = null;
  private readonly seen = new Set<Key>();
  private line = 1;
  /** Absolute byte offset of the start of the current line. */
  private lineStart = 0;
  /** Absolute byte offset of buf[0]. */
  private base = 0;
  private carry: Buffer | null = null;

  private readonly times = growableFloat64();
  private readonly values = growableFloat32();
  private timeCount = 0;
  private valueCount = 0;
  private pushedPairs = 0;
  private lastTimeUs = Number.NEGATIVE_INFINITY;
  private start: UniformStart | null | undefined = undefined;
  private rateHz: number | undefined;
  private pushedUniform = 0;

  constructor(
    private readonly options: JsonSampleOptions,
    private readonly sink: SampleSink,
  ) {}

  private malformed(detail: string, at: number): never {
    throw malformedAt(detail, this.line, at - this.lineStart + 1);
  }

  private invalid(errors: ProblemFieldError[]): never {
    throw invalidSamples(errors);
  }

  /** Refuses timestamp `index` of `t` (counted from the body's first). */
  private badTime(detail: string, index: number): never {
    return this.invalid([{ detail, pointer: `/t/${index}` }]);
  }

  /** Refuses reading `index` of the current array (`a` or `values`). */
  private badReading(detail: string, index: number): never {
    return this.invalid([{ detail, pointer: `/${this.key}/${index}` }]);
  }

  async feed(chunk: Buffer): Promise<void> {
    const buf = this.carry ? Buffer.concat([this.carry, chunk]) : chunk;
    if (this.carry) this.base -= this.carry.length;
    this.carry = null;
    const used = this.scan(buf, false);
    if (used < buf.length) {
      if (buf.length - used > MAX_TOKEN_BYTES) this.malformed(`a token is longer than ${MAX_TOKEN_BYTES} bytes`, this.base + used);
      this.carry = Buffer.from(buf.subarray(used));
    }
    this.base += buf.length;
    await this.pushReady();
  }

  async end(): Promise<number> {
    if (this.carry) {
      const buf = this.carry;
      this.base -= buf.length;
      this.carry = null;
      this.scan(buf, true);
      this.base += buf.length;
    }
    if (this.state !== State.Done) {
      this.malformed(this.state === State.Start ? 'the body is empty' : 'the JSON object is not complete', this.base);
    }
    return this.finish();
  }

  /** Scans tokens from buf; returns how many bytes were consumed (the rest is an incomplete token). */
  private scan(buf: Buffer, final: boolean): number {
    forgetNumberRunInput(); // buf may be a Buffer read before, with other bytes now
    let p = 0;
    const end = buf.length;
    while (true) {
      // Whitespace (newlines only occur here in JSON).
      while (p < end) {
        const b = buf[p] as number;
        if (b === 32 || b === 9 || b === 13) p++;
        else if (b === 10) {
          p++;
          this.line++;
          this.lineStart = this.base + p;
        } else break;
      }
      if (p >= end) return p;
      const b = buf[p] as number;
      const at = this.base + p;
      switch (this.state) {
        case State.Start:
          if (b !== 123) this.malformed('expected "{" at the start of the body', at);
          this.state = State.KeyOrEnd;
          p++;
          continue;
        case State.KeyOrEnd:
        case State.Key: {
          if (b === 125 && this.state === State.KeyOrEnd) {
            this.state = State.Done;
            p++;
            continue;
          }
          if (b !== 34) this.malformed('expected a quoted member name', at);
          const close = this.stringEnd(buf, p, end, final);
          if (close < 0) return p;
          const name = this.decodeString(buf, p, close);
          if (!KEYS.has(name)) {
            this.invalid([{ detail: 'unknown member; expected t and a, or start, rate and values', pointer: `/${name}` }]);
          }
          const key = name as Key;
          if (this.seen.has(key)) this.malformed(`member "${key}" appears twice`, at);
          this.seen.add(key);
          const explicit = this.seen.has('t') || this.seen.has('a');
          const uniform = this.seen.has('values') || this.seen.has('start') || this.seen.has('rate');
          if (explicit && uniform) {
            this.invalid([{ detail: 'send either t and a, or start, rate and values, not both', pointer: `/${key}` }]);
          }
          this.key = key;
          this.state = State.Colon;
          p = close + 1;
          continue;
        }
        case State.Colon:
          if (b !== 58) this.malformed('expected ":" after the member name', at);
          this.state = State.Value;
          p++;
          continue;
        case State.Value: {
          const key = this.key as Key;
          if (key === 't' || key === 'a' || key === 'values') {
            if (b !== 91) this.invalid([{ detail: 'must be an array', pointer: `/${key}` }]);
            this.state = State.ItemOrEnd;
            p++;
            continue;
          }
          const next = this.scalar(buf, p, end, final, key);
          if (next < 0) return p;
          this.state = State.CommaOrEnd;
          p = next;
          continue;
        }
        case State.ItemOrEnd:
        case State.Item: {
          if (b === 93) {
            if (this.state === State.Item) this.malformed('expected a value after ","', at);
            this.state = State.CommaOrEnd;
            p++;
            continue;
          }
          if (b !== 34) {
            const after = this.numberRun(buf, p, end);
            if (after !== p) {
              p = after;
              continue;
            }
          }
          const next = this.item(buf, p, end, final);
          if (next < 0) return p;
          this.state = State.CommaOrArrayEnd;
          p = next;
          continue;
        }
        case State.CommaOrArrayEnd:
          if (b === 44) this.state = State.Item;
          else if (b === 93) this.state = State.CommaOrEnd;
          else this.malformed('expected "," or "]" in the array', at);
          p++;
          continue;
        case State.CommaOrEnd:
          if (b === 44) this.state = State.Key;
          else if (b === 125) this.state = State.Done;
          else this.malformed('expected "," or "}" after the member', at);
          p++;
          continue;
        case State.Done:
          this.malformed('unexpected data after the JSON object', at);
      }
    }
  }

  /** Index of the closing quote of the string starting at p, or -1 when the buffer ends first. */
  private stringEnd(buf: Buffer, p: number, end: number, final: boolean): number {
    let i = p + 1;
    while (i < end) {
      const c = buf[i] as number;
      if (c === 34) return i;
      if (c === 92) i += 2;
      else if (c < 32) this.malformed('control character in a string', this.base + i);
      else i++;
    }
    if (final) this.malformed('the string is not closed', this.base + p);
    return -1;
  }

  private decodeString(buf: Buffer, p: number, close: number): string {
    const raw = buf.toString('utf8', p + 1, close);
    if (!raw.includes('\\')) return raw;
    try {
      return JSON.parse(buf.toString('utf8', p, close + 1)) as string;
    } catch {
      return this.malformed('invalid escape in a string', this.base + p);
    }
  }

  /** End of the bare token (number or literal) at p, or -1 when the buffer ends inside it. */
  private bareEnd(buf: Buffer, p: number, end: number, final: boolean): number {
    let i = p;
    while (i < end) {
      const c = buf[i] as number;
      if (c === 44 || c === 93 || c === 125 || c === 32 || c === 10 || c === 13 || c === 9) return i;
      i++;
    }
    return final ? i : -1;
  }

  /** A number token at p: its value, or a malformed-body error naming what was found. */
  private number(buf: Buffer, p: number, tokenEnd: number): number {
    const value = parseJsonNumber(buf, p, tokenEnd);
    if (Number.isNaN(value)) {
      const text = buf.toString('latin1', p, Math.min(tokenEnd, p + 40));
      const literal = text === 'true' || text === 'false' || text === 'null' || text === 'NaN' || text === 'Infinity' || text === '-Infinity';
      this.malformed(literal ? `${text} is not a JSON number` : `"${text}" is not a JSON value`, this.base + p);
    }
    return value;
  }

  /**
   * The body's bulk, array elements that are plain numbers, read by the WebAssembly number-run reader
   * (number-run.ts): a number followed at once by "," or "]" within this buffer is read and stored
   * (through addTime or addValue, the general reader's own checks, in the body's order), and the run
   * goes on to the next element. It stops at the first element it does not take (whitespace, a
   * string, a literal, an exponent, a number cut by the buffer's end, followed by anything else or
   * not read exactly by the fast path) and leaves that to `item`, which reads it or names the error.
   * Returns the index after the last element taken (p when none was), with the state set for what
   * follows it.
   */
  private numberRun(buf: Buffer, p: number, end: number): number {
    const times = this.key === 't';
    for (;;) {
      const count = readNumberRun(buf, p, end);
      if (count === 0) return p;
      if (times) this.addTimes(count);
      else this.addValues(count);
      p = numberRunEnd.stop;
      this.state = numberRunEnd.closed ? State.CommaOrEnd : State.Item;
      if (numberRunEnd.closed || count < NUMBER_RUN_CAPACITY) return p;
    }
  }

  /** The timestamps numberRunValues[0, count): addTime on each, in one loop (the first problem in body order wins). */
  private addTimes(count: number): void {
    const at = this.times.length;
    const out = this.times.extend(count);
    let failed: TimestampError | null = null;
    let read = count;
    try {
      this.options.timestamps.fromNumbers(numberRunValues, count, out, at);
    } catch (err) {
      if (!(err instanceof TimestampError)) throw err;
      failed = err;
      read = err.index;
    }
    let last = this.lastTimeUs;
    for (let k = 0; k < read; k++) {
      const us = out[at + k] as number;
      if (!(us > last)) this.badTime(NOT_INCREASING, this.timeCount + k);
      last = us;
    }
    if (failed) this.badTime(failed.message, this.timeCount + read);
    this.lastTimeUs = last;
    this.timeCount += count;
  }

  /** The readings numberRunValues[0, count): addValue on each, in one loop. */
  private addValues(count: number): void {
    const at = this.values.length;
    const out = this.values.extend(count);
    for (let k = 0; k < count; k++) {
      const value = numberRunValues[k] as number;
      // Most readings pass this one comparison; readingProblem names what is wrong with the others.
      if (!(Math.abs(value) <= MAX_ABS_READING)) {
        const problem = readingProblem(value);
        if (problem) this.badReading(problem, this.valueCount + k);
      }
      out[at + k] = value;
    }
    this.valueCount += count;
  }

  /** One array element at p; returns the index after it, or -1 when incomplete. */
  private item(buf: Buffer, p: number, end: number, final: boolean): number {
    const key = this.key as Key;
    const b = buf[p] as number;
    if (b === 34) {
      const close = this.stringEnd(buf, p, end, final);
      if (close < 0) return -1;
      if (key !== 't') this.invalid([{ detail: 'must be a number, not a string', pointer: `/${key}/${this.valueCount}` }]);
      this.addTime(this.decodeString(buf, p, close), null);
      return close + 1;
    }
    const tokenEnd = this.bareEnd(buf, p, end, final);
    if (tokenEnd < 0) return -1;
    if (tokenEnd === p) this.malformed(this.state === State.Item ? 'expected a value after ","' : 'expected a value or "]"', this.base + p);
    // n, t, f: the literals null, true, false (checked only then, so numbers make no string).
    if (b === 110 || b === 116 || b === 102) {
      const text = buf.toString('latin1', p, Math.min(tokenEnd, p + 10));
      if (text === 'null' || text === 'true' || text === 'false') {
        const index = key === 't' ? this.timeCount : this.valueCount;
        this.invalid([{ detail: `must be a ${key === 't' ? 'timestamp' : 'number'}, not ${text}`, pointer: `/${key}/${index}` }]);
      }
    }
    const value = this.number(buf, p, tokenEnd);
    if (key === 't') this.addTime(null, value);
    else this.addValue(value);
    return tokenEnd;
  }

  private addTime(text: string | null, value: number | null): void {
    const index = this.timeCount;
    let us: number;
    try {
      us = text !== null ? this.options.timestamps.fromText(text) : this.options.timestamps.fromNumber(value as number);
    } catch (err) {
      if (err instanceof TimestampError) this.badTime(err.message, index);
      throw err;
    }
    if (!(us > this.lastTimeUs)) this.badTime(NOT_INCREASING, index);
    this.lastTimeUs = us;
    this.times.push(us);
    this.timeCount++;
  }

  private addValue(value: number): void {
    const problem = readingProblem(value);
    if (problem) this.badReading(problem, this.valueCount);
    this.values.push(value);
    this.valueCount++;
  }

  private scalar(buf: Buffer, p: number, end: number, final: boolean, key: Key): number {
    const b = buf[p] as number;
    if (b === 34) {
      const close = this.stringEnd(buf, p, end, final);
      if (close < 0) return -1;
      if (key !== 'start') this.invalid([{ detail: 'must be a number', pointer: `/${key}` }]);
      this.setStart(this.decodeString(buf, p, close), null);
      return close + 1;
    }
    if (b === 123 || b === 91) this.invalid([{ detail: key === 'rate' ? 'must be a number' : 'must be a number or an ISO 8601 string', pointer: `/${key}` }]);
    const tokenEnd = this.bareEnd(buf, p, end, final);
    if (tokenEnd < 0) return -1;
    if (buf.toString('latin1', p, tokenEnd) === 'null') {
      if (key === 'rate') this.invalid([{ detail: 'must be a number', pointer: '/rate' }]);
      this.start = null;
      return tokenEnd;
    }
    const value = this.number(buf, p, tokenEnd);
    if (key === 'rate') {
      if (!(value > 0 && value <= 1e7)) this.invalid([{ detail: 'must be a sample rate in Hz, above 0 and at most 10,000,000', pointer: '/rate' }]);
      this.rateHz = value;
    } else this.setStart(null, value);
    return tokenEnd;
  }

  private setStart(text: string | null, value: number | null): void {
    const t = this.options.timestamps;
    try {
      // `start` is an instant: epoch ms or ISO 8601 (or seconds from the trace start, as in `t`).
      this.start = { startUs: text !== null ? t.fromText(text) : t.fromNumber(value as number) };
    } catch (err) {
      if (err instanceof TimestampError) this.invalid([{ detail: err.message, pointer: '/start' }]);
      throw err;
    }
  }

  private uniformParameters(atEnd: boolean): { start: UniformStart; rateHz: number } | null {
    // Until the object ends, `start` and `rate` may still come after `values`.
    if (!atEnd && !(this.seen.has('start') && this.seen.has('rate'))) return null;
    const rateHz = this.rateHz ?? this.options.defaultRateHz;
    if (rateHz === null || rateHz === undefined) {
      this.invalid([{ detail: 'required: the trace has no sample rate', pointer: '/rate' }]);
    }
    const start = this.start ?? this.options.defaultStart;
    if (start === null) this.invalid([{ detail: 'required: the trace has no start time and no stored series to continue', pointer: '/start' }]);
    return { start, rateHz };
  }

  private async pushReady(atEnd = false): Promise<void> {
    if (this.seen.has('values')) {
      if (this.values.length === 0) return;
      const params = this.uniformParameters(atEnd);
      if (!params) return;
      await this.sink.pushUniform(this.values.view(), this.pushedUniform === 0 ? params.start : 'continue', params.rateHz);
      this.pushedUniform += this.values.length;
      this.values.dropFirst(this.values.length);
      return;
    }
    const n = Math.min(this.times.length, this.values.length);
    if (n === 0) return;
    await this.sink.pushExplicit(this.values.view(0, n), this.times.view(0, n));
    this.times.dropFirst(n);
    this.values.dropFirst(n);
    this.pushedPairs += n;
  }

  private async finish(): Promise<number> {
    if (this.seen.has('t') || this.seen.has('a')) {
      if (!this.seen.has('t') || !this.seen.has('a')) {
        this.invalid([{ detail: 'required together with the other array', pointer: this.seen.has('t') ? '/a' : '/t' }]);
      }
      if (this.timeCount !== this.valueCount) {
        this.invalid([
          { detail: `${this.timeCount} timestamps, but ${this.valueCount} values in a`, pointer: '/t' },
          { detail: `${this.valueCount} values, but ${this.timeCount} timestamps in t`, pointer: '/a' },
        ]);
      }
      await this.pushReady(true);
      if (this.pushedPairs === 0) this.invalid([{ detail: 'the arrays are empty', pointer: '/a' }]);
      return this.pushedPairs;
    }
    if (!this.seen.has('values')) {
      throw new Problem('validation', 'The body holds no samples: send {"t": [...], "a": [...]} or {"start": ..., "rate": ..., "values": [...]}', {
        errors: [{ detail: 'required', pointer: '/values' }],
      });
    }
    await this.pushReady(true);
    if (this.pushedUniform === 0) this.invalid([{ detail: 'the array is empty', pointer: '/values' }]);
    return this.pushedUniform;
  }
}

/** Reads a JSON sample body into `sink`; returns the number of samples. */
export async function readJsonSamples(chunks: AsyncIterable<Buffer>, options: JsonSampleOptions, sink: SampleSink): Promise<number> {
  const parser = new JsonSampleParser(options, sink);
  for await (const chunk of chunks) await parser.feed(chunk);
  return parser.end();
}
