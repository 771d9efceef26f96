// Axes for the plots: light grid lines at the scales' ticks, tick labels from the scales' own
// tick formats (d3-scale), and axis titles carrying the units.
import type { ScaleLinear } from 'd3';
import { COLORS } from './colors.ts';
import { el, escapeXml, type Frame } from './svg.ts';

export function axes(x: ScaleLinear<number, number>, y: ScaleLinear<number, number>, f: Frame, xLabel: string, yLabel: string): string {
  const m = f.margin;
  const x0 = m.left, x1 = f.width - m.right, y0 = f.height - m.bottom, y1 = m.top;
  const parts: string[] = [];
  const xt = x.ticks(Math.max(2, Math.round((x1 - x0) / 90)));
  const yt = y.ticks(Math.max(2, Math.round((y0 - y1) / 50)));
  const xf = x.tickFormat(xt.length), yf = y.tickFormat(yt.length);
  for (const t of xt) {
    const X = x(t);
    parts.push(el('line', { x1: X, x2: X, y1: y1, y2: y0, stroke: COLORS.rule, 'stroke-width': 1 }));
    parts.push(el('text', { x: X, y: y0 + 18, 'text-anchor': 'middle', fill: COLORS.inkSoft }, escapeXml(xf(t))));
  }
  for (const t of yt) {
    const Y = y(t);
    parts.push(el('line', { x1: x0, x2: x1, y1: Y, y2: Y, stroke: COLORS.rule, 'stroke-width': 1 }));
    parts.push(el('text', { x: x0 - 8, y: Y + 4, 'text-anchor': 'end', fill: COLORS.inkSoft }, escapeXml(yf(t))));
  }
  parts.push(el('rect', { x: x0, y: y1, width: x1 - x0, height: y0 - y1, fill: 'none', stroke: COLORS.inkSoft, 'stroke-width': 1 }));
  parts.push(el('text', { x: (x0 + x1) / 2, y: f.height - 12, 'text-anchor': 'middle', fill: COLORS.ink }, escapeXml(xLabel)));
  parts.push(el('text', { x: 0, y: 0, transform: `translate(18 ${(y0 + y1) / 2}) rotate(-90)`, 'text-anchor': 'middle', fill: COLORS.ink }, escapeXml(yLabel)));
  return parts.join('');
}

/** A clip path for the plot area; returns [defs, clip-path attribute value]. */
export function plotClip(f: Frame, id: string): [string, string] {
  const m = f.margin;
  const defs = `<defs><clipPath id="${id}">${el('rect', { x: m.left, y: m.top, width: f.width - m.left - m.right, height: f.height - m.top - m.bottom })}</clipPath></defs>`;
  return [defs, `url(#${id})`];
}

/** A small legend in the top-right corner of the plot area. */
export function legend(f: Frame, items: { label: string; color: string; dash?: string; fill?: boolean }[]): string {
  const x1 = f.width - f.margin.right - 8;
  const w = Math.max(...items.map((i) => i.label.length)) * 7 + 40;
  const parts: string[] = [el('rect', { x: x1 - w, y: f.margin.top + 6, width: w, height: items.length * 18 + 8, fill: '#ffffff', 'fill-opacity': 0.85, stroke: COLORS.rule })];
  items.forEach((it, i) => {
    const y = f.margin.top + 20 + i * 18;
    parts.push(it.fill
      ? el('rect', { x: x1 - w + 8, y: y - 6, width: 22, height: 10, fill: it.color, 'fill-opacity': 0.25 })
      : el('line', { x1: x1 - w + 8, x2: x1 - w + 30, y1: y - 1, y2: y - 1, stroke: it.color, 'stroke-width': 2, 'stroke-dasharray': it.dash }));
    parts.push(el('text', { x: x1 - w + 36, y: y + 3, fill: COLORS.ink }, escapeXml(it.label)));
  });
  return parts.join('');
}
