import { InfoTip } from '../../../components/ui/info-tip';
import { formatCount, formatDuration, formatValue } from '../../../lib/format';

/** The statistics the panel shows (names and units as the API gives them). */
export interface TraceFigures {
  count: number;
  durationS: number;
  minA: number;
  maxA: number;
  meanA: number;
  rmsA: number;
  timeWeightedMeanA: number | null;
  thermalEquivalentA: number | null;
  p95A: number | null;
  energyKWh: number | null;
  chargeAh: number;
  dutyCycle: number | null;
  voltageV: number | null;
  powerFactor: number;
  onThresholdA: number | null;
  quantileMethod: string;
}

interface Figure {
  label: string;
  value: string;
  definition: string;
}

function figuresOf(s: TraceFigures, kind: 'rms' | 'waveform'): Figure[] {
  if (kind === 'waveform') return waveformFigures(s);
  return [
    {
      label: 'Duration',
      value: formatDuration(s.durationS),
      definition: 'Time from the first to the last sample of the window.',
    },
    {
      label: 'Samples',
      value: formatCount(s.count),
      definition: 'Number of readings in the window (for waveform traces, instantaneous values).',
    },
    {
      label: 'Minimum',
      value: formatValue(s.minA, 'A'),
      definition: 'Lowest reading in the window, in amps after the probe scaling.',
    },
    {
      label: 'Maximum',
      value: formatValue(s.maxA, 'A'),
      definition: 'Highest reading in the window, in amps. For RMS loggers it is limited by the logging interval.',
    },
    {
      label: 'Mean',
      value: formatValue(s.timeWeightedMeanA ?? s.meanA, 'A'),
      definition:
        'Time-weighted average current: the integral of current over time divided by the time covered (gaps excluded).',
    },
    {
      label: 'Thermal-equivalent current',
      value: formatValue(s.thermalEquivalentA, 'A'),
      definition:
        'The steady current that would heat a conductor or a breaker’s thermal element as much: the time-weighted RMS of the readings.',
    },
    {
      label: '95th percentile',
      value: formatValue(s.p95A, 'A'),
      definition: `95 % of the readings are at or below this current. Method: ${s.quantileMethod}.`,
    },
    {
      label: 'Energy',
      value: s.energyKWh === null ? '–' : formatValue(s.energyKWh, 'kWh', 3),
      definition: `Charge × nominal voltage × power factor${s.voltageV ? ` (${s.voltageV} V, PF ${s.powerFactor})` : ''}; an estimate, as voltage was not measured. Charge ${formatValue(s.chargeAh, 'A·h', 3)}.`,
    },
    {
      label: 'Duty',
      value: s.dutyCycle === null ? '–' : formatValue(s.dutyCycle * 100, '%', 1),
      definition: `Share of the time the load was on${s.onThresholdA !== null ? ` (current above ${formatValue(s.onThresholdA, 'A')})` : ''}.`,
    },
  ];
}

/**
 * A waveform's samples are instantaneous values: their mean is the DC offset and their extremes are
 * peaks, so the panel names them so and leads with the RMS.
 */
function waveformFigures(s: TraceFigures): Figure[] {
  return [
    {
      label: 'Duration',
      value: formatDuration(s.durationS),
      definition: 'Time from the first to the last sample of the window.',
    },
    { label: 'Samples', value: formatCount(s.count), definition: 'Number of instantaneous values in the window.' },
    {
      label: 'RMS',
      value: formatValue(s.rmsA, 'A'),
      definition:
        'Root mean square of the instantaneous values over the window: the current a meter would show, and what heats the conductors.',
    },
    {
      label: 'Highest peak',
      value: formatValue(s.maxA, 'A'),
      definition: 'Highest instantaneous value, in amps (not an RMS value).',
    },
    {
      label: 'Lowest peak',
      value: formatValue(s.minA, 'A'),
      definition: 'Lowest (most negative) instantaneous value, in amps.',
    },
    {
      label: 'DC offset',
      value: formatValue(s.meanA, 'A'),
      definition:
        'Mean of the instantaneous values; near 0 A for a symmetric waveform. A start-up can show a decaying offset.',
    },
    {
      label: 'Energy',
      value: s.energyKWh === null ? '–' : formatValue(s.energyKWh, 'kWh', 4),
      definition: `RMS charge × nominal voltage × power factor${s.voltageV ? ` (${s.voltageV} V, PF ${s.powerFactor})` : ''}; an estimate, as voltage was not measured.`,
    },
  ];
}

/** The trace's (or the visible window's) figures, each with its unit and a definition on hover or focus. */
export function FiguresPanel({
  figures,
  windowed,
  kind,
}: {
  figures: TraceFigures;
  windowed: boolean;
  kind: 'rms' | 'waveform';
}) {
  return (
    <div>
      <p className="mb-2 text-xs text-ink-500">{windowed ? 'For the zoomed window' : 'For the whole trace'}</p>
      <dl
        className="grid grid-cols-2 gap-x-4 gap-y-3 sm:grid-cols-3 lg:grid-cols-1 xl:grid-cols-1"
        data-testid="figures"
      >
        {figuresOf(figures, kind).map((f) => (
          <div key={f.label} className="flex items-baseline justify-between gap-3 border-b border-ink-100 pb-1.5">
            <dt className="flex items-center gap-1.5 text-sm text-ink-700">
              {f.label}
              <InfoTip label={f.label}>{f.definition}</InfoTip>
            </dt>
            <dd className="whitespace-nowrap text-right font-semibold tabular-nums text-ink-950">{f.value}</dd>
          </div>
        ))}
      </dl>
    </div>
  );
}
