// The one chart-options helper: the theme's type and colours on every axis and legend, the panel
// colour behind the chart, dollar ticks where asked, and a chart's own options merged over the base.
import { describe, it, expect } from 'vitest';
import { chartOptions, mergeOptions } from '../../src/charts/options';
import { chartColors, chartFont } from '../../src/theme';

describe('chartOptions', () => {
  it('gives every chart Poppins, the theme colours, the panel background and no animation', () => {
    const c = chartColors(true);
    const o = chartOptions<'bar'>(c, { scales: { x: {}, y: { title: 'Hours' } } }) as Record<string, any>;
    expect(o.animation).toBe(false);
    expect(o.responsive).toBe(true);
    expect(o.plugins.bayslateBackground.color).toBe(c.panel);
    expect(o.plugins.legend.labels).toEqual({ color: c.text, font: { family: chartFont } });
    expect(o.scales.x.ticks.color).toBe(c.text);
    expect(o.scales.x.grid.color).toBe(c.grid);
    expect(o.scales.x.title.display).toBe(false);
    expect(o.scales.y.title).toEqual({ color: c.text, font: { family: chartFont }, display: true, text: 'Hours' });
    expect(chartFont.startsWith("'Poppins'")).toBe(true);
  });

  it('writes money ticks as whole dollars with a true minus sign', () => {
    const o = chartOptions<'line'>(chartColors(false), { scales: { y: { dollars: true } } }) as Record<string, any>;
    expect(o.scales.y.ticks.callback(-10000)).toBe('−$10,000');
    expect(o.scales.y.ticks.callback(2500.4)).toBe('$2,500');
  });

  it('merges a chart’s own options over the base without losing the base', () => {
    const tooltipLabel = () => 'x';
    const o = chartOptions<'bar'>(chartColors(false), {
      scales: { x: { stacked: true, ticks: { autoSkip: false } } },
      plugins: { legend: { labels: { usePointStyle: false } }, tooltip: { callbacks: { label: tooltipLabel } } },
    }) as Record<string, any>;
    expect(o.scales.x.stacked).toBe(true);
    expect(o.scales.x.ticks).toMatchObject({ autoSkip: false, color: chartColors(false).text });
    expect(o.plugins.legend.labels).toMatchObject({ usePointStyle: false, color: chartColors(false).text });
    expect(o.plugins.tooltip.callbacks.label).toBe(tooltipLabel);
    expect(o.plugins.bayslateBackground.color).toBe('#ffffff');
  });

  it('mergeOptions replaces arrays and leaves its inputs alone', () => {
    const base = { a: { b: [1, 2], c: 1 } };
    expect(mergeOptions(base, { a: { b: [3] } })).toEqual({ a: { b: [3], c: 1 } });
    expect(base).toEqual({ a: { b: [1, 2], c: 1 } });
  });
});
