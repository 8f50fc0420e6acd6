import { useId } from 'react';
import { Badge, type BadgeTone } from '../../../components/ui/badge';
import { SafetyCaution } from '../../../components/ui/safety-caution';
import { formatValue } from '../../../lib/format';
import type { HeadroomCheck, Verdict } from '../api/check';

export const verdictTone: Record<Verdict, BadgeTone> = {
  fine: 'fine',
  tight: 'tight',
  'dedicated-circuit-advised': 'dedicated',
  'over-the-limit': 'over',
};

const verdictStripe: Record<Verdict, string> = {
  fine: 'border-verdict-fine',
  tight: 'border-verdict-tight',
  'dedicated-circuit-advised': 'border-verdict-dedicated',
  'over-the-limit': 'border-verdict-over',
};

/** Text symbols as well as colours, so the verdict reads without colour vision. */
const verdictSymbol: Record<Verdict, string> = {
  fine: '✓',
  tight: '!',
  'dedicated-circuit-advised': '⚑',
  'over-the-limit': '✕',
};

type Citation = NonNullable<HeadroomCheck['reasons'][number]['citation']>;

export function citationText(c: Citation): string {
  return `${c.code} ${c.edition} ${c.section}`;
}

function CitationTag({ citation }: { citation: Citation | null }) {
  if (!citation) return null;
  return (
    <span className="inline-flex flex-wrap items-center gap-1 text-xs text-ink-500">
      <span className="font-medium text-ink-700">{citationText(citation)}</span>
      {citation.tag !== 'verified' ? <span className="italic">({citation.tag})</span> : null}
    </span>
  );
}

/** The verdict, its summary and the headroom left, each reason with the rule it rests on, and the cautions. */
export function VerdictPanel({ check, title = 'Headroom check' }: { check: HeadroomCheck; title?: string }) {
  const titleId = useId();
  return (
    <section
      aria-labelledby={titleId}
      data-testid="verdict"
      className={`space-y-4 rounded-xl border border-l-8 border-ink-100 bg-white p-5 shadow-sm ${verdictStripe[check.verdict]}`}
    >
      <div className="flex flex-wrap items-start justify-between gap-x-8 gap-y-3">
        <div className="min-w-0 flex-1 basis-96">
          <h2 id={titleId} className="text-sm font-medium uppercase tracking-wider text-ink-500">
            {title}
          </h2>
          <p className="mt-1 flex items-center gap-2 text-2xl font-semibold text-ink-950">
            <span aria-hidden>{verdictSymbol[check.verdict]}</span>
            <span data-testid="verdict-label">{check.verdictLabel}</span>
          </p>
          <p className="mt-1 max-w-3xl text-sm text-ink-800">{check.summary}</p>
        </div>
        <dl className="grid w-full max-w-xs shrink-0 grid-cols-[1fr_auto] gap-x-6 gap-y-1 rounded-lg bg-ink-50 px-4 py-3 text-sm">
          <dt className="whitespace-nowrap text-ink-500">Steady headroom</dt>
          <dd className={`text-right font-semibold ${check.headroomA < 0 ? 'text-verdict-over' : 'text-ink-900'}`}>
            {formatValue(check.headroomA, 'A', 1)}
          </dd>
          <dt className="whitespace-nowrap text-ink-500">Start-up headroom</dt>
          <dd className="text-right font-semibold text-ink-900">
            {check.startHeadroomA === null ? 'n/a (fuse)' : formatValue(check.startHeadroomA, 'A', 1)}
          </dd>
          <dt className="whitespace-nowrap text-ink-500">Running total</dt>
          <dd className="text-right text-ink-900">{formatValue(check.steady.runningTotalA, 'A', 1)}</dd>
        </dl>
      </div>
      <div>
        <h3 className="text-sm font-semibold text-ink-900">Reasons</h3>
        {check.reasons.length === 0 ? (
          <p className="text-sm text-ink-500">No rule is close to its limit.</p>
        ) : (
          <ol className="mt-2 space-y-2" aria-label="Reasons, worst first">
            {check.reasons.map((r, i) => (
              <li key={`${r.ruleId}-${i}`} className="flex gap-3 rounded-lg bg-ink-50 px-3 py-2">
                <Badge tone={verdictTone[r.verdict]}>{r.verdict.replaceAll('-', ' ')}</Badge>
                <div className="min-w-0 space-y-0.5">
                  <p className="text-sm text-ink-900">
                    {r.loadName ? <span className="font-medium">{r.loadName}: </span> : null}
                    {r.message}
                  </p>
                  <p className="flex flex-wrap gap-x-2">
                    <CitationTag citation={r.citation} />
                    <span className="text-xs text-ink-500">rule {r.ruleId}</span>
                  </p>
                </div>
              </li>
            ))}
          </ol>
        )}
      </div>
      {check.warnings.length ? (
        <div>
          <h3 className="text-sm font-semibold text-ink-900">Circuit warnings</h3>
          <ul className="mt-1 list-disc space-y-0.5 pl-5 text-sm text-ink-800">
            {check.warnings.map((w) => (
              <li key={w.ruleId}>
                {w.message} {w.citation ? <CitationTag citation={w.citation} /> : null}
              </li>
            ))}
          </ul>
        </div>
      ) : null}
      {check.assumptions.length ? (
        <details className="text-sm">
          <summary className="cursor-pointer font-semibold text-ink-900">
            Assumptions ({check.assumptions.length})
          </summary>
          <ul className="mt-1 list-disc space-y-0.5 pl-5 text-ink-800">
            {check.assumptions.map((a) => (
              <li key={a}>{a}</li>
            ))}
          </ul>
        </details>
      ) : null}
      <SafetyCaution compact items={check.cautions.map((c) => c.text)} />
    </section>
  );
}
