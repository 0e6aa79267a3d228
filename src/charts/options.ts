// The one place Chart.js options are made for Bayslate's charts (overview, report, sales): Poppins,
// the theme's text and grid colours, the panel's colour behind the chart (so a PNG export is not
// transparent), no animation, and money ticks written as dollars. A chart passes only what is its
// own (axis titles, stacking, tooltips, clicks); `chartOptions` merges that over the base.
import type { ChartOptions, ChartType, Plugin } from 'chart.js';
import { chartFont, formatDollarsTick, type ChartColors } from '@/theme';

/** An axis in the theme's colours; `title` names it, `dollars` writes its ticks as whole dollars. */
export interface AxisSpec {
  title?: string;
  dollars?: boolean;
  [option: string]: unknown;
}

type Plain = Record<string, unknown>;
const isPlain = (v: unknown): v is Plain =>
  typeof v === 'object' && v !== null && !Array.isArray(v) && Object.getPrototypeOf(v) === Object.prototype;

/** Deep merge of plain objects; arrays, functions and other values from `over` replace. */
export function mergeOptions<T extends Plain>(base: T, over: Plain): T {
  const out: Plain = { ...base };
  for (const [k, v] of Object.entries(over))
    out[k] = isPlain(v) && isPlain(out[k]) ? mergeOptions(out[k] as Plain, v) : v;
  return out as T;
}

export const dollarsTick = (v: string | number) => formatDollarsTick(v);

/** One axis: ticks, grid and title in the theme's colours and type. */
export function axis(colors: ChartColors, spec: AxisSpec = {}): Plain {
  const { title, dollars, ...own } = spec;
  const font = { family: chartFont };
  const base: Plain = {
    ticks: { color: colors.text, font, ...(dollars ? { callback: dollarsTick } : {}) },
    grid: { color: colors.grid },
    title: { color: colors.text, font, display: !!title, text: title ?? '' },
  };
  return mergeOptions(base, own);
}

/**
 * Options for a chart in the theme: the base (responsive, no animation, Poppins, legend and
 * tooltip type, the panel background) with the chart's own `scales` (as `AxisSpec`s) and the rest
 * of its options merged over it.
 */
export function chartOptions<T extends ChartType>(
  colors: ChartColors,
  own?: Omit<ChartOptions<T>, 'scales'> & { scales?: Record<string, AxisSpec> },
): ChartOptions<T> {
  const { scales = {}, ...rest } = (own ?? {}) as { scales?: Record<string, AxisSpec> } & Plain;
  const font = { family: chartFont };
  const base: Plain = {
    responsive: true,
    maintainAspectRatio: false,
    animation: false,
    scales: Object.fromEntries(Object.entries(scales).map(([id, spec]) => [id, axis(colors, spec)])),
    plugins: {
      bayslateBackground: { color: colors.panel },
      legend: { labels: { color: colors.text, font } },
      tooltip: { titleFont: font, bodyFont: font },
    },
  };
  return mergeOptions(base, rest) as ChartOptions<T>;
}

/** Fills the chart with the panel's colour (options.plugins.bayslateBackground.color) before it draws. */
export const panelBackground: Plugin = {
  id: 'bayslatePanelBackground',
  beforeDraw(chart) {
    const fill = (chart.options.plugins as { bayslateBackground?: { color?: string } } | undefined)?.bayslateBackground
      ?.color;
    if (!fill) return;
    const { ctx, width, height } = chart;
    ctx.save();
    ctx.globalCompositeOperation = 'destination-over';
    ctx.fillStyle = fill;
    ctx.fillRect(0, 0, width, height);
    ctx.restore();
  },
};
