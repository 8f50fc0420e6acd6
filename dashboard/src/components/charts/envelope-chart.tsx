import { useEffect, useMemo, useRef } from 'react';
import { Line } from 'react-chartjs-2';
import type { ChartDataset, ChartOptions, Chart as ChartInstance } from 'chart.js';
import type { AnnotationOptions } from 'chartjs-plugin-annotation';
import { chartColours, clockDisplayFormats } from '../../lib/charts';
import { formatClockMs, formatValue, timeZoneLabel } from '../../lib/format';
import { Button } from '../ui/button';
import { LoadingState } from '../ui/states';
import { envelopePoints, stepWindow, type EnvelopeSeries, type TimeWindow, type XYPoint } from './envelope';

/** An inrush or surge drawn on the chart: a marker at its peak and a shaded span over its duration. */
export interface ChartEvent {
  id: string;
  kind: 'inrush' | 'surge';
  /** Epoch ms. */
  startMs: number;
  /** Epoch ms. */
  endMs: number;
  /** Epoch ms of the peak. */
  peakAtMs: number;
  peakA: number;
  label: string;
}

/** A horizontal limit line: the device rating, its 80 % continuous-load limit. */
export interface ChartLimit {
  id: string;
  label: string;
  valueA: number;
  tone: 'rating' | 'limit80';
}

export interface EnvelopeChartProps {
  /** Name used by the drawn marker (`chart-drawn:<name>`) and as the canvas label. */
  name: string;
  envelope: EnvelopeSeries;
  /** The whole trace, epoch ms: the zoom-out limit. */
  bounds: TimeWindow;
  /** The visible window; null shows the whole trace. */
  window: TimeWindow | null;
  onWindowChange: (window: TimeWindow | null) => void;
  events?: ChartEvent[];
  selectedEventId?: string | null;
  onEventSelect?: (eventId: string) => void;
  limits?: ChartLimit[];
  /** Instantaneous waveforms swing below zero; RMS traces start the axis at 0 A. */
  signed?: boolean;
  yLabel?: string;
  busy?: boolean;
  /**
   * The envelope is still on its way: the frame (axes, limits, events) is drawn already, so Chart.js has
   * set itself up by the time the data arrives; the drawn mark waits for the data.
   */
  waiting?: boolean;
  height?: number;
}

/** Debounce for zoom and pan gestures: one refetch when the wheel or drag settles, not one per frame. */
const WINDOW_SETTLE_MS = 200;

/**
 * The trace chart: the min/max envelope as a band with the mean on top, on a clock-time axis. Zoom and
 * pan (drag, shift-drag, ctrl+wheel, pinch, or the buttons) report the visible window so the page can
 * fetch a finer envelope for it. Events are marked; limits are drawn as horizontal lines.
 */
