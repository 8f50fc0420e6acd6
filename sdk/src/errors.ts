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

/** Every failed call throws this: the HTTP status and the problem body the API answered with. */
export class HeadroomApiError extends Error {
  readonly status: number;
  readonly problem: ProblemDetails;

  constructor(problem: ProblemDetails) {
    const where = problem.errors?.length
      ? ': ' +
        problem.errors
          .map((e) => `${e.pointer ?? e.parameter ?? (e.line !== undefined ? `line ${e.line}` : '')} ${e.detail}`.trim())
          .join('; ')
      : '';
    super(`${problem.title} (${problem.status}): ${problem.detail}${where}`);
    this.name = 'HeadroomApiError';
    this.status = problem.status;
    this.problem = problem;
  }

  get requestId(): string | undefined {
    return this.problem.requestId;
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
