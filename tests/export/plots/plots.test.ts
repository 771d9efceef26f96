// Plot factories: SVG well-formedness (checkXml), the expected elements, coordinates against the
// scales computed by hand, hostile text escaped, and PNG rendering (signature and size).
import { describe, expect, it } from 'vitest';
import { energyPlot, inputPlot, landscapePlot, phasePlot, svgToPng, decimateIndices } from '../../../src-main/export/plots/index.ts';
import type { Trace } from '../../../src-main/engine/trial/types.ts';
import { checkXml } from './xml.ts';
import { duffingH } from '../fixtures.ts';

function traceOf(n: number): Trace {
  const t = new Float64Array(n), q = new Float64Array(n), v = new Float64Array(n), u = new Float64Array(n), H = new Float64Array(n), stage = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    t[i] = i * 0.01; q[i] = Math.cos(t[i]); v[i] = -Math.sin(t[i]);
    u[i] = 0.5 * Math.sin(3 * t[i]); H[i] = 0.5 * (1 - Math.exp(-t[i])); stage[i] = t[i] < 5 ? 1 : 2;
  }
  return { t, q, v, u, H, stage };
}

function ok(svg: string): Map<string, number> {
  const r = checkXml(svg);
  if (!r.ok) throw new Error(r.error);
  return r.counts;
}

describe('plots', () => {
  const tr = traceOf(1000);

  it('energy plot: well-formed SVG with the H line, the target step line and the band', () => {
    const svg = energyPlot(tr, { targets: [0.3, 0.45], unit: 'J', title: 'E <&> "x"' });
    const c = ok(svg);
    expect(c.get('svg')).toBe(1);
    expect(c.get('path')).toBe(3); // band, target, H
    expect(svg).toContain('H (J)');
    expect(svg).toContain('t (s)');
    expect(svg).toContain('E &lt;&amp;&gt; &quot;x&quot;');
    // The x axis runs from t = 0 at the left margin (76 px) to t = 9.99 s at width - 24 px (hand-computed frame).
    expect(svg).toMatch(/<path d="M76,[\d.]+L/);
  });

  it('input plot: u as steps and both limits', () => {
    const svg = inputPlot(tr, { unit: 'N m', uMax: 0.6 });
    const c = ok(svg);
    expect(svg).toContain('u (N m)');
    // Two dashed limit lines at +-0.6 plus the legend's dashed sample: 3 dashed lines.
    expect((svg.match(/<line[^>]*stroke-dasharray="6 4"/g) ?? []).length).toBe(3);
    expect(c.get('path')).toBe(1);
  });

  it('phase portrait: level sets of H pass through points where H equals the level', () => {
    const levels = [-0.2, 0];
    const svg = phasePlot({ energy: duffingH, qRange: [-1.6, 1.6], vRange: [-1, 1], coordinate: 'linear', unit: 'J/kg', trajectory: tr, levels, width: 600, height: 400 });
    const c = ok(svg);
    expect(c.get('path')!).toBeGreaterThan(8);
    expect(svg).toContain('q (m)');
    expect(svg).toContain('v (m/s)');
    // Map the vertices of the emphasised H = -0.2 contour back to (q, v): H there must be -0.2 to grid accuracy
    // (linear interpolation on a 160-point grid; references.md Duffing double well for H).
    const m = /<path d="([^"]+)" fill="none" stroke="#d55e00"/.exec(svg)!;
    const pts = [...m[1].matchAll(/([\d.]+),([\d.]+)/g)].map((p) => [Number(p[1]), Number(p[2])]);
    expect(pts.length).toBeGreaterThan(50);
    const left = 76, right = 600 - 24, top = 16, bottom = 400 - 52;
    let worst = 0;
    // d3-contour closes the region H >= level along the grid border, half a cell outside the clipped
    // plot area: those vertices are not on the level set and are skipped.
    for (const [X, Y] of pts) {
      if (X < left || X > right || Y < top || Y > bottom) continue;
      const q = -1.6 + ((X - left) / (right - left)) * 3.2, v = 1 - ((Y - top) / (bottom - top)) * 2;
      worst = Math.max(worst, Math.abs(duffingH(q, v) - -0.2));
    }
    expect(worst).toBeLessThan(2e-3);
  });

  it('landscape: V(q) with a marker per well and barrier, and escaped labels', () => {
    const svg = landscapePlot({
      V: (q) => duffingH(q, 0), qRange: [-1.6, 1.6], coordinate: 'linear', unit: 'J/kg',
      wells: [{ index: 1, q: -1, energy: -0.25 }, { index: 2, q: 1, energy: -0.25 }], barriers: [{ q: 0, energy: 0 }],
      targets: [{ label: '<script>x</script>', energy: 0.1 }],
    });
    const c = ok(svg);
    expect(c.get('circle')).toBe(2);
    expect(svg).toContain('well 1');
    expect(svg).toContain('barrier');
    expect(svg).not.toContain('<script>');
    expect(svg).toContain('&lt;script&gt;');
  });

  it('renders PNG: signature, and the size of the frame times the scale', () => {
    const png = svgToPng(energyPlot(tr, { targets: 0.5, unit: 'J', width: 400, height: 300 }), 2);
    // PNG signature and IHDR (PNG spec, ISO/IEC 15948 §5.2, §11.2.2).
    expect(Array.from(png.subarray(0, 8))).toEqual([137, 80, 78, 71, 13, 10, 26, 10]);
    expect(png.toString('latin1', 12, 16)).toBe('IHDR');
    expect(png.readUInt32BE(16)).toBe(800);
    expect(png.readUInt32BE(20)).toBe(600);
  });

  it('decimation keeps the extremes of every bucket', () => {
    const y = Float64Array.from({ length: 100_000 }, (_, i) => Math.sin(i / 50) + (i === 51_234 ? 5 : 0));
    const idx = decimateIndices(y, 1000);
    expect(idx.length).toBeLessThanOrEqual(3001);
    expect(idx).toContain(51_234);
    expect(idx[0]).toBe(0);
    expect(idx[idx.length - 1]).toBe(99_999);
  });

  it('refuses bad arguments, naming them', () => {
    expect(() => energyPlot({ ...tr, t: new Float64Array(1), H: new Float64Array(1) }, { unit: 'J' })).toThrow(/trace: expected at least 2 samples/);
    expect(() => phasePlot({ energy: duffingH, qRange: [1, 1], vRange: [-1, 1], coordinate: 'linear', unit: 'J' })).toThrow(/qRange/);
    expect(() => energyPlot(tr, { unit: 'J', width: 10 })).toThrow(/width/);
  });
});
