import { useMemo } from 'react';
import { Scatter } from 'react-chartjs-2';
import type { ChartDataset, ChartOptions } from 'chart.js';
import type { AnnotationOptions } from 'chartjs-plugin-annotation';
import { chartColours } from '../../lib/charts';
import { formatDuration, formatValue } from '../../lib/format';

export interface TimeCurrentBand {
  currentA: number[];
  earliestS: (number | null)[];
  latestS: (number | null)[];
}

/** A measured or stacked event: how high the current went and for how long. */
export interface TimeCurrentPoint {
  label: string;
  currentA: number;
  durationS: number;
  kind: 'measured' | 'stacked';
}

/** 1, 10, 100…: the labelled lines of a log axis. */
const isDecade = (v: number) => Math.abs(Math.log10(v) - Math.round(Math.log10(v))) < 1e-9;
/** 1, 2, 5, 10, 20, 50…: enough labels on the current axis to read a multiple of the rating. */
const isDecadeStep = (v: number) => {
  const m = v / 10 ** Math.floor(Math.log10(v) + 1e-9);
  return [1, 2, 5].some((x) => Math.abs(m - x) < 1e-6);
};
/** Seconds on the time axis as engineers read them: 10 ms, 1 s, 100 s, 2.8 h. */
function timeTick(s: number): string {
  if (s < 1) return `${Math.round(s * 1000)} ms`;
  if (s < 1000) return `${s} s`;
  return `${(s / 3600).toLocaleString(undefined, { maximumFractionDigits: 1 })} h`;
}

/**
 * The time-current view engineers read breaker curves in: current on a logarithmic x axis, time to trip on
 * a logarithmic y axis, the device's band shaded between its fastest and slowest trip, and the events as
 * points. A point inside or right of the band may trip the device.
 */
export function TimeCurrentChart({
  name,
  band,
  points,
  ratingA,
  deviceLabel,
}: {
  name: string;
  band: TimeCurrentBand;
  points: TimeCurrentPoint[];
  ratingA: number;
  deviceLabel: string;
}) {
  const data = useMemo(() => {
    const edge = (values: (number | null)[]) => band.currentA.map((x, i) => ({ x, y: values[i] ?? null }));
    const datasets: ChartDataset<'scatter', { x: number; y: number | null }[]>[] = [
      {
        label: 'Fastest trip',
        data: edge(band.earliestS),
        showLine: true,
        pointRadius: 0,
        borderColor: chartColours.tripEdge,
        borderWidth: 1.25,
        fill: false,
      },
      {
        label: 'Slowest trip',
        data: edge(band.latestS),
        showLine: true,
        pointRadius: 0,
        borderColor: chartColours.tripEdge,
        borderWidth: 1.25,
        borderDash: [5, 3],
        backgroundColor: chartColours.tripBand,
        fill: '-1',
      },
      {
        label: 'Measured start-ups',
        data: points.filter((p) => p.kind === 'measured').map((p) => ({ x: p.currentA, y: p.durationS })),
        pointRadius: 5,
        pointStyle: 'circle',
        backgroundColor: chartColours.inrush,
        borderColor: '#fff',
      },
      {
        label: 'Stacked start-ups',
        data: points.filter((p) => p.kind === 'stacked').map((p) => ({ x: p.currentA, y: p.durationS })),
        pointRadius: 6,
        pointStyle: 'rectRot',
        backgroundColor: chartColours.series[0],
        borderColor: '#fff',
      },
    ];
    return { datasets };
  }, [band, points]);

  const options = useMemo<ChartOptions<'scatter'>>(() => {
    const labelled = [points.filter((p) => p.kind === 'measured'), points.filter((p) => p.kind === 'stacked')];
    const annotations: Record<string, AnnotationOptions> = {
      rating: {
        type: 'line',
        scaleID: 'x',
        value: ratingA,
        borderColor: chartColours.rating,
        borderWidth: 1,
        label: {
          display: true,
          content: `Rating ${ratingA} A`,
          position: 'end',
          backgroundColor: chartColours.rating,
          color: '#fff',
          font: { size: 10 },
        },
      },
    };
    const maxX = Math.max(
      band.currentA[band.currentA.length - 1] ?? ratingA * 40,
      ...points.map((p) => p.currentA * 1.5),
    );
    return {
      parsing: false,
      normalized: true,
      animation: false,
      responsive: true,
      maintainAspectRatio: false,
      scales: {
        x: {
          type: 'logarithmic',
          min: ratingA * 0.5,
          max: maxX,
          title: { display: true, text: 'Current (A, RMS)' },
          grid: { color: chartColours.grid },
          ticks: {
            autoSkip: false,
            maxRotation: 0,
            callback: (v) => (isDecadeStep(Number(v)) ? Number(v).toLocaleString() : ''),
          },
        },
        y: {
          type: 'logarithmic',
          min: 0.005,
          max: 20_000,
          title: { display: true, text: 'Time to trip' },
          grid: { color: chartColours.grid },
          ticks: { autoSkip: false, callback: (v) => (isDecade(Number(v)) ? timeTick(Number(v)) : '') },
        },
      },
      plugins: {
        legend: { position: 'bottom', labels: { boxWidth: 12, font: { size: 11 } } },
        annotation: { annotations },
        tooltip: {
          callbacks: {
            label: (item) => {
              if (item.datasetIndex >= 2) {
                const p = labelled[item.datasetIndex - 2]?.[item.dataIndex];
                return p ? `${p.label}: ${formatValue(p.currentA, 'A', 1)} for ${formatDuration(p.durationS)}` : '';
              }
              return `${item.dataset.label}: ${formatDuration(item.parsed.y)} at ${formatValue(item.parsed.x, 'A', 0)}`;
            },
          },
        },
      },
    };
  }, [band, points, ratingA]);

  return (
    <div className="relative h-80">
      <Scatter
        data={data}
        options={options}
        data-chart-name={name}
        role="img"
        aria-label={`Time-current chart: ${deviceLabel} trip band and ${points.length} start-ups`}
        fallbackContent={<p>Time-current chart of the device's trip band and the measured start-ups.</p>}
      />
    </div>
  );
}
