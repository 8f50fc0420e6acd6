/** One field problem from an RFC 9457 body: a message and where it points. */
export interface ProblemFieldError {
  detail: string;
  pointer?: string;
  parameter?: string;
  line?: number;
  column?: number;
}

/** An RFC 9457 problem-details body as the Headroom API sends it. */
export interface ProblemDetails {
  type: string;
  title: string;
  status: number;
  detail: string;
  instance?: string;
  requestId?: string;
  errors?: ProblemFieldError[];
  [extension: string]: unknown;
}

/**
 * Every failed call throws this (or one of its subclasses below): the HTTP status and the problem body
 * the API answered with. `status` is 0 when no answer arrived at all (see HeadroomConnectionError).
 */
export class HeadroomApiError extends Error {
  readonly status: number;
  readonly problem: ProblemDetails;

  constructor(problem: ProblemDetails, options: { cause?: unknown } = {}) {
    const where = problem.errors?.length
      ? ': ' +
        problem.errors
          .map((e) => `${e.pointer ?? e.parameter ?? (e.line !== undefined ? `line ${e.line}` : '')} ${e.detail}`.trim())
          .join('; ')
      : '';
    super(`${problem.title} (${problem.status}): ${problem.detail}${where}`, options.cause === undefined ? undefined : { cause: options.cause });
    this.name = 'HeadroomApiError';
    this.status = problem.status;
    this.problem = problem;
  }

  get requestId(): string | undefined {
    return this.problem.requestId;
  }

  /** The field problems of a validation answer (`pointer`, `parameter` or `line`/`column` each). */
  get fieldErrors(): ProblemFieldError[] {
    return this.problem.errors ?? [];
  }
}

/** 400 (validation, malformed body) and 422: the request itself is wrong; `fieldErrors` say where. */
export class HeadroomValidationError extends HeadroomApiError {
  override readonly name = 'HeadroomValidationError';
}

/** 401: no session or API key, or one that is expired, revoked or unknown. */
export class HeadroomAuthenticationError extends HeadroomApiError {
  override readonly name = 'HeadroomAuthenticationError';
}

/** 403: the role or the key's scopes do not allow the action. */
export class HeadroomPermissionError extends HeadroomApiError {
  override readonly name = 'HeadroomPermissionError';
}

/** 404: no such route, or no such row in the caller's organisation. */
export class HeadroomNotFoundError extends HeadroomApiError {
  override readonly name = 'HeadroomNotFoundError';
}

/** 409: the request conflicts with the stored state (a closed trace, overlapping samples, a key reused). */
export class HeadroomConflictError extends HeadroomApiError {
  override readonly name = 'HeadroomConflictError';
}

/** 429: too many requests. `retryAfterMs` is the server's `Retry-After`, when it sent one. */
export class HeadroomRateLimitError extends HeadroomApiError {
  override readonly name = 'HeadroomRateLimitError';
  readonly retryAfterMs: number | undefined;

  constructor(problem: ProblemDetails, retryAfterMs: number | undefined) {
    super(problem);
    this.retryAfterMs = retryAfterMs;
  }
}

/** 5xx: the server failed or is unavailable; the `requestId` finds it in the server's log. */
export class HeadroomServerError extends HeadroomApiError {
  override readonly name = 'HeadroomServerError';
}

/**
 * No HTTP answer: the connection was refused or dropped, or an attempt timed out, after every retry.
 * `status` is 0 and `cause` holds the underlying error.
 */
export class HeadroomConnectionError extends HeadroomApiError {
  override readonly name = 'HeadroomConnectionError';

  constructor(detail: string, cause?: unknown) {
    super({ type: 'about:blank', title: 'Could not reach the Headroom API', status: 0, detail }, { cause });
  }
}

/** Builds a problem body for answers that did not carry one (a proxy's HTML error page, say). */
export function problemFromResponse(response: Response, body: unknown): ProblemDetails {
  if (body && typeof body === 'object' && 'status' in body && 'title' in body) return body as ProblemDetails;
  return {
    type: 'about:blank',
    title: response.statusText || 'Request failed',
    status: response.status,
    detail: typeof body === 'string' && body ? body.slice(0, 500) : `HTTP ${response.status}`,
  };
}

/**
 * `Retry-After` in milliseconds: delta-seconds or an HTTP date (RFC 9110 §10.2.3); undefined when absent
 * or unreadable.
 */
export function parseRetryAfter(value: string | null, now = Date.now()): number | undefined {
  if (value === null || value.trim() === '') return undefined;
  const trimmed = value.trim();
  if (/^\d+(\.\d+)?$/.test(trimmed)) return Math.round(Number(trimmed) * 1000);
  const date = Date.parse(trimmed);
  return Number.isNaN(date) ? undefined : Math.max(0, date - now);
}

/** The typed error for a failed answer: the subclass that matches its status, carrying the problem body. */
export function errorFromResponse(response: Response, body: unknown): HeadroomApiError {
  const problem = problemFromResponse(response, body);
  const status = response.status;
  if (status === 400 || status === 422) return new HeadroomValidationError(problem);
  if (status === 401) return new HeadroomAuthenticationError(problem);
  if (status === 403) return new HeadroomPermissionError(problem);
  if (status === 404) return new HeadroomNotFoundError(problem);
  if (status === 409) return new HeadroomConflictError(problem);
  if (status === 429) return new HeadroomRateLimitError(problem, parseRetryAfter(response.headers.get('Retry-After')));
  if (status >= 500) return new HeadroomServerError(problem);
  return new HeadroomApiError(problem);
}

/** Reads a failed response's body (problem JSON or text) and returns the matching typed error. */
export async function errorFromFailedResponse(response: Response): Promise<HeadroomApiError> {
  const text = await response.text().catch(() => '');
  let body: unknown = text;
  try {
    body = JSON.parse(text);
  } catch {
    // Not JSON: keep the text as the detail.
  }
  return errorFromResponse(response, body);
}