export function EnvelopeChart(props: EnvelopeChartProps) {
  const {
    envelope,
    bounds,
    window: win,
    onWindowChange,
    events = [],
    limits = [],
    selectedEventId,
    onEventSelect,
    signed = false,
    waiting = false,
  } = props;
  const settleTimer = useRef<ReturnType<typeof setTimeout> | undefined>(undefined);
  const onWindowChangeRef = useRef(onWindowChange);
  const onEventSelectRef = useRef(onEventSelect);
  useEffect(() => {
    onWindowChangeRef.current = onWindowChange;
    onEventSelectRef.current = onEventSelect;
  });
  useEffect(() => () => clearTimeout(settleTimer.current), []);

  const visible = win ?? bounds;
  const zone = useMemo(() => timeZoneLabel(new Date(bounds.from)), [bounds.from]);
  const points = useMemo(() => envelopePoints(envelope), [envelope]);

  const data = useMemo(() => {
    const eventPoints = events.map((e) => ({ x: e.peakAtMs, y: e.peakA }));
    const datasets: ChartDataset<'line', XYPoint[]>[] = [
      {
        label: 'Minimum',
        data: points.min,
        borderColor: chartColours.bandEdge,
        borderWidth: 0.75,
        pointRadius: 0,
        fill: false,
      },
      {
        label: 'Maximum',
        data: points.max,
        borderColor: chartColours.bandEdge,
        borderWidth: 0.75,
        pointRadius: 0,
        backgroundColor: chartColours.band,
        fill: '-1',
      },
      {
        label: 'Mean',
        data: points.mean,
        borderColor: chartColours.mean,
        borderWidth: 1.5,
        pointRadius: 0,
        fill: false,
      },
      {
        label: 'Events',
        data: eventPoints,
        showLine: false,
        pointStyle: 'triangle',
        pointRadius: events.map((e) => (e.id === selectedEventId ? 9 : 6)),
        pointHoverRadius: 9,
        pointBackgroundColor: events.map((e) => (e.kind === 'inrush' ? chartColours.inrush : chartColours.surge)),
        pointBorderColor: '#ffffff',
        pointBorderWidth: 1,
      },
    ];
    return { datasets };
  }, [points, events, selectedEventId]);

  const options = useMemo<ChartOptions<'line'>>(() => {
    const annotations: Record<string, AnnotationOptions> = {};
    for (const limit of limits) {
      const colour = limit.tone === 'rating' ? chartColours.rating : chartColours.limit80;
      annotations[limit.id] = {
        type: 'line',
        scaleID: 'y',
        value: limit.valueA,
        borderColor: colour,
        borderWidth: 1.5,
        borderDash: limit.tone === 'rating' ? [] : [6, 4],
        label: {
          display: true,
          content: limit.label,
          position: 'end',
          backgroundColor: colour,
          color: '#fff',
          font: { size: 11, weight: 'bold' },
          padding: 4,
        },
      };
    }
    for (const e of events) {
      const selected = e.id === selectedEventId;
      annotations[`event-${e.id}`] = {
        type: 'box',
        xMin: e.startMs,
        xMax: Math.max(e.endMs, e.startMs + 1),
        backgroundColor:
          e.kind === 'inrush'
            ? `rgba(180, 83, 26, ${selected ? 0.22 : 0.1})`
            : `rgba(123, 79, 176, ${selected ? 0.22 : 0.08})`,
        borderWidth: selected ? 1 : 0,
        borderColor: e.kind === 'inrush' ? chartColours.inrush : chartColours.surge,
        label: {
          display: e.kind === 'inrush',
          content: e.label,
          position: { x: 'start', y: 'start' },
          color: chartColours.inrush,
          font: { size: 10, weight: 'bold' },
        },
      };
    }
    const allMax = Math.max(0, ...limits.map((l) => l.valueA * 1.08), ...events.map((e) => e.peakA * 1.05));
    return {
      parsing: false,
      normalized: true,
      animation: false,
      responsive: true,
      maintainAspectRatio: false,
      spanGaps: false,
      interaction: { mode: 'nearest', axis: 'x', intersect: false },
      scales: {
        x: {
          type: 'time',
          min: visible.from,
          max: visible.to,
          time: { displayFormats: clockDisplayFormats, tooltipFormat: 'HH:mm:ss.SSS' },
          ticks: { maxRotation: 0, autoSkipPadding: 16 },
          title: { display: true, text: `Clock time — ${zone}` },
          grid: { color: chartColours.grid },
        },
        y: {
          ...(signed ? {} : { min: 0 }),
          suggestedMax: allMax || undefined,
          title: { display: true, text: props.yLabel ?? 'Current (A)' },
          grid: { color: chartColours.grid },
        },
      },
      plugins: {
        legend: { display: false },
        tooltip: {
          callbacks: {
            title: (items) => (items[0] ? formatClockMs(items[0].parsed.x ?? 0) : ''),
            label: (item) => {
              if (item.datasetIndex === 3) {
                const e = events[item.dataIndex];
                return e ? `${e.label}: peak ${formatValue(e.peakA, 'A')}` : '';
              }
              return `${item.dataset.label}: ${formatValue(item.parsed.y, 'A')}`;
            },
          },
        },
        annotation: { annotations },
        headroomDrawnMarker: { waiting },
        zoom: {
          limits: { x: { min: bounds.from, max: bounds.to, minRange: 20 } },
          pan: { enabled: true, mode: 'x', modifierKey: 'shift', onPanComplete: ({ chart }) => reportWindow(chart) },
          zoom: {
            mode: 'x',
            wheel: { enabled: true, modifierKey: 'ctrl' },
            pinch: { enabled: true },
            drag: {
              enabled: true,
              backgroundColor: 'rgba(242, 179, 61, 0.25)',
              borderColor: '#d99a22',
              borderWidth: 1,
              threshold: 6,
            },
            onZoomComplete: ({ chart }) => reportWindow(chart),
          },
        },
      },
      onClick: (_evt, elements) => {
        const hit = elements.find((el) => el.datasetIndex === 3);
        const e = hit ? events[hit.index] : undefined;
        if (e) onEventSelectRef.current?.(e.id);
      },
    };

    function reportWindow(chart: ChartInstance) {
      const { min, max } = chart.scales.x!;
      clearTimeout(settleTimer.current);
      settleTimer.current = setTimeout(
        () => onWindowChangeRef.current({ from: Math.round(min), to: Math.round(max) }),
        WINDOW_SETTLE_MS,
      );
    }
  }, [
    visible.from,
    visible.to,
    bounds.from,
    bounds.to,
    zone,
    limits,
    events,
    selectedEventId,
    signed,
    props.yLabel,
    waiting,
  ]);

  const step = (action: { zoom?: number; pan?: number }) => onWindowChange(stepWindow(visible, bounds, action));
  const zoomed = win !== null && (win.from > bounds.from || win.to < bounds.to);

  return (
    <div className="space-y-2">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <p className="text-xs text-ink-500" id={`${props.name}-help`}>
          Drag across the chart to zoom in · Shift-drag to pan · Ctrl + wheel to zoom · click a ▲ marker to select an
          event
        </p>
        <div className="flex items-center gap-1" role="toolbar" aria-label="Chart zoom">
          {props.busy && !waiting ? (
            <span role="status" className="mr-2 text-xs text-ink-500">
              Refining…
            </span>
          ) : null}
          <Button variant="secondary" className="px-2 py-1" onClick={() => step({ pan: -0.5 })} aria-label="Pan left">
            ←
          </Button>
          <Button variant="secondary" className="px-2 py-1" onClick={() => step({ zoom: 0.5 })} aria-label="Zoom in">
            +
          </Button>
          <Button variant="secondary" className="px-2 py-1" onClick={() => step({ zoom: 2 })} aria-label="Zoom out">
            −
          </Button>
          <Button variant="secondary" className="px-2 py-1" onClick={() => step({ pan: 0.5 })} aria-label="Pan right">
            →
          </Button>
          <Button variant="secondary" className="px-2 py-1" onClick={() => onWindowChange(null)} disabled={!zoomed}>
            Reset zoom
          </Button>
        </div>
      </div>
      <div className="relative" style={{ height: props.height ?? 360 }}>
        <Line
          data={data}
          options={options}
          data-chart-name={props.name}
          role="img"
          aria-label={`Current over time, ${formatClockMs(visible.from)} to ${formatClockMs(visible.to)} (${zone})`}
          aria-describedby={`${props.name}-help`}
          fallbackContent={
            <p>Chart of current over time. The figures and the event table below give the same information.</p>
          }
        />
        {waiting ? (
          <div className="absolute inset-0 flex items-center justify-center">
            <LoadingState label="Loading the chart…" />
          </div>
        ) : null}
      </div>
      <Legend hasEvents={events.length > 0} limits={limits} />
    </div>
  );
}

