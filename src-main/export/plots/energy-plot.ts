// Energy against time: H(t) of a trial, the target H* of the active stage as a dashed step line,
// and the +-2 % band around it (the band of the settling metric, design.md §2 "Baselines").
import { area, line, scaleLinear } from 'd3';
import type { Trace } from '../../engine/trial/types.ts';
import { axes, legend, plotClip } from './axes.ts';
import { COLORS } from './colors.ts';
import { decimateIndices } from './decimate.ts';
import { el, frameOf, svgDocument, uniqueId, type PlotOptions } from './svg.ts';

export interface EnergyPlotOptions extends PlotOptions {
  /** H* per stage (index = stage - 1), or one number for all samples. */
  targets?: number | readonly number[];
  /** Energy unit, e.g. 'J' or 'J/kg'. */
  unit: string;
  /** Relative half-width of the band; default 0.02. */
  band?: number;
}

function extentOf(...arrays: ArrayLike<number>[]): [number, number] {
  let lo = Infinity, hi = -Infinity;
  for (const a of arrays) for (let i = 0; i < a.length; i++) { const x = a[i]; if (Number.isFinite(x)) { if (x < lo) lo = x; if (x > hi) hi = x; } }
  if (!(lo <= hi)) return [0, 1];
  if (lo === hi) return [lo - 1, hi + 1];
  return [lo, hi];
}

export { extentOf };

export function energyPlot(trace: Trace, o: EnergyPlotOptions): string {
  if (!trace || !trace.t || !trace.H) throw new TypeError('trace: expected a Trace with t and H');
  const n = trace.t.length;
  if (n < 2) throw new RangeError(`trace: expected at least 2 samples, got ${n}`);
  const f = frameOf(o);
  const band = o.band ?? 0.02;
  const targetAt = (i: number): number | undefined => {
    if (o.targets === undefined) return undefined;
    if (typeof o.targets === 'number') return o.targets;
    const s = trace.stage ? trace.stage[i] : 1;
    return o.targets[s - 1];
  };
  const tgt = new Float64Array(n);
  for (let i = 0; i < n; i++) tgt[i] = targetAt(i) ?? NaN;
  const lo = new Float64Array(n), hi = new Float64Array(n);
  for (let i = 0; i < n; i++) { const d = band * Math.abs(tgt[i]); lo[i] = tgt[i] - d; hi[i] = tgt[i] + d; }
  const [y0, y1] = extentOf(trace.H, lo, hi);
  const pad = 0.05 * (y1 - y0);
  const x = scaleLinear().domain([trace.t[0], trace.t[n - 1]]).range([f.margin.left, f.width - f.margin.right]);
  const y = scaleLinear().domain([y0 - pad, y1 + pad]).range([f.height - f.margin.bottom, f.margin.top]).nice();
  const idx = decimateIndices(trace.H);
  const hPath = line<number>().x((i) => x(trace.t[i])).y((i) => y(trace.H[i]))(idx) ?? '';
  const hasTarget = o.targets !== undefined;
  const all = Array.from({ length: n }, (_, i) => i);
  // Step line of the target: the target changes only at stage switches, so draw at every change.
  const keep = all.filter((i) => i === 0 || i === n - 1 || tgt[i] !== tgt[i - 1] || tgt[i + 1] !== tgt[i]);
  const defined = (i: number) => Number.isFinite(tgt[i]);
  const bandPath = hasTarget ? area<number>().defined(defined).x((i) => x(trace.t[i])).y0((i) => y(lo[i])).y1((i) => y(hi[i]))(keep) ?? '' : '';
  const tPath = hasTarget ? line<number>().defined(defined).x((i) => x(trace.t[i])).y((i) => y(tgt[i]))(keep) ?? '' : '';
  const [defs, clip] = plotClip(f, uniqueId('clip-energy'));
  const body = defs + axes(x, y, f, 't (s)', `H (${o.unit})`)
    + `<g clip-path="${clip}">`
    + (hasTarget ? el('path', { d: bandPath, fill: COLORS.orange, 'fill-opacity': 0.22, stroke: 'none' }) : '')
    + (hasTarget ? el('path', { d: tPath, fill: 'none', stroke: COLORS.vermillion, 'stroke-width': 1.5, 'stroke-dasharray': '6 4' }) : '')
    + el('path', { d: hPath, fill: 'none', stroke: COLORS.blue, 'stroke-width': 1.5 })
    + '</g>'
    + legend(f, [
      { label: 'H(t)', color: COLORS.blue },
      ...(hasTarget ? [{ label: 'target H*', color: COLORS.vermillion, dash: '6 4' }, { label: `H* \u00b1 ${Math.round(band * 100)} %`, color: COLORS.orange, fill: true }] : []),
    ]);
  return svgDocument(f, body, o.title, 'Energy of the trial against time, with the target and its band.');
}
