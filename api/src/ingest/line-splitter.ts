/**
 * Splits a streamed text body into lines (LF or CRLF), decoding UTF-8 across Buffer boundaries, and
 * numbers them from 1. Lines are handed to a synchronous callback; the caller awaits between Buffers.
 */
import { StringDecoder } from 'node:string_decoder';
import { malformedAt } from './body-errors.js';

/** Longest line accepted (characters): a body without line breaks must not grow without bound. */
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
 * Feeds a streamed body through `splitter`, calling `between` after each Buffer (where the caller
 * hands gathered samples on). A line too long becomes a malformed-body problem naming `format`.
 */
export async function splitBody(chunks: AsyncIterable<Buffer>, splitter: LineSplitter, between: () => Promise<void>, format: string): Promise<void> {
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
