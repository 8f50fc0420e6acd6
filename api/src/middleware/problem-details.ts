import type { ErrorRequestHandler, RequestHandler } from 'express';
import { ZodError } from 'zod';
import { Problem, PROBLEM_TYPES, type ProblemFieldError } from '../errors/problem.js';
import { zodIssuesToFieldErrors } from '../routes/validate.js';

/** Shape of a problem-details body (RFC 9457). */
export interface ProblemBody {
  type: string;
  title: string;
  status: number;
  detail: string;
  instance: string;
  requestId?: string;
  errors?: ProblemFieldError[];
  [extension: string]: unknown;
}

/** Errors thrown by body parsers (body-parser, raw-body) carry a `type` and `status`. */
interface HttpError extends Error {
  status?: number;
  statusCode?: number;
  type?: string;
  expose?: boolean;
}

/** Turns anything thrown into a Problem; unexpected errors become a 500 with no internals in the body. */
export function toProblem(err: unknown): { problem: Problem; expected: boolean } {
  if (err instanceof Problem) return { problem: err, expected: true };
  if (err instanceof ZodError) {
    const errors = zodIssuesToFieldErrors(err.issues, 'body');
    return { problem: new Problem('validation', `${errors.length} problem(s) in the request`, { errors }), expected: true };
  }
  const e = err as HttpError;
  switch (e?.type) {
    case 'entity.parse.failed':
      return { problem: new Problem('malformed-body', `The JSON body could not be parsed: ${e.message}`), expected: true };
    case 'entity.too.large':
      return { problem: new Problem('too-large', 'The request body is larger than the limit for this route'), expected: true };
    case 'encoding.unsupported':
    case 'charset.unsupported':
      return { problem: new Problem('unsupported-media-type', e.message), expected: true };
    case 'request.aborted':
      return { problem: new Problem('malformed-body', 'The request was aborted before its body arrived'), expected: true };
    default:
      break;
  }
  const status = e?.status ?? e?.statusCode;
  if (status && status >= 400 && status < 500 && e.expose) {
    return { problem: new Problem('validation', e.message), expected: true };
  }
  return { problem: new Problem('internal', 'An unexpected error occurred; the request id identifies it in the log', { cause: err }), expected: false };
}

export function problemBody(problem: Problem, instance: string, requestId?: string): ProblemBody {
  return {
    ...problem.extensions,
    type: `/problems/${problem.type}`,
    title: problem.title,
    status: problem.status,
    detail: problem.message,
    instance,
    ...(requestId ? { requestId } : {}),
    ...(problem.errors ? { errors: problem.errors } : {}),
  };
}

/** The one error handler: answers application/problem+json and logs unexpected errors with their stack. */
export const problemDetails: ErrorRequestHandler = (err, req, res, _next) => {
  const { problem, expected } = toProblem(err);
  if (!expected) req.log?.error({ err }, 'unexpected error');
  if (res.headersSent) {
    // A streamed response failed half-way: nothing can be said any more, end the connection.
    res.destroy();
    return;
  }
  for (const [name, value] of Object.entries(problem.headers)) res.setHeader(name, value);
  res
    .status(problem.status)
    .type('application/problem+json')
    .send(JSON.stringify(problemBody(problem, req.originalUrl.split('?')[0] ?? req.originalUrl, req.id as string | undefined)));
};

/** 404 for every route nobody answered. */
export const notFoundHandler: RequestHandler = (req, _res, next) => {
  next(new Problem('not-found', `No route for ${req.method} ${req.path}`));
};

export const PROBLEM_TYPE_LIST = Object.entries(PROBLEM_TYPES).map(([type, v]) => ({ type: `/problems/${type}`, ...v }));
