import type { ReactNode } from 'react';

/** The title row of a page: heading, a line of context, and the page's actions on the right. */
export function PageHeader({
  title,
  titleId,
  subtitle,
  actions,
  back,
}: {
  title: ReactNode;
  titleId: string;
  subtitle?: ReactNode;
  actions?: ReactNode;
  back?: ReactNode;
}) {
  return (
    <div className="space-y-2">
      {back}
      <div className="flex flex-wrap items-end justify-between gap-4">
        <div className="min-w-0">
          <h1 id={titleId} className="truncate text-2xl font-semibold text-ink-900">
            {title}
          </h1>
          {subtitle ? <div className="mt-0.5 text-sm text-ink-500">{subtitle}</div> : null}
        </div>
        {actions ? <div className="flex flex-wrap gap-2">{actions}</div> : null}
      </div>
    </div>
  );
}

/** A white card with an optional heading. */
export function Panel({
  title,
  titleId,
  actions,
  children,
  className = '',
}: {
  title?: ReactNode;
  titleId?: string;
  actions?: ReactNode;
  children: ReactNode;
  className?: string;
}) {
  return (
    <section
      aria-labelledby={titleId}
      className={`rounded-xl border border-ink-100 bg-white p-4 shadow-sm ${className}`}
    >
      {title ? (
        <div className="mb-3 flex flex-wrap items-center justify-between gap-2">
          <h2 id={titleId} className="text-base font-semibold text-ink-900">
            {title}
          </h2>
          {actions ? <div className="flex flex-wrap gap-2">{actions}</div> : null}
        </div>
      ) : null}
      {children}
    </section>
  );
}
