import { HeadroomApiError, type ProblemFieldError } from '@headroom/sdk';
import type { ReactNode } from 'react';

export function LoadingState({ label = 'Loading…' }: { label?: string }) {
  return (
    <div role="status" aria-live="polite" className="flex items-center gap-3 p-6 text-ink-500">
      <span className="h-4 w-4 animate-spin rounded-full border-2 border-ink-300 border-t-ink-700" aria-hidden />
      {label}
    </div>
  );
}

export function EmptyState({ title, children }: { title: string; children?: ReactNode }) {
  return (
    <div className="rounded-lg border border-dashed border-ink-300 bg-white p-8 text-center">
      <p className="font-medium text-ink-800">{title}</p>
      {children ? <div className="mt-2 text-sm text-ink-500">{children}</div> : null}
    </div>
  );
}

/** Where a field problem points: a CSV line and column, a body field, or a parameter. */
export function locateProblem(e: ProblemFieldError): string {
  if (e.line !== undefined) return e.column !== undefined ? `Line ${e.line}, column ${e.column}` : `Line ${e.line}`;
  if (e.pointer) return e.pointer.replace(/^\//, '').replaceAll('/', ' › ') || 'Body';
  if (e.parameter) return `Parameter ${e.parameter}`;
  return '';
}

/** The title, detail and every field problem (with line numbers for files) of a failed request. */
export function ErrorState({
  error,
  onRetry,
  title: titleOverride,
}: {
  error: unknown;
  onRetry?: () => void;
  title?: string;
}) {
  const problem = error instanceof HeadroomApiError ? error.problem : undefined;
  const message = problem ? problem.detail : error instanceof Error ? error.message : String(error);
  const title = titleOverride ?? problem?.title ?? 'Something went wrong';
  const fieldErrors = problem?.errors ?? [];
  return (
    <div role="alert" className="rounded-lg border border-verdict-over/40 bg-red-50 p-4 text-sm">
      <p className="font-semibold text-verdict-over">{title}</p>
      {message ? <p className="mt-1 text-ink-800">{message}</p> : null}
      {fieldErrors.length ? (
        <ul className="mt-2 max-h-48 list-disc space-y-0.5 overflow-auto pl-5 text-ink-800" aria-label="Problems">
          {fieldErrors.slice(0, 50).map((e, i) => {
            const where = locateProblem(e);
            return (
              <li key={i}>
                {where ? <span className="font-medium">{where}: </span> : null}
                {e.detail}
              </li>
            );
          })}
          {fieldErrors.length > 50 ? <li>… and {fieldErrors.length - 50} more</li> : null}
        </ul>
      ) : null}
      {problem?.requestId ? <p className="mt-2 text-xs text-ink-500">Request id {problem.requestId}</p> : null}
      {onRetry ? (
        <button
          type="button"
          onClick={onRetry}
          className="mt-3 rounded bg-ink-800 px-3 py-1.5 text-white hover:bg-ink-700"
        >
          Try again
        </button>
      ) : null}
    </div>
  );
}

/** The problem of one field, by its JSON pointer, for showing under the input. */
export function fieldError(error: unknown, pointer: string): string | undefined {
  if (!(error instanceof HeadroomApiError)) return undefined;
  return error.problem.errors?.find((e) => e.pointer === pointer)?.detail;
}
