/**
 * The body of a sample upload as a stream of Buffers: counted against the route's size limit (413
 * as soon as it is passed, before the rest is read) and, when the request carries an Idempotency-Key,
 * hashed on the way through so a retry can be recognised without keeping the body.
 */
import type { Hash } from 'node:crypto';
import type { Readable } from 'node:stream';
import { Problem } from '../errors/problem.js';

const UNITS: Record<string, number> = { b: 1, kb: 1024, mb: 1024 ** 2, gb: 1024 ** 3, tb: 1024 ** 4 };

/** A size like the body-parser limits: `2gb`, `5mb`, `512kb` or plain bytes (1 kb = 1024 bytes). */
export function parseByteSize(text: string): number {
  const m = /^\s*(\d+(?:\.\d+)?)\s*(b|kb|mb|gb|tb)?\s*$/i.exec(text);
  if (!m) throw new RangeError(`"${text}" is not a size like 2gb, 5mb or 1048576`);
  return Math.floor(Number(m[1]) * (UNITS[(m[2] ?? 'b').toLowerCase()] as number));
}

export function tooLarge(limitBytes: number): Problem {
  return new Problem(
    'too-large',
    `The body is larger than the limit of ${limitBytes} bytes for sample uploads; send the samples in several batches. Nothing was stored.`,
  );
}

/** Yields the body's Buffers, throwing a 413 problem once more than `limitBytes` have arrived. */
export async function* limitedBody(stream: AsyncIterable<Buffer | string> | Readable, limitBytes: number, hash?: Hash): AsyncGenerator<Buffer> {
  let total = 0;
  for await (const piece of stream as AsyncIterable<Buffer | string>) {
    const buf = typeof piece === 'string' ? Buffer.from(piece) : piece;
    total += buf.length;
    if (total > limitBytes) throw tooLarge(limitBytes);
    hash?.update(buf);
    yield buf;
  }
}

/** Reads a stream to its end, only hashing it (a replayed request whose answer is already known). */
export async function drainBody(chunks: AsyncIterable<Buffer>): Promise<void> {
  for await (const _ of chunks) {
    // Consumed for the hash and the size limit only.
  }
}
