/**
 * Chart.js set-up, imported only by chart components (which live on lazily loaded pages), so the
 * charting code never weighs on the first page load. Registers exactly the pieces we draw with, the
 * date-fns time adapter, zoom/pan and annotations, and a tiny plugin that marks when a chart with data
 * has been painted (browser tests and the bench wait for it).
 */
import {
  CategoryScale,
  Chart,
  Filler,
  Legend,
  LinearScale,
  LineController,
  LineElement,
  LogarithmicScale,
  PointElement,
  ScatterController,
  TimeScale,
  Tooltip,
  type ChartType,
  type Plugin,
} from 'chart.js';
import 'chartjs-adapter-date-fns';
import annotationPlugin from 'chartjs-plugin-annotation';
import zoomPlugin from 'chartjs-plugin-zoom';

declare module 'chart.js' {
  // eslint-disable-next-line @typescript-eslint/no-unused-vars -- the type parameter must match Chart.js's declaration
  interface PluginOptionsByType<TType extends ChartType> {
    /** `waiting: true` while the chart frame is drawn before its data has arrived (no mark yet). */
    headroomDrawnMarker?: { waiting?: boolean };
  }
}

/**
 * Sets `data-drawn="true"` and a performance mark on the canvas once a chart with points is painted;
 * never for a frame drawn while the data is still on its way.
 */
const drawnMarker: Plugin = {
  id: 'headroomDrawnMarker',
  afterRender(chart, _args, options: { waiting?: boolean }) {
    if (options.waiting) return;
    const hasPoints = chart.data.datasets.some((d) => d.data.length > 0);
    const canvas = chart.canvas;
    if (!hasPoints || canvas.dataset.drawn === 'true') return;
    canvas.dataset.drawn = 'true';
    const name = canvas.dataset.chartName;
    if (name && typeof performance !== 'undefined' && performance.mark) performance.mark(`chart-drawn:${name}`);
  },
};

Chart.register(
  CategoryScale,
  LinearScale,
  LogarithmicScale,
  TimeScale,
  LineController,
  ScatterController,
  LineElement,
  PointElement,
  Filler,
  Legend,
  Tooltip,
  annotationPlugin,
  zoomPlugin,
  drawnMarker,
);

Chart.defaults.font.family = "'Fira Sans', ui-sans-serif, system-ui, sans-serif";
Chart.defaults.color = '#1d4450';
Chart.defaults.borderColor = '#e3edf0';

/** The palette of our charts (the dashboard's ink and amber, plus verdict colours for limits). */
export const chartColours = {
  band: 'rgba(91, 135, 149, 0.28)',
  bandEdge: 'rgba(42, 90, 104, 0.55)',
  mean: '#14323b',
  inrush: '#b4531a',
  surge: '#7b4fb0',
  rating: '#b3261e',
  limit80: '#9a6a00',
  grid: '#e3edf0',
  tripBand: 'rgba(179, 38, 30, 0.16)',
  tripEdge: 'rgba(179, 38, 30, 0.7)',
  series: ['#1d4450', '#d99a22', '#1f7a4d', '#7b4fb0', '#b4531a', '#2f6fb0'],
} as const;

/** Time-axis tick formats: clock time, with milliseconds when zoomed in far. */
export const clockDisplayFormats = {
  millisecond: 'HH:mm:ss.SSS',
  second: 'HH:mm:ss',
  minute: 'HH:mm',
  hour: 'HH:mm',
  day: 'd MMM',
} as const;

export { Chart };
