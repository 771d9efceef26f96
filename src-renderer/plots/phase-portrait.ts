// Phase portrait factory: level sets of H(q, v) (d3.contours on a grid) under trajectories in the
// (q, v) plane, with wells (filled dots) and barriers (crosses) marked on the q axis.
import * as d3 from 'd3';

export interface PhasePortraitOptions {
  width: number;
  height: number;
  qLabel: string;
  vLabel: string;
  grid: { q: number[]; v: number[]; H: number[] };
  levels: number;
  trajectories: { q: ArrayLike<number>; v: ArrayLike<number>; label: string; color: string }[];
  wells?: { q: number; label: string }[];
  barriers?: { q: number; label: string }[];
  /** Highlight one level (e.g. the target energy). */
  highlightLevel?: { value: number; label: string };
}

export function drawPhasePortrait(svgEl: SVGSVGElement, o: PhasePortraitOptions): void {
  const margin = { top: 12, right: 16, bottom: 40, left: 64 };
  const svg = d3.select(svgEl).attr('viewBox', `0 0 ${o.width} ${o.height}`).attr('width', o.width).attr('height', o.height);
  svg.selectAll('*').remove();
  const nq = o.grid.q.length;
  const nv = o.grid.v.length;
  const x = d3.scaleLinear().domain([o.grid.q[0], o.grid.q[nq - 1]]).range([margin.left, o.width - margin.right]);
  const y = d3.scaleLinear().domain([o.grid.v[0], o.grid.v[nv - 1]]).range([o.height - margin.bottom, margin.top]);
  const [hMin, hMax] = d3.extent(o.grid.H) as [number, number];
  const thresholds = d3.range(1, o.levels + 1).map((k) => hMin + ((hMax - hMin) * k) / (o.levels + 1));
  const contours = d3.contours().size([nq, nv]).thresholds(thresholds)(o.grid.H);
  // Contour coordinates are in grid cells; map them into the plot.
  const gx = d3.scaleLinear().domain([0, nq - 1]).range([x(o.grid.q[0]), x(o.grid.q[nq - 1])]);
  const gy = d3.scaleLinear().domain([0, nv - 1]).range([y(o.grid.v[0]), y(o.grid.v[nv - 1])]);
  const projection = d3.geoTransform({ point(px, py) { this.stream.point(gx(px - 0.5), gy(py - 0.5)); } });
  const path = d3.geoPath(projection);
  const shade = d3.scaleLinear<string>().domain([hMin, hMax]).range(['#eef4f4', '#bcd6d8']);
  const clip = `clip-${Math.random().toString(36).slice(2)}`;
  svg.append('clipPath').attr('id', clip).append('rect').attr('x', margin.left).attr('y', margin.top)
    .attr('width', o.width - margin.left - margin.right).attr('height', o.height - margin.top - margin.bottom);
  const g = svg.append('g').attr('clip-path', `url(#${clip})`);
  // Below the lowest level set (the well bottoms) the background carries the lowest shade.
  g.append('rect').attr('x', margin.left).attr('y', margin.top).attr('width', o.width - margin.left - margin.right)
    .attr('height', o.height - margin.top - margin.bottom).attr('fill', shade(hMin));
  g.selectAll('path.level').data(contours).join('path').attr('class', 'level').attr('d', path)
    .attr('fill', (c) => shade(c.value)).attr('stroke', '#7fa9ad').attr('stroke-width', 0.6);
  if (o.highlightLevel) {
    const hl = d3.contours().size([nq, nv]).thresholds([o.highlightLevel.value])(o.grid.H);
    g.selectAll('path.target').data(hl).join('path').attr('class', 'target').attr('d', path).attr('fill', 'none')
      .attr('stroke', 'var(--c5)').attr('stroke-width', 2).attr('stroke-dasharray', '6 3').append('title').text(o.highlightLevel.label);
  }
  for (const tr of o.trajectories) {
    const idx = d3.range(tr.q.length);
    g.append('path').attr('d', d3.line<number>().x((i) => x(tr.q[i])).y((i) => y(tr.v[i]))(idx) ?? '')
      .attr('fill', 'none').attr('stroke', tr.color).attr('stroke-width', 1).attr('opacity', 0.85).attr('data-series', tr.label);
  }
  const axes = svg.append('g');
  axes.append('g').attr('transform', `translate(0,${o.height - margin.bottom})`).call(d3.axisBottom(x).ticks(8));
  axes.append('g').attr('transform', `translate(${margin.left},0)`).call(d3.axisLeft(y).ticks(6));
  axes.append('text').attr('x', (margin.left + o.width - margin.right) / 2).attr('y', o.height - 6).attr('text-anchor', 'middle').attr('fill', 'currentColor').text(o.qLabel);
  axes.append('text').attr('transform', `translate(14,${(o.height - margin.bottom + margin.top) / 2}) rotate(-90)`).attr('text-anchor', 'middle').attr('fill', 'currentColor').text(o.vLabel);
  const y0 = y(0);
  for (const w of o.wells ?? []) {
    axes.append('circle').attr('cx', x(w.q)).attr('cy', y0).attr('r', 5).attr('fill', 'var(--c3)').attr('stroke', 'white').append('title').text(w.label);
  }
  for (const b of o.barriers ?? []) {
    axes.append('path').attr('d', d3.symbol(d3.symbolCross, 70)()).attr('transform', `translate(${x(b.q)},${y0}) rotate(45)`).attr('fill', 'var(--c5)').append('title').text(b.label);
  }
}
