// The potential landscape V(q) = H(q, 0) (design.md §2 "Wells and hops") with its wells (minima)
// and barriers (maxima between them) marked, and optional target levels.
import { line, scaleLinear } from 'd3';
import { axes, legend, plotClip } from './axes.ts';
import { COLORS } from './colors.ts';
import { el, escapeXml, frameOf, px, svgDocument, uniqueId, type PlotOptions } from './svg.ts';

export interface LandscapePlotOptions extends PlotOptions {
  V: (q: number) => number;
  qRange: [number, number];
  coordinate: 'angle' | 'linear';
  unit: string;
  wells?: readonly { index: number; q: number; energy: number }[];
  barriers?: readonly { q: number; energy: number }[];
  targets?: readonly { label: string; energy: number }[];
  samples?: number;
}

export function landscapePlot(o: LandscapePlotOptions): string {
  if (typeof o.V !== 'function') throw new TypeError('V: expected a function V(q)');
  const [qa, qb] = o.qRange;
  if (!(Number.isFinite(qa) && Number.isFinite(qb) && qb > qa)) throw new RangeError(`qRange: expected [min, max] with max > min, got [${qa}, ${qb}]`);
  const f = frameOf(o);
  const n = o.samples ?? 400;
  const qs = Array.from({ length: n }, (_, i) => qa + ((qb - qa) * i) / (n - 1));
  const vs = qs.map(o.V);
  const ys = [...vs, ...(o.targets ?? []).map((t) => t.energy), ...(o.wells ?? []).map((w) => w.energy), ...(o.barriers ?? []).map((b) => b.energy)].filter(Number.isFinite);
  let lo = Math.min(...ys), hi = Math.max(...ys);
  if (!(hi > lo)) { lo -= 1; hi += 1; }
  const pad = 0.08 * (hi - lo);
  const x = scaleLinear().domain([qa, qb]).range([f.margin.left, f.width - f.margin.right]);
  const y = scaleLinear().domain([lo - pad, hi + pad]).range([f.height - f.margin.bottom, f.margin.top]).nice();
  const path = line<number>().defined((i) => Number.isFinite(vs[i])).x((i) => x(qs[i])).y((i) => y(vs[i]))(qs.map((_, i) => i)) ?? '';
  const [defs, clip] = plotClip(f, uniqueId('clip-landscape'));
  const marks: string[] = [];
  for (const t of o.targets ?? []) {
    marks.push(el('line', { x1: f.margin.left, x2: f.width - f.margin.right, y1: y(t.energy), y2: y(t.energy), stroke: COLORS.orange, 'stroke-width': 1.5, 'stroke-dasharray': '6 4' }));
    marks.push(el('text', { x: f.margin.left + 6, y: y(t.energy) - 5, fill: COLORS.ink, 'font-size': 11 }, escapeXml(t.label)));
  }
  for (const w of o.wells ?? []) {
    marks.push(el('circle', { cx: x(w.q), cy: y(w.energy), r: 5, fill: COLORS.green, stroke: '#ffffff' }));
    const X = x(w.q);
    const anchor = X - f.margin.left < 30 ? 'start' : f.width - f.margin.right - X < 30 ? 'end' : 'middle';
    marks.push(el('text', { x: X, y: y(w.energy) + 18, 'text-anchor': anchor, fill: COLORS.ink, 'font-size': 11 }, escapeXml(`well ${w.index}`)));
  }
  for (const b of o.barriers ?? []) {
    const X = x(b.q), Y = y(b.energy);
    marks.push(el('path', { d: `M${px(X)},${px(Y - 7)}L${px(X + 6)},${px(Y + 4)}L${px(X - 6)},${px(Y + 4)}Z`, fill: COLORS.vermillion, stroke: '#ffffff' }));
    // Labels of marks at the ends of the range are anchored inward so they stay inside the plot.
    const anchor = X - f.margin.left < 30 ? 'start' : f.width - f.margin.right - X < 30 ? 'end' : 'middle';
    marks.push(el('text', { x: X, y: Y - 11, 'text-anchor': anchor, fill: COLORS.ink, 'font-size': 11 }, 'barrier'));
  }
  const qu = o.coordinate === 'angle' ? 'rad' : 'm';
  const body = defs + axes(x, y, f, `q (${qu})`, `V(q) = H(q, 0) (${o.unit})`)
    + `<g clip-path="${clip}">${el('path', { d: path, fill: 'none', stroke: COLORS.blue, 'stroke-width': 1.8 })}${marks.join('')}</g>`
    + legend(f, [
      { label: 'V(q)', color: COLORS.blue },
      ...((o.wells ?? []).length ? [{ label: 'wells (dots), barriers (triangles)', color: COLORS.green }] : []),
      ...((o.targets ?? []).length ? [{ label: 'targets', color: COLORS.orange, dash: '6 4' }] : []),
    ]);
  return svgDocument(f, body, o.title, 'Potential landscape V(q) with wells and barriers.');
}
