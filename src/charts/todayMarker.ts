// A chart.js plugin drawing a labelled, dashed vertical line at "today" on the x axis, shared by the
// cost burndown (a category axis: today's index) and the planner timeline (a linear axis of day numbers).
import { Chart as ChartJS, type Plugin } from 'chart.js';

/** What a chart passes in options.plugins.bayslateToday; a negative or missing value draws nothing. */
export interface TodayMarkerOptions {
  value: number;
  color: string;
  label: string;
}

export const todayMarker: Plugin = {
  id: 'bayslateToday',
  afterDatasetsDraw(c) {
    const o = (c.options.plugins as { bayslateToday?: TodayMarkerOptions }).bayslateToday;
    if (!o || !(o.value >= 0)) return;
    const x = c.scales.x.getPixelForValue(o.value);
    const { top, bottom, left, right } = c.chartArea;
    if (!(x >= left && x <= right)) return;
    const ctx = c.ctx;
    ctx.save();
    ctx.strokeStyle = o.color;
    ctx.fillStyle = o.color;
    ctx.lineWidth = 1.5;
    ctx.setLineDash([4, 3]);
    ctx.beginPath();
    ctx.moveTo(x, top);
    ctx.lineTo(x, bottom);
    ctx.stroke();
    ctx.setLineDash([]);
    ctx.font = `600 11px ${ChartJS.defaults.font.family}`;
    ctx.textAlign = x > (left + right) / 2 ? 'right' : 'left';
    ctx.fillText(o.label, x + (ctx.textAlign === 'right' ? -4 : 4), top + 12);
    ctx.restore();
  },
};
