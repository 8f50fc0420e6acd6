/** Problems of posted sample bodies, with the locators RFC 9457 `errors[]` entries carry. */
import { Problem, type ProblemFieldError } from '../errors/problem.js';

/** Most individual errors listed in one problem; the detail gives the total. */
export const MAX_LISTED_ERRORS = 20;

/** A body that cannot be parsed at all (bad JSON, a broken CSV row…), at a line and column. */
export function malformedAt(detail: string, line: number, column?: number): Problem {
  return new Problem('malformed-body', `The body could not be parsed at line ${line}${column ? `, column ${column}` : ''}: ${detail}. Nothing was stored.`, {
    errors: [{ detail, line, ...(column ? { column } : {}) }],
  });
}

/** Values that parse but are not acceptable (NaN, empty, not increasing…); nothing is stored. */
export function invalidSamples(errors: ProblemFieldError[], total = errors.length): Problem {
  const listed = errors.slice(0, MAX_LISTED_ERRORS);
  const more = total > listed.length ? ` (the first ${listed.length} are listed)` : '';
  return new Problem('validation', `${total} problem${total === 1 ? '' : 's'} in the samples${more}; nothing was stored`, { errors: listed });
}

/** A bad query or header parameter of a sample upload. */
export function badParameter(parameter: string, detail: string): Problem {
  return new Problem('validation', `${parameter}: ${detail}`, { errors: [{ detail, parameter }] });
}
