import { Badge, type BadgeTone } from '../../../components/ui/badge';
import { formatDuration, formatValue } from '../../../lib/format';
import type { HeadroomCheck } from '../api/check';

const outcomeTone: Record<string, BadgeTone> = { 'will-not-trip': 'fine', 'may-trip': 'tight', 'will-trip': 'over' };
const outcomeText: Record<string, string> = {
  'will-not-trip': 'will not trip',
  'may-trip': 'may trip',
  'will-trip': 'will trip',
};

const sourceText: Record<string, string> = {
  events: 'measured inrush',
  'start-profile': 'measured start profile',
  'motor-code-letter': 'NEC 430.7(B) code letter',
  'motor-six-times-flc': '6 × full-load current (rule of thumb)',
  'running-only': 'no start-up known',
};

/** Each load starting while the others run (worst-case alignment), against the instantaneous and thermal elements. */
export function StartUpsTable({ check }: { check: HeadroomCheck }) {
  if (check.startUps.length === 0) return <p className="text-sm text-ink-500">No loads to start.</p>;
  return (
    <div className="overflow-x-auto">
      <table className="w-full text-left text-sm">
        <caption className="sr-only">Start-up scenarios</caption>
        <thead className="text-xs uppercase tracking-wider text-ink-500">
          <tr>
            <th scope="col" className="py-1.5 pr-3">
              Starting load
            </th>
            <th scope="col" className="py-1.5 pr-3 text-right">
              Others running
            </th>
            <th scope="col" className="py-1.5 pr-3 text-right">
              Stacked peak
            </th>
            <th scope="col" className="py-1.5 pr-3">
              Instantaneous element
            </th>
            <th scope="col" className="py-1.5 pr-3">
              Thermal element
            </th>
            <th scope="col" className="py-1.5">
              Start-up from
            </th>
          </tr>
        </thead>
        <tbody>
          {check.startUps.map((s) => (
            <tr key={s.startingLoad} className="border-t border-ink-100">
              <td className="py-1.5 pr-3 font-medium text-ink-900">{s.startingLoad}</td>
              <td className="py-1.5 pr-3 text-right">{formatValue(s.othersRunningA, 'A', 1)}</td>
              <td className="py-1.5 pr-3 text-right">{formatValue(s.stackedPeakA, 'A', 1)}</td>
              <td className="py-1.5 pr-3">
                {s.instantaneous ? (
                  <span className="flex flex-wrap items-center gap-1">
                    <Badge tone={outcomeTone[s.instantaneous.outcome] ?? 'neutral'}>
                      {outcomeText[s.instantaneous.outcome]}
                    </Badge>
                    <span className="text-xs text-ink-500">
                      {formatValue(s.instantaneous.multipleOfRating, '× rating', 1)}; no-trip edge{' '}
                      {formatValue(s.instantaneous.noTripA, 'A', 0)}
                    </span>
                  </span>
                ) : (
                  <span className="text-xs text-ink-500">none (fuse)</span>
                )}
              </td>
              <td className="py-1.5 pr-3">
                <span className="flex flex-wrap items-center gap-1">
                  <Badge tone={outcomeTone[s.thermal.outcome] ?? 'neutral'}>{outcomeText[s.thermal.outcome]}</Badge>
                  {s.thermal.estimatedTripS !== null ? (
                    <span className="text-xs text-ink-500">in about {formatDuration(s.thermal.estimatedTripS)}</span>
                  ) : null}
                </span>
              </td>
              <td className="py-1.5 text-xs text-ink-700">{sourceText[s.startUpSource] ?? s.startUpSource}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
