import { HeadroomApiError } from '@headroom/sdk';
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

export function ErrorState({ error, onRetry }: { error: unknown; onRetry?: () => void }) {
  const message = error instanceof HeadroomApiError ? error.problem.detail : error instanceof Error ? error.message : String(error);
  const title = error instanceof HeadroomApiError ? error.problem.title : 'Something went wrong';
  return (
    <div role="alert" className="rounded-lg border border-verdict-over/40 bg-red-50 p-4 text-sm">
      <p className="font-semibold text-verdict-over">{title}</p>
      <p className="mt-1 text-ink-800">{message}</p>
      {onRetry ? (
        <button type="button" onClick={onRetry} className="mt-3 rounded bg-ink-800 px-3 py-1.5 text-white hover:bg-ink-700">
          Try again
        </button>
      ) : null}
    </div>
  );
}
