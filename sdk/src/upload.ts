import { bearerHeader, type ClientContext } from './client.js';
import { errorFromFailedResponse } from './errors.js';
import { newIdempotencyKey, serverKeepsIdempotencyKey } from './idempotency.js';
import { resolveRetry, withRetries, type RetryOptions } from './retry.js';

/** Bytes of the request body handed to the network so far, out of the whole body. */
export interface UploadProgress {
  loadedBytes: number;
  totalBytes: number;
}

/** A body that can be sent again from its start on a retry. */
export type ReplayableBody = Blob | Uint8Array | ArrayBuffer | string;

export interface SendOptions {
  method: 'POST' | 'PUT' | 'PATCH';
  /** Path under `/api/v1`, already filled in, e.g. `/traces/abc/samples`. */
  path: string;
  query?: Record<string, string | number | boolean | undefined>;
  headers?: Record<string, string>;
  body: ReplayableBody;
  /**
   * Byte progress of the body. In browsers it comes from XMLHttpRequest's upload events (bytes sent on
   * the wire); in Node from a streamed body (bytes handed to the socket; the last ones may still be in
   * flight). On a retry it starts again from 0. Either way each piece sent restarts the attempt timeout.
   */
  onProgress?: (progress: UploadProgress) => void;
  /** Sent as `Idempotency-Key`; a new random key when omitted. Kept the same across retries. */
  idempotencyKey?: string;
  retry?: RetryOptions | false;
  signal?: AbortSignal;
}

/** Size of the pieces an upload is handed to the network in (progress and stall detection see each). */
const PIECE_BYTES = 256 * 1024;

/** Bytes stay bytes (sliced without copying); text becomes UTF-8 bytes; a Blob stays a Blob (a file is never read whole). */
function asReplayable(body: ReplayableBody): Blob | Uint8Array {
  if (body instanceof Blob || body instanceof Uint8Array) return body;
  if (typeof body === 'string') return new TextEncoder().encode(body);
  return new Uint8Array(body);
}

function sizeOf(body: Blob | Uint8Array): number {
  return body instanceof Blob ? body.size : body.byteLength;
}

function buildUrl(context: ClientContext, path: string, query: SendOptions['query']): string {
  const params = new URLSearchParams();
  for (const [name, value] of Object.entries(query ?? {})) if (value !== undefined) params.set(name, String(value));
  const search = params.toString();
  return `${context.apiUrl}${path}${search ? `?${search}` : ''}`;
}

/** A stream over the body that reports each piece as the network takes it. */
function countingStream(body: Blob | Uint8Array, onProgress: (p: UploadProgress) => void): ReadableStream<Uint8Array> {
  const total = sizeOf(body);
  let offset = 0;
  return new ReadableStream<Uint8Array>({
    async pull(controller) {
      if (offset >= total) {
        controller.close();
        return;
      }
      const end = Math.min(total, offset + PIECE_BYTES);
      // A piece of bytes is a view (no copy); a piece of a Blob is read as it is needed.
      const piece = body instanceof Uint8Array ? body.subarray(offset, end) : new Uint8Array(await body.slice(offset, end).arrayBuffer());
      offset = end;
      controller.enqueue(piece);
      onProgress({ loadedBytes: offset, totalBytes: total });
    },
  });
}

/** One attempt through XMLHttpRequest: the only browser API that reports upload progress. */
function sendWithXhr(url: string, method: string, headers: Headers, blob: Blob, signal: AbortSignal, onProgress: (p: UploadProgress) => void): Promise<Response> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open(method, url);
    xhr.responseType = 'arraybuffer';
    headers.forEach((value, name) => xhr.setRequestHeader(name, value));
    xhr.upload.onprogress = (event) => onProgress({ loadedBytes: event.loaded, totalBytes: blob.size });
    xhr.onload = () => {
      const responseHeaders = new Headers();
      for (const line of xhr.getAllResponseHeaders().trim().split(/[\r\n]+/)) {
        const colon = line.indexOf(':');
        if (colon > 0) responseHeaders.append(line.slice(0, colon).trim(), line.slice(colon + 1).trim());
      }
      const empty = xhr.status === 204 || xhr.status === 205 || xhr.status === 304;
      resolve(new Response(empty ? null : (xhr.response as ArrayBuffer), { status: xhr.status, statusText: xhr.statusText, headers: responseHeaders }));
    };
    xhr.onerror = () => reject(new TypeError('network error'));
    xhr.ontimeout = () => reject(new TypeError('network timeout'));
    xhr.onabort = () => reject(signal.reason ?? new DOMException('The operation was aborted', 'AbortError'));
    signal.addEventListener('abort', () => xhr.abort(), { once: true });
    xhr.send(blob);
  });
}

/**
 * Sends a body that can be replayed (a Blob, bytes or text), with byte progress when asked, an
 * Idempotency-Key, and the client's retry policy (the attempt timeout counts time without progress). Resolves with the successful Response; a failed
 * status rejects with the typed error carrying the problem body.
 */
export async function sendBody(context: ClientContext, options: SendOptions): Promise<Response> {
  const body = asReplayable(options.body);
  const totalBytes = sizeOf(body);
  const url = buildUrl(context, options.path, options.query);
  const headers = new Headers({ ...options.headers, ...bearerHeader(context.token), 'Idempotency-Key': options.idempotencyKey ?? newIdempotencyKey() });
  const report = (p: UploadProgress) => options.onProgress?.(p);
  const response = await withRetries(
    (signal, progressed) => {
      report({ loadedBytes: 0, totalBytes });
      const onProgress = (p: UploadProgress) => {
        progressed();
        report(p);
      };
      // The body goes out in pieces we can see (XMLHttpRequest upload events in browsers, a pulled stream
      // in Node), so that progress is reported and a stalled upload, not a long one, times out.
      if (typeof XMLHttpRequest !== 'undefined') return sendWithXhr(url, options.method, headers, body instanceof Blob ? body : new Blob([body.slice()]), signal, onProgress);
      const init: RequestInit & { duplex: 'half' } = { method: options.method, headers, body: countingStream(body, onProgress), signal, duplex: 'half' };
      return context.fetch(url, init);
    },
    { method: options.method, hasIdempotencyKey: true, serverKeepsKey: serverKeepsIdempotencyKey(options.method, url), options: resolveRetry(context.retry, options.retry), signal: options.signal ?? null },
  );
  if (!response.ok) throw await errorFromFailedResponse(response);
  return response;
}

/** Text fields and one file as a multipart/form-data body (RFC 7578) that can be replayed and measured. */
export function multipartBody(fields: Record<string, string | number | boolean | undefined>, file: { field: string; name: string; type: string; content: Blob | Uint8Array | string }): { body: Blob; contentType: string } {
  const boundary = `headroom-${newIdempotencyKey()}`;
  const quote = (s: string) => s.replace(/["\r\n\\]/g, (c) => encodeURIComponent(c));
  const parts: BlobPart[] = [];
  for (const [name, value] of Object.entries(fields)) {
    if (value === undefined) continue;
    parts.push(`--${boundary}\r\nContent-Disposition: form-data; name="${quote(name)}"\r\n\r\n${String(value)}\r\n`);
  }
  parts.push(`--${boundary}\r\nContent-Disposition: form-data; name="${quote(file.field)}"; filename="${quote(file.name)}"\r\nContent-Type: ${file.type}\r\n\r\n`);
  parts.push(file.content instanceof Uint8Array ? new Uint8Array(file.content) : file.content, `\r\n--${boundary}--\r\n`);
  return { body: new Blob(parts), contentType: `multipart/form-data; boundary=${boundary}` };
}
