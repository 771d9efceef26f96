// Input gain and physical scale from forced runs (design.md §2, "Scale, offset, sign"): along a
// forced trajectory of v' = f + g u, dH/dt = lambda H + (dH/dv) g u, so over a lag tau
//   H(t+tau) - H(t) - lambda * int H dt = g * int (dH/dv) u dt,
// a regression through the origin for g (least squares; trapezoid rule for the integrals).
// With H normalised to unit mass (v^2 coefficient 1/2), g = 1/m and H * m is in joules.

export interface ForcedSample { q: Float64Array; v: Float64Array; u: Float64Array }
export interface ForcedFit { gain: number; r2: number; pairs: number }

export function fitInputGain(runs: ForcedSample[], H: (q: number, v: number) => number, grad: (q: number, v: number, out: Float64Array) => void, lambda: number, dt: number, lag: number, skip = 0): ForcedFit {
  let sxy = 0, sxx = 0, sy = 0, syy = 0, n = 0;
  const gr = new Float64Array(2);
  const fits: { x: number; y: number }[] = [];
  for (const r of runs) {
    const m = r.q.length;
    const h = new Float64Array(m), w = new Float64Array(m);
    for (let i = 0; i < m; i++) { h[i] = H(r.q[i], r.v[i]); grad(r.q[i], r.v[i], gr); w[i] = gr[1] * r.u[i]; }
    // Cumulative trapezoid integrals of H and of (dH/dv) u.
    const ih = new Float64Array(m), iw = new Float64Array(m);
    for (let i = 1; i < m; i++) { ih[i] = ih[i - 1] + 0.5 * dt * (h[i] + h[i - 1]); iw[i] = iw[i - 1] + 0.5 * dt * (w[i] + w[i - 1]); }
    for (let i = skip; i + lag < m - skip; i++) {
      const y = h[i + lag] - h[i] - lambda * (ih[i + lag] - ih[i]);
      const x = iw[i + lag] - iw[i];
      fits.push({ x, y });
    }
  }
  for (const { x, y } of fits) { sxy += x * y; sxx += x * x; sy += y; syy += y * y; n++; }
  if (n < 2 || !(sxx > 0)) return { gain: NaN, r2: NaN, pairs: n };
  const g = sxy / sxx;
  let sse = 0;
  for (const { x, y } of fits) sse += (y - g * x) ** 2;
  const sst = syy - (sy * sy) / n;
  return { gain: g, r2: sst > 0 ? 1 - sse / sst : NaN, pairs: n };
}
