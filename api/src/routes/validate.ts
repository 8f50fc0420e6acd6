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

/**
 * Paths of the strings in a request value that hold U+0000. PostgreSQL cannot store it in text and
 * Sequelize's inlined SQLite literals end at it, so it is refused at the door. Iterative, and a path is
 * only spelled out for a hit: a hostile body may nest a hundred thousand levels deep.
 */
export function nulCharacterPaths(value: unknown): PropertyKey[][] {
  type Item = { value: unknown; key: PropertyKey; parent: Item | null };
  const pathOf = (item: Item | null): PropertyKey[] => {
    const path: PropertyKey[] = [];
    for (let i = item; i && i.parent; i = i.parent) path.push(i.key);
    return path.reverse();
  };
  const found: PropertyKey[][] = [];
  const stack: Item[] = [{ value, key: '', parent: null }];
  while (stack.length > 0 && found.length < 20) {
    const item = stack.pop()!;
    if (typeof item.value === 'string') {
      if (item.value.includes('\u0000')) found.push(pathOf(item));
    } else if (item.value && typeof item.value === 'object') {
      const isArray = Array.isArray(item.value);
      for (const [key, child] of Object.entries(item.value)) {
        const childItem: Item = { value: child, key: isArray ? Number(key) : key, parent: item };
        if (key.includes('\u0000')) found.push(pathOf(childItem));
        stack.push(childItem);
      }
    }
  }
  return found;
}

/** Parses one part of a request with its schema; a failure is a 400 validation problem naming each field. */
export function parseRequestPart<S extends z.ZodType>(schema: S, value: unknown, part: RequestPart): z.output<S> {
  const nul = nulCharacterPaths(value);
  if (nul.length > 0) {
    const detail = 'must not contain the NUL character (U+0000)';
    throw invalid(nul.map((path) => (part === 'body' ? { detail, pointer: toJsonPointer(path) } : { detail, parameter: String(path[0] ?? '') })));
  }
  const result = schema.safeParse(value);
  if (!result.success) throw invalid(zodIssuesToFieldErrors(result.error.issues, part));
  return result.data;
}
