import { useMemo } from 'react';
import { Line } from 'react-chartjs-2';
import type { ChartDataset, ChartOptions } from 'chart.js';
import type { AnnotationOptions } from 'chartjs-plugin-annotation';
import { chartColours } from '../../lib/charts';
import { formatDuration, formatValue } from '../../lib/format';

/** One load's current over the seconds since its recording (or its assumed run) began. */
export interface StackedSeries {
  label: string;
  /** Seconds from the start, ascending. */
  t: number[];
  a: (number | null)[];
}

/**
 * The loads' currents piled on each other, each from its own start (t = 0 when its recording began), with
 * the circuit's rating and 80 % lines: what the conductor and the device carry if they all run together.
 */
export function StackedCurrentChart({
  name,
  series,
  ratingA,
  limitA,
}: {
  name: string;
  series: StackedSeries[];
  ratingA: number;
  limitA: number;
}) {
  const data = useMemo(() => {
    // A common time grid, so each stacked value adds the loads at the same moment.
    const grid = Array.from(new Set(series.flatMap((s) => s.t))).sort((a, b) => a - b);
    const datasets: ChartDataset<'line', { x: number; y: number | null }[]>[] = series.map((s, k) => {
      const colour = chartColours.series[k % chartColours.series.length]!;
      let j = 0;
      const points = grid.map((x) => {
        while (j + 1 < s.t.length && s.t[j + 1]! <= x) j++;
        const inside = x >= (s.t[0] ?? Infinity) && x <= (s.t[s.t.length - 1] ?? -Infinity);
        return { x, y: inside ? (s.a[j] ?? 0) : 0 };
      });
      return {
        label: s.label,
        data: points,
        borderColor: colour,
        backgroundColor: `${colour}66`,
        borderWidth: 1,
        pointRadius: 0,
        fill: k === 0 ? 'origin' : '-1',
        stepped: true,
      };
    });
    return { datasets };
  }, [series]);

  const options = useMemo<ChartOptions<'line'>>(() => {
    const line = (value: number, label: string, colour: string, dash: number[]): AnnotationOptions => ({
      type: 'line',
      scaleID: 'y',
      value,
      borderColor: colour,
      borderWidth: 1.5,
      borderDash: dash,
      label: {
        display: true,
        content: label,
        position: 'end',
        backgroundColor: colour,
        color: '#fff',
        font: { size: 10, weight: 'bold' },
      },
    });
    return {
      parsing: false,
      normalized: true,
      animation: false,
      responsive: true,
      maintainAspectRatio: false,
      interaction: { mode: 'index', intersect: false },
      scales: {
        x: {
          type: 'linear',
          min: 0,
          title: { display: true, text: 'Seconds from each load’s start' },
          grid: { color: chartColours.grid },
        },
        y: {
          stacked: true,
          min: 0,
          suggestedMax: ratingA * 1.1,
          title: { display: true, text: 'Current (A)' },
          grid: { color: chartColours.grid },
        },
      },
      plugins: {
        legend: { position: 'bottom', labels: { boxWidth: 12, font: { size: 11 } } },
        annotation: {
          annotations: {
            rating: line(ratingA, `Rating ${ratingA} A`, chartColours.rating, []),
            limit: line(limitA, `80 % ${formatValue(limitA, 'A', 0)}`, chartColours.limit80, [6, 4]),
          },
        },
        tooltip: {
          callbacks: {
            title: (items) => (items[0] ? formatDuration(items[0].parsed.x) : ''),
            label: (item) => `${item.dataset.label}: ${formatValue(item.parsed.y, 'A', 1)}`,
          },
        },
      },
    };
  }, [ratingA, limitA]);

  return (
    <div className="relative h-72">
      <Line
        data={data}
        options={options}
        data-chart-name={name}
        role="img"
        aria-label={`Stacked currents of ${series.length} loads against the rating`}
        fallbackContent={<p>Stacked currents of the loads on this circuit.</p>}
      />
    </div>
  );
}
