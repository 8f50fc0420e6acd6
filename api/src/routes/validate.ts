import type { z } from 'zod';
import { invalid, type ProblemFieldError } from '../errors/problem.js';

export type RequestPart = 'body' | 'query' | 'params' | 'headers';

/** JSON Pointer (RFC 6901) from a zod issue path. */
export function toJsonPointer(path: readonly PropertyKey[]): string {
  return path.map((p) => '/' + String(p).replace(/~/g, '~0').replace(/\//g, '~1')).join('');
}

/** zod issues -> problem `errors[]`: a JSON Pointer for body fields, the parameter name otherwise. */
export function zodIssuesToFieldErrors(issues: readonly z.core.$ZodIssue[], part: RequestPart): ProblemFieldError[] {
  return issues.flatMap((issue) => {
    // An unknown key is reported at the key itself, so the pointer names the offending field.
    const paths = issue.code === 'unrecognized_keys' ? issue.keys.map((k) => [...issue.path, k]) : [issue.path];
    const detail = issue.code === 'unrecognized_keys' ? 'unknown field' : issue.message;
    return paths.map((path) =>
      part === 'body' ? { detail, pointer: toJsonPointer(path) } : { detail, parameter: String(path[0] ?? '') },
    );
  });
}

/** Parses one part of a request with its schema; a failure is a 400 validation problem naming each field. */
export function parseRequestPart<S extends z.ZodType>(schema: S, value: unknown, part: RequestPart): z.output<S> {
  const result = schema.safeParse(value);
  if (!result.success) throw invalid(zodIssuesToFieldErrors(result.error.issues, part));
  return result.data;
}
