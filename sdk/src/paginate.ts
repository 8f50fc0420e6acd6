import type { HeadroomClient } from './client.js';
import { unwrap } from './client.js';
import type { paths } from './generated/openapi.js';

/** One page of a list as every Headroom list route answers it. */
export interface Page<T> {
  items: T[];
  nextCursor: string | null;
  total?: number;
}

/** Items of a list, fetched a page at a time as the loop asks for them. */
export interface PageIterator<T> extends AsyncIterable<T> {
  /** Every item (or the first `limit`), fetching pages until the end. */
  toArray(options?: { limit?: number }): Promise<T[]>;
  /** The pages themselves, for callers that want `total` or their own batching. */
  pages(): AsyncIterable<Page<T>>;
}

/** Follows `nextCursor` from page to page; `fetchPage` is called with undefined for the first page. */
export function pageThrough<T>(fetchPage: (cursor: string | undefined) => Promise<Page<T>>): PageIterator<T> {
  async function* pages(): AsyncGenerator<Page<T>> {
    let cursor: string | undefined;
    do {
      const page = await fetchPage(cursor);
      yield page;
      cursor = page.nextCursor ?? undefined;
    } while (cursor);
  }
  async function* items(): AsyncGenerator<T> {
    for await (const page of pages()) yield* page.items;
  }
  return {
    [Symbol.asyncIterator]: () => items(),
    pages,
    async toArray(options = {}) {
      const limit = options.limit ?? Infinity;
      const out: T[] = [];
      if (limit <= 0) return out;
      for await (const item of items()) {
        out.push(item);
        if (out.length >= limit) break;
      }
      return out;
    },
  };
}

type JsonOk<Op> = Op extends { responses: { 200: { content: { 'application/json': infer Body } } } } ? Body : never;

/** Paths whose GET answers a page (`{ items, nextCursor }`). */
export type PagedPath = {
  [P in keyof paths]: paths[P] extends { get: infer Op } ? (JsonOk<Op> extends Page<unknown> ? P : never) : never;
}[keyof paths];

/** The item type of a paged path. */
export type PageItem<P extends PagedPath> = paths[P] extends { get: infer Op } ? (JsonOk<Op> extends Page<infer T> ? T : never) : never;

/** The options of a paged GET: its documented parameters (the cursor is managed here). */
type GetInit<P extends PagedPath> = paths[P] extends { get: { parameters: infer Params } }
  ? { params?: Params; headers?: Record<string, string>; signal?: AbortSignal }
  : never;

/**
 * Async iteration over every item of a list route, page after page:
 * `for await (const trace of paginate(client, '/traces', { params: { query: { siteId } } })) …`
 */
export function paginate<P extends PagedPath>(client: HeadroomClient, path: P, init?: GetInit<P>): PageIterator<PageItem<P>> {
  // The path and its parameters were checked by the signature above; the loose type only lets one
  // generic call serve every list route.
  const get = client.GET as unknown as (path: string, init: unknown) => Promise<{ data?: Page<PageItem<P>>; error?: unknown; response: Response }>;
  const params = (init?.params ?? {}) as { query?: Record<string, unknown> };
  return pageThrough((cursor) =>
    unwrap(get(path, { ...init, params: { ...params, query: { ...params.query, ...(cursor ? { cursor } : {}) } } })),
  );
}
