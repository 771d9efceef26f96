// Histogram factory (d3.bin into an SVG element): counts of a sample over equal-width bins, axis
// labels with units, and an optional count of the values left out (e.g. runs that never settled).
import * as d3 from 'd3';

export interface HistogramOptions {
  width: number;
  height: number;
  xLabel: string;
  values: number[];
  color: string;
  bins?: number;
  /** Shown in the corner, e.g. "2 runs never entered the band". */
  note?: string;
}

export function drawHistogram(svgEl: SVGSVGElement, o: HistogramOptions): void {
  const margin = { top: 14, right: 16, bottom: 40, left: 52 };
  const svg = d3.select(svgEl).attr('viewBox', `0 0 ${o.width} ${o.height}`).attr('width', o.width).attr('height', o.height);
  svg.selectAll('*').remove();
  const vals = o.values.filter((x) => Number.isFinite(x));
  let [lo, hi] = d3.extent(vals) as [number | undefined, number | undefined];
  if (lo === undefined || hi === undefined) { lo = 0; hi = 1; }
  if (lo === hi) { lo -= 0.5; hi += 0.5; }
  const x = d3.scaleLinear().domain([lo, hi]).nice().range([margin.left, o.width - margin.right]);
  const bins = d3.bin().domain(x.domain() as [number, number]).thresholds(x.ticks(o.bins ?? 12))(vals);
  const top = Math.max(1, d3.max(bins, (b) => b.length) ?? 1);
  const y = d3.scaleLinear().domain([0, top]).nice().range([o.height - margin.bottom, margin.top]);
  const g = svg.append('g');
  g.selectAll('rect.bin').data(bins).join('rect').attr('class', 'bin')
    .attr('x', (b) => x(b.x0!) + 1).attr('width', (b) => Math.max(1, x(b.x1!) - x(b.x0!) - 2))
    .attr('y', (b) => y(b.length)).attr('height', (b) => y(0) - y(b.length)).attr('fill', o.color)
    .append('title').text((b) => `${b.length} in [${d3.format('.4~g')(b.x0!)}, ${d3.format('.4~g')(b.x1!)})`);
  g.append('g').attr('transform', `translate(0,${o.height - margin.bottom})`).call(d3.axisBottom(x).ticks(6).tickFormat(d3.format('.4~g')));
  g.append('g').attr('transform', `translate(${margin.left},0)`).call(d3.axisLeft(y).ticks(Math.min(4, top)).tickFormat(d3.format('d'))); // whole counts only
  g.append('text').attr('x', (margin.left + o.width - margin.right) / 2).attr('y', o.height - 6).attr('text-anchor', 'middle').attr('fill', 'currentColor').text(o.xLabel);
  g.append('text').attr('transform', `translate(14,${(o.height - margin.bottom + margin.top) / 2}) rotate(-90)`).attr('text-anchor', 'middle').attr('fill', 'currentColor').text('runs');
  if (o.note) g.append('text').attr('x', o.width - margin.right).attr('y', margin.top + 4).attr('text-anchor', 'end').attr('font-size', 11).attr('fill', 'currentColor').text(o.note);
}
