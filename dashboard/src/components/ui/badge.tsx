import type { ReactNode } from 'react';

export type BadgeTone = 'neutral' | 'info' | 'fine' | 'tight' | 'dedicated' | 'over' | 'muted';

const tones: Record<BadgeTone, string> = {
  neutral: 'bg-ink-100 text-ink-900 ring-ink-300',
  info: 'bg-sky-50 text-sky-900 ring-sky-300',
  fine: 'bg-emerald-50 text-verdict-fine ring-emerald-300',
  tight: 'bg-amber-50 text-verdict-tight ring-amber-300',
  dedicated: 'bg-orange-50 text-verdict-dedicated ring-orange-300',
  over: 'bg-red-50 text-verdict-over ring-red-300',
  muted: 'bg-white text-ink-500 ring-ink-100',
};

export function Badge({ tone = 'neutral', children }: { tone?: BadgeTone; children: ReactNode }) {
  return (
    <span
      className={`inline-flex items-center rounded-full px-2 py-0.5 text-xs font-medium ring-1 ring-inset ${tones[tone]}`}
    >
      {children}
    </span>
  );
}
