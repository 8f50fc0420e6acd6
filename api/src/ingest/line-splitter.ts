/**
 * Splits a streamed body into lines (LF or CRLF) numbered from 1: as text, decoding UTF-8 across
 * Buffer boundaries (LineSplitter), or as byte ranges of the body's Buffers, for readers that parse
 * bytes (ByteLineSplitter). Lines are handed to a synchronous callback; the caller awaits between
 * Buffers.
 */
import { StringDecoder } from 'node:string_decoder';
import { malformedAt } from './body-errors.js';

/** Longest line accepted (characters, or bytes for ByteLineSplitter): a body without line breaks must not grow without bound. */
export const MAX_LINE_CHARS = 1 << 20;

export class LineTooLongError extends Error {
  constructor(readonly line: number) {
    super(`line ${line} is longer than ${MAX_LINE_CHARS} characters`);
  }
}

export class LineSplitter {
  private readonly decoder = new StringDecoder('utf8');
  private rest = '';
  private lineNumber = 0;

  constructor(private readonly onLine: (text: string, line: number) => void) {}

  feed(chunk: Buffer): void {
    const text = this.rest + this.decoder.write(chunk);
    let start = 0;
    let nl = text.indexOf('\n', start);
    while (nl >= 0) {
      const end = nl > start && text.charCodeAt(nl - 1) === 13 ? nl - 1 : nl;
      this.onLine(text.slice(start, end), ++this.lineNumber);
      start = nl + 1;
      nl = text.indexOf('\n', start);
    }
    this.rest = text.slice(start);
    if (this.rest.length > MAX_LINE_CHARS) throw new LineTooLongError(this.lineNumber + 1);
  }

  end(): void {
    const text = this.rest + this.decoder.end();
    this.rest = '';
    if (text.length > 0) {
      const end = text.charCodeAt(text.length - 1) === 13 ? text.length - 1 : text.length;
      this.onLine(text.slice(0, end), ++this.lineNumber);
    }
  }
}

/**
 * Lines as byte ranges: `onLine(buf, start, end, line)` gets buf[start, end) without its line break.
 * The Buffer is valid during the call only. A line cut by a Buffer boundary is carried over (copied,
 * at most MAX_LINE_CHARS bytes); LF never occurs inside a UTF-8 sequence, so a line's bytes decode
 * on their own.
 */
export class ByteLineSplitter {
  private carry: Buffer | null = null;
  private lineNumber = 0;

  constructor(private readonly onLine: (buf: Buffer, start: number, end: number, line: number) => void) {}

  private emit(buf: Buffer, start: number, nl: number): void {
    const end = nl > start && buf[nl - 1] === 13 ? nl - 1 : nl;
    this.onLine(buf, start, end, ++this.lineNumber);
  }

  feed(chunk: Buffer): void {
    let start = 0;
    let nl = chunk.indexOf(10);
    if (this.carry) {
      if (nl < 0) {
        this.carry = this.carried(Buffer.concat([this.carry, chunk]));
        return;
      }
      // The carried line ends in this Buffer: join only that line's bytes.
      const line = Buffer.concat([this.carry, chunk.subarray(0, nl + 1)]);
      this.carry = null;
      this.emit(line, 0, line.length - 1);
      start = nl + 1;
      nl = chunk.indexOf(10, start);
    }
    while (nl >= 0) {
      this.emit(chunk, start, nl);
      start = nl + 1;
      nl = chunk.indexOf(10, start);
    }
    if (start < chunk.length) this.carry = this.carried(Buffer.from(chunk.subarray(start)));
  }

  private carried(rest: Buffer): Buffer {
    if (rest.length > MAX_LINE_CHARS) throw new LineTooLongError(this.lineNumber + 1);
    return rest;
  }

  end(): void {
    const rest = this.carry;
    this.carry = null;
    if (rest && rest.length > 0) this.emit(rest, 0, rest.length);
  }
}

/** What splitBody feeds: either splitter. */
interface Splitter {
  feed(chunk: Buffer): void;
  end(): void;
}

/**
 * Feeds a streamed body through `splitter`, calling `between` after each Buffer (where the caller
 * hands gathered samples on). A line too long becomes a malformed-body problem naming `format`.
 */
export async function splitBody(chunks: AsyncIterable<Buffer>, splitter: Splitter, between: () => Promise<void>, format: string): Promise<void> {
  try {
    for await (const chunk of chunks) {
      splitter.feed(chunk);
      await between();
    }
    splitter.end();
  } catch (err) {
    if (err instanceof LineTooLongError) throw malformedAt(`the line is too long (is the body ${format}?)`, err.line);
    throw err;
  }
}
