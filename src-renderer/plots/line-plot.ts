// Line plot factory (d3 scales and axes into an SVG element): one or more series over a shared
// x axis, axis labels with units, an optional horizontal band and reference lines.
import * as d3 from 'd3';

export interface Series {
  x: ArrayLike<number>;
  y: ArrayLike<number>;
  label: string;
  color: string;
  dashed?: boolean;
}

export interface LinePlotOptions {
  width: number;
  height: number;
  xLabel: string;
  yLabel: string;
  series: Series[];
  band?: { lo: number; hi: number; label: string };
  hLines?: { y: number; label: string; color: string }[];
  vLines?: { x: number; label: string; color: string }[];
  /** Fixed x range (e.g. the zoom window); default: the data's extent. */
  xDomain?: [number, number];
  /**
   * Wheel to zoom and drag to pan along x; when a gesture ends, onWindow gets the visible range
   * (clamped to `full`) so the caller can fetch that window at full resolution and redraw.
   */
  zoom?: { full: [number, number]; onWindow: (x0: number, x1: number) => void };
}

function extent(series: Series[], pick: 'x' | 'y', extra: number[] = []): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (const s of series) {
    const a = s[pick];
    for (let i = 0; i < a.length; i++) {
      const v = a[i];
      if (v < lo) lo = v;
      if (v > hi) hi = v;
    }
  }
  for (const v of extra) {
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  if (!Number.isFinite(lo)) return [0, 1];
  if (lo === hi) return [lo - 1, hi + 1];
  return [lo, hi];
}

export function drawLinePlot(svgEl: SVGSVGElement, o: LinePlotOptions): void {
  const margin = { top: 12, right: 16, bottom: 40, left: 64 };
  const svg = d3.select(svgEl).attr('viewBox', `0 0 ${o.width} ${o.height}`).attr('width', o.width).attr('height', o.height);
  svg.selectAll('*').remove();
  const extraY = [...(o.band ? [o.band.lo, o.band.hi] : []), ...(o.hLines ?? []).map((h) => h.y)];
  const x = d3.scaleLinear().domain(o.xDomain ?? extent(o.series, 'x')).range([margin.left, o.width - margin.right]);
  const y = d3.scaleLinear().domain(extent(o.series, 'y', extraY)).nice().range([o.height - margin.bottom, margin.top]);
  const clipId = `clip-${Math.random().toString(36).slice(2)}`;
  svg.append('clipPath').attr('id', clipId).append('rect').attr('x', margin.left).attr('y', margin.top)
    .attr('width', o.width - margin.left - margin.right).attr('height', o.height - margin.top - margin.bottom);
  const g = svg.append('g');
  if (o.band) {
    g.append('rect').attr('x', margin.left).attr('width', o.width - margin.left - margin.right)
      .attr('y', y(o.band.hi)).attr('height', Math.max(1, y(o.band.lo) - y(o.band.hi)))
      .attr('fill', 'var(--accent-soft)').append('title').text(o.band.label);
  }
  const xAxis = g.append('g').attr('transform', `translate(0,${o.height - margin.bottom})`);
  xAxis.call(d3.axisBottom(x).ticks(8).tickFormat(d3.format('.4~g')));
  g.append('g').attr('transform', `translate(${margin.left},0)`).call(d3.axisLeft(y).ticks(6).tickFormat(d3.format('.3~g')));
  g.append('text').attr('x', (margin.left + o.width - margin.right) / 2).attr('y', o.height - 6).attr('text-anchor', 'middle').attr('fill', 'currentColor').text(o.xLabel);
  g.append('text').attr('transform', `translate(14,${(o.height - margin.bottom + margin.top) / 2}) rotate(-90)`).attr('text-anchor', 'middle').attr('fill', 'currentColor').text(o.yLabel);
  for (const h of o.hLines ?? []) {
    g.append('line').attr('x1', margin.left).attr('x2', o.width - margin.right).attr('y1', y(h.y)).attr('y2', y(h.y))
      .attr('stroke', h.color).attr('stroke-dasharray', '4 3').append('title').text(h.label);
  }
  for (const vl of o.vLines ?? []) {
    g.append('line').attr('y1', margin.top).attr('y2', o.height - margin.bottom).attr('x1', x(vl.x)).attr('x2', x(vl.x))
      .attr('stroke', vl.color).attr('stroke-dasharray', '2 3').append('title').text(vl.label);
  }
  const plotArea = g.append('g').attr('clip-path', `url(#${clipId})`);
  const paths = o.series.map((s) => {
    const idx = d3.range(s.x.length);
    const el = plotArea.append('path').attr('fill', 'none').attr('stroke', s.color).attr('stroke-width', 1.2)
      .attr('stroke-dasharray', s.dashed ? '5 3' : null).attr('data-series', s.label);
    const draw = (sx: d3.ScaleLinear<number, number>) => el.attr('d', d3.line<number>().x((i) => sx(s.x[i])).y((i) => y(s.y[i]))(idx) ?? '');
    draw(x);
    return draw;
  });
  if (o.zoom) {
    const { full, onWindow } = o.zoom;
    const span = full[1] - full[0];
    const behaviour = d3.zoom<SVGSVGElement, unknown>()
      .scaleExtent([Math.min(1, (x.domain()[1] - x.domain()[0]) / span), 1e6])
      .on('zoom', (ev: d3.D3ZoomEvent<SVGSVGElement, unknown>) => {
        const zx = ev.transform.rescaleX(x);
        xAxis.call(d3.axisBottom(zx).ticks(8).tickFormat(d3.format('.4~g')));
        for (const draw of paths) draw(zx);
      })
      .on('end', (ev: d3.D3ZoomEvent<SVGSVGElement, unknown>) => {
        if (ev.transform.k === 1 && ev.transform.x === 0) return;
        const [a, b] = ev.transform.rescaleX(x).domain();
        onWindow(Math.max(full[0], a), Math.min(full[1], b));
      });
    svg.call(behaviour).on('dblclick.zoom', () => onWindow(full[0], full[1]));
  }
  if (o.series.length > 1) {
    const legend = g.append('g').attr('transform', `translate(${margin.left + 8},${margin.top + 4})`);
    o.series.forEach((s, i) => {
      legend.append('line').attr('x1', 0).attr('x2', 18).attr('y1', i * 16 + 6).attr('y2', i * 16 + 6).attr('stroke', s.color).attr('stroke-width', 2);
      legend.append('text').attr('x', 24).attr('y', i * 16 + 10).attr('font-size', 11).attr('fill', 'currentColor').text(s.label);
    });
  }
}