function Legend({ hasEvents, limits }: { hasEvents: boolean; limits: ChartLimit[] }) {
  return (
    <ul className="flex flex-wrap gap-x-5 gap-y-1 text-xs text-ink-700" aria-label="Chart legend">
      <li className="flex items-center gap-1.5">
        <span
          className="inline-block h-3 w-5 rounded-sm"
          style={{ background: chartColours.band, border: `1px solid ${chartColours.bandEdge}` }}
          aria-hidden
        />
        Min–max range
      </li>
      <li className="flex items-center gap-1.5">
        <span className="inline-block h-0.5 w-5" style={{ background: chartColours.mean }} aria-hidden />
        Mean
      </li>
      {hasEvents ? (
        <>
          <li className="flex items-center gap-1.5">
            <span style={{ color: chartColours.inrush }} aria-hidden>
              ▲
            </span>
            Inrush
          </li>
          <li className="flex items-center gap-1.5">
            <span style={{ color: chartColours.surge }} aria-hidden>
              ▲
            </span>
            Surge
          </li>
        </>
      ) : null}
      {limits.map((l) => (
        <li key={l.id} className="flex items-center gap-1.5">
          <span
            className="inline-block w-5 border-t-2"
            style={{
              borderColor: l.tone === 'rating' ? chartColours.rating : chartColours.limit80,
              borderStyle: l.tone === 'rating' ? 'solid' : 'dashed',
            }}
            aria-hidden
          />
          {l.label}
        </li>
      ))}
    </ul>
  );
}
