import { HeadroomApiError, HeadroomConnectionError } from '../errors.js';
import { InputFileError } from './csv-source.js';

/** Where the CLI writes, and what it reads from its environment: the process's, or a test's. */
export interface CliIo {
  stdout: { write(text: string): unknown; isTTY?: boolean };
  stderr: { write(text: string): unknown; isTTY?: boolean };
  env: Record<string, string | undefined>;
}

/**
 * Exit codes (README "Command line"): 0 done; 1 the API refused the request (its message is printed);
 * 2 bad usage or a bad input file; 3 the API could not be reached; 130 interrupted (Ctrl-C).
 */
export const EXIT = { ok: 0, api: 1, usage: 2, connection: 3, interrupted: 130 } as const;

/** Thrown for wrong options the parser cannot see (say, `--new` without `--name`). */
export class UsageError extends Error {
  override readonly name = 'UsageError';
}

/** Prints an error the way a person or a script can act on it, and returns the exit code. */
export function reportError(io: CliIo, error: unknown, json: boolean): number {
  if (error instanceof HeadroomConnectionError) {
    io.stderr.write(`headroom: cannot reach the API: ${error.problem.detail}\n  (check HEADROOM_URL or --url)\n`);
    return EXIT.connection;
  }
  if (error instanceof HeadroomApiError) {
    if (json) io.stdout.write(`${JSON.stringify({ error: error.problem })}\n`);
    const lines = [`headroom: ${error.problem.title} (${error.status}): ${error.problem.detail}`];
    for (const e of error.fieldErrors) {
      const where = e.pointer ?? e.parameter ?? (e.line !== undefined ? `line ${e.line}${e.column !== undefined ? `, column ${e.column}` : ''}` : '');
      lines.push(`  ${where ? `${where}: ` : ''}${e.detail}`);
    }
    if (error.requestId) lines.push(`  request id: ${error.requestId}`);
    io.stderr.write(`${lines.join('\n')}\n`);
    return EXIT.api;
  }
  // RangeError: a value the CLI or the SDK refused before sending (an unreadable --utc-offset, say).
  if (error instanceof InputFileError || error instanceof UsageError || error instanceof RangeError) {
    io.stderr.write(`headroom: ${error.message}\n`);
    return EXIT.usage;
  }
  if (error instanceof Error && (error.name === 'AbortError' || error.name === 'InterruptedError')) {
    return EXIT.interrupted;
  }
  io.stderr.write(`headroom: ${error instanceof Error ? error.message : String(error)}\n`);
  return EXIT.api;
}

/** Epoch ms as an ISO 8601 UTC string; an em dash for none. */
export function isoTime(ms: number | null | undefined): string {
  return ms === null || ms === undefined ? '—' : new Date(ms).toISOString();
}

/** A number with at most `digits` decimals, no trailing zeros; an em dash for none. */
export function num(value: number | null | undefined, digits = 3): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  return String(Number(value.toFixed(digits)));
}

/** Plain aligned columns (no colours, so output can be piped). */
export function table(headers: string[], rows: string[][]): string {
  const widths = headers.map((h, i) => Math.max(h.length, ...rows.map((r) => (r[i] ?? '').length)));
  const line = (cells: string[]) => cells.map((c, i) => c.padEnd(widths[i] ?? 0)).join('  ').trimEnd();
  return [line(headers), ...rows.map(line)].join('\n') + '\n';
}

/** `label: value` lines with the labels aligned. */
export function keyValues(pairs: [string, string][]): string {
  const width = Math.max(...pairs.map(([k]) => k.length));
  return pairs.map(([k, v]) => `${k.padEnd(width)}  ${v}`).join('\n') + '\n';
}
