import { useId, type ReactNode } from 'react';

/**
 * A small "i" that shows a definition on hover or keyboard focus (not only on hover, so keyboard and
 * touch users get it too); screen readers read it as the description of the button.
 */
export function InfoTip({ label, children }: { label: string; children: ReactNode }) {
  const id = useId();
  return (
    <span className="group relative inline-flex align-middle">
      <button
        type="button"
        aria-label={`About ${label}`}
        aria-describedby={id}
        className="inline-flex h-4 w-4 items-center justify-center rounded-full border border-ink-300 text-[10px] font-semibold leading-none text-ink-700 hover:bg-ink-100"
      >
        i
      </button>
      <span
        role="tooltip"
        id={id}
        className="pointer-events-none absolute bottom-full left-0 z-20 mb-2 hidden w-64 rounded-md bg-ink-950 px-3 py-2 text-xs font-normal normal-case leading-snug tracking-normal text-ink-50 shadow-lg group-focus-within:block group-hover:block"
      >
        {children}
      </span>
    </span>
  );
}
