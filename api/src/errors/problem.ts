/**
 * RFC 9457 problem details. Every error the API answers with is a Problem; the problem-details
 * middleware is the only place that turns errors into responses.
 */

/** The fixed, documented set of problem types (README "Errors"). */
export const PROBLEM_TYPES = {
  validation: { status: 400, title: 'Request is invalid' },
  'malformed-body': { status: 400, title: 'Request body could not be parsed' },
  unauthenticated: { status: 401, title: 'Authentication required' },
  forbidden: { status: 403, title: 'Not allowed' },
  'not-found': { status: 404, title: 'Not found' },
  conflict: { status: 409, title: 'Conflict' },
  'too-large': { status: 413, title: 'Request body too large' },
  'unsupported-media-type': { status: 415, title: 'Unsupported media type' },
  'rate-limited': { status: 429, title: 'Too many requests' },
  internal: { status: 500, title: 'Internal error' },
  unavailable: { status: 503, title: 'Service unavailable' },
} as const;

export type ProblemType = keyof typeof PROBLEM_TYPES;

/** One entry of `errors[]`: a message and exactly one locator. */
export interface ProblemFieldError {
  detail: string;
  /** JSON Pointer into the request body. */
  pointer?: string;
  /** Name of a query, path or header parameter. */
  parameter?: string;
  /** 1-based line (and column) in a CSV or NDJSON body. */
  line?: number;
  column?: number;
}

export class Problem extends Error {
  readonly type: ProblemType;
  readonly status: number;
  readonly title: string;
  readonly errors: ProblemFieldError[] | undefined;
  readonly headers: Record<string, string>;
  /** Extra members for the body, e.g. the overlapping time range of a refused batch. */
  readonly extensions: Record<string, unknown>;

  constructor(
    type: ProblemType,
    detail: string,
    options: {
      errors?: ProblemFieldError[];
      headers?: Record<string, string>;
      extensions?: Record<string, unknown>;
      cause?: unknown;
    } = {},
  ) {
    super(detail, { cause: options.cause });
    this.type = type;
    this.status = PROBLEM_TYPES[type].status;
    this.title = PROBLEM_TYPES[type].title;
    this.errors = options.errors;
    this.headers = options.headers ?? {};
    this.extensions = options.extensions ?? {};
  }
}

export const notFound = (what: string) => new Problem('not-found', `${what} was not found`);
export const conflict = (detail: string, extensions?: Record<string, unknown>) =>
  new Problem('conflict', detail, extensions ? { extensions } : {});
export const invalid = (errors: ProblemFieldError[], detail?: string) =>
  new Problem('validation', detail ?? `${errors.length} problem${errors.length === 1 ? '' : 's'} in the request`, {
    errors,
  });
