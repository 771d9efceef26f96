// Input against time: u(t) of a trial with the saturation limits +-uMax as dashed lines.
import { curveStepAfter, line, scaleLinear } from 'd3';
import type { Trace } from '../../engine/trial/types.ts';
import { axes, legend, plotClip } from './axes.ts';
import { COLORS } from './colors.ts';
import { decimateIndices } from './decimate.ts';
import { extentOf } from './energy-plot.ts';
import { el, frameOf, svgDocument, uniqueId, type PlotOptions } from './svg.ts';

export interface InputPlotOptions extends PlotOptions {
  /** |u| <= uMax, drawn when given (null or undefined: no limit). */
  uMax?: number | null;
  /** Input unit, e.g. 'N m', 'N' or '' (model units). */
  unit: string;
}

export function inputPlot(trace: Trace, o: InputPlotOptions): string {
  if (!trace || !trace.t || !trace.u) throw new TypeError('trace: expected a Trace with t and u');
  const n = trace.t.length;
  if (n < 2) throw new RangeError(`trace: expected at least 2 samples, got ${n}`);
  const f = frameOf(o);
  const lim = o.uMax !== undefined && o.uMax !== null && Number.isFinite(o.uMax) ? Math.abs(o.uMax) : null;
  const [a, b] = extentOf(trace.u, lim !== null ? [-lim, lim] : []);
  const pad = 0.08 * (b - a);
  const x = scaleLinear().domain([trace.t[0], trace.t[n - 1]]).range([f.margin.left, f.width - f.margin.right]);
  const y = scaleLinear().domain([a - pad, b + pad]).range([f.height - f.margin.bottom, f.margin.top]).nice();
  const idx = decimateIndices(trace.u);
  // u is held over each sample (zero-order hold): draw it as steps.
  const uPath = line<number>().curve(curveStepAfter).x((i) => x(trace.t[i])).y((i) => y(trace.u[i]))(idx) ?? '';
  const [defs, clip] = plotClip(f, uniqueId('clip-input'));
  const unit = o.unit ? ` (${o.unit})` : ' (model units)';
  let limits = '';
  if (lim !== null) {
    for (const s of [lim, -lim]) limits += el('line', { x1: f.margin.left, x2: f.width - f.margin.right, y1: y(s), y2: y(s), stroke: COLORS.vermillion, 'stroke-width': 1.5, 'stroke-dasharray': '6 4' });
  }
  const body = defs + axes(x, y, f, 't (s)', `u${unit}`)
    + `<g clip-path="${clip}">${limits}${el('path', { d: uPath, fill: 'none', stroke: COLORS.blue, 'stroke-width': 1.2 })}</g>`
    + legend(f, [{ label: 'u(t)', color: COLORS.blue }, ...(lim !== null ? [{ label: '\u00b1 u max', color: COLORS.vermillion, dash: '6 4' }] : [])]);
  return svgDocument(f, body, o.title, 'Input of the trial against time, with its limits.');
}
