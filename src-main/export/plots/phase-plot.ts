// Phase portrait: the trajectory (q, v) over level sets of H. The level sets are the contours
// of H sampled on a regular grid (marching squares with linear interpolation, d3-contour;
// Lorensen & Cline 1987 for the method). d3-contour places grid sample (i, j) at (i + 0.5, j + 0.5)
// in its output coordinates; they are mapped back to (q, v) here.
import { contours, line, scaleLinear } from 'd3';
import { axes, legend, plotClip } from './axes.ts';
import { COLORS } from './colors.ts';
import { decimateIndices } from './decimate.ts';
import { el, frameOf, px, svgDocument, uniqueId, type PlotOptions } from './svg.ts';

export interface PhasePlotOptions extends PlotOptions {
  energy: (q: number, v: number) => number;
  qRange: [number, number];
  vRange: [number, number];
  /** 'angle' labels q in rad, 'linear' in m. */
  coordinate: 'angle' | 'linear';
  /** Energy unit for the legend. */
  unit: string;
  trajectory?: { q: ArrayLike<number>; v: ArrayLike<number> };
  /** Levels drawn emphasised (targets, barrier energies). */
  levels?: readonly number[];
  /** Number of background levels; default 14. */
  count?: number;
  /** Grid resolution (q samples); default 160. */
  grid?: number;
}

export function phasePlot(o: PhasePlotOptions): string {
  if (typeof o.energy !== 'function') throw new TypeError('energy: expected a function H(q, v)');
  const [qa, qb] = o.qRange, [va, vb] = o.vRange;
  if (!(Number.isFinite(qa) && Number.isFinite(qb) && qb > qa)) throw new RangeError(`qRange: expected [min, max] with max > min, got [${qa}, ${qb}]`);
  if (!(Number.isFinite(va) && Number.isFinite(vb) && vb > va)) throw new RangeError(`vRange: expected [min, max] with max > min, got [${va}, ${vb}]`);
  const f = frameOf(o);
  const x = scaleLinear().domain([qa, qb]).range([f.margin.left, f.width - f.margin.right]);
  const y = scaleLinear().domain([va, vb]).range([f.height - f.margin.bottom, f.margin.top]);
  const nx = o.grid ?? 160;
  const ny = Math.max(20, Math.round(nx * (f.height - f.margin.top - f.margin.bottom) / (f.width - f.margin.left - f.margin.right)));
  const dq = (qb - qa) / (nx - 1), dv = (vb - va) / (ny - 1);
  const values = new Array<number>(nx * ny);
  let lo = Infinity, hi = -Infinity;
  for (let j = 0; j < ny; j++) for (let i = 0; i < nx; i++) {
    const h = o.energy(qa + i * dq, va + j * dv);
    values[j * nx + i] = h;
    if (Number.isFinite(h)) { if (h < lo) lo = h; if (h > hi) hi = h; }
  }
  if (!(hi > lo)) throw new RangeError('energy: H is constant or not finite over the plotted range');
  const gen = contours().size([nx, ny]);
  const background = scaleLinear().domain([lo, hi]).ticks(o.count ?? 14).filter((t) => t > lo && t < hi);
  const toPath = (rings: number[][][][]) => rings.map((poly) => poly.map((ring) => `M${ring.map(([gx, gy]) => `${px(x(qa + (gx - 0.5) * dq))},${px(y(va + (gy - 0.5) * dv))}`).join('L')}Z`).join('')).join('');
  const bgPaths = background.map((t) => el('path', { d: toPath(gen.contour(values, t).coordinates), fill: 'none', stroke: COLORS.sky, 'stroke-width': 0.8, 'stroke-opacity': 0.9 })).join('');
  const emph = (o.levels ?? []).filter((t) => t > lo && t < hi);
  const emPaths = emph.map((t) => el('path', { d: toPath(gen.contour(values, t).coordinates), fill: 'none', stroke: COLORS.vermillion, 'stroke-width': 1.8, 'stroke-dasharray': '6 3' })).join('');
  let traj = '';
  if (o.trajectory) {
    const { q, v } = o.trajectory;
    if (q.length !== v.length) throw new RangeError(`trajectory: q and v differ in length (${q.length}, ${v.length})`);
    const idx = decimateIndices(q, 2000);
    traj = el('path', { d: line<number>().x((i) => x(q[i])).y((i) => y(v[i]))(idx) ?? '', fill: 'none', stroke: COLORS.blue, 'stroke-width': 1.3 });
    if (q.length > 0) traj += el('circle', { cx: x(q[0]), cy: y(v[0]), r: 4, fill: COLORS.green, stroke: '#ffffff' });
  }
  const [defs, clip] = plotClip(f, uniqueId('clip-phase'));
  const qu = o.coordinate === 'angle' ? 'rad' : 'm';
  const body = defs + axes(x, y, f, `q (${qu})`, `v (${qu}/s)`)
    + `<g clip-path="${clip}">${bgPaths}${emPaths}${traj}</g>`
    + legend(f, [
      { label: `level sets of H (${o.unit})`, color: COLORS.sky },
      ...(emph.length > 0 ? [{ label: 'target / barrier levels', color: COLORS.vermillion, dash: '6 3' }] : []),
      ...(o.trajectory ? [{ label: 'trajectory (start: dot)', color: COLORS.blue }] : []),
    ]);
  return svgDocument(f, body, o.title, 'Phase portrait: trajectory over level sets of the energy.');
}
