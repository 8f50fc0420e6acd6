import type { ReactNode } from 'react';

export interface Column {
  label: ReactNode;
  align?: 'left' | 'right';
  /** Heard by screen readers, not shown (e.g. an actions column). */
  hidden?: boolean;
}

/**
 * The frame every list table shares: a card, a caption for screen readers, and the header row. The rows
 * are the children.
 */
export function TableFrame({
  caption,
  columns,
  children,
  testId,
  scroll = false,
}: {
  caption: string;
  columns: Column[];
  children: ReactNode;
  testId?: string;
  scroll?: boolean;
}) {
  return (
    <div
      className={`${scroll ? 'max-h-96 overflow-auto' : 'overflow-x-auto'} rounded-xl border border-ink-100 bg-white shadow-sm`}
    >
      <table className="w-full text-left text-sm" data-testid={testId}>
        <caption className="sr-only">{caption}</caption>
        <thead className={`bg-ink-100 text-xs uppercase tracking-wider text-ink-700 ${scroll ? 'sticky top-0' : ''}`}>
          <tr>
            {columns.map((c, i) => (
              <th key={i} scope="col" className={`px-3 py-2 ${c.align === 'right' ? 'text-right' : ''}`}>
                {c.hidden ? <span className="sr-only">{c.label}</span> : c.label}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>{children}</tbody>
      </table>
    </div>
  );
}
