// Potential landscape V(q) = H(q, 0) (design.md §2, "Wells and hops"): wells are the local
// minima of V over the data's range (the whole circle for angles), barriers the maxima between
// neighbouring wells. Found on a grid, refined by golden-section search (Press et al.,
// "Numerical Recipes", 3rd ed., §10.2); wells numbered 1, 2, ... from the most negative q.
import type { Barrier, Landscape, Well } from './model.ts';

function golden(f: (x: number) => number, a: number, b: number): number {
  const g = (Math.sqrt(5) - 1) / 2;
  let c = b - g * (b - a), d = a + g * (b - a), fc = f(c), fd = f(d);
  for (let i = 0; i < 100 && b - a > 1e-12 * (1 + Math.abs(a) + Math.abs(b)); i++) {
    if (fc < fd) { b = d; d = c; fd = fc; c = b - g * (b - a); fc = f(c); }
    else { a = c; c = d; fc = fd; d = a + g * (b - a); fd = f(d); }
  }
  return fc < fd ? c : d;
}

/** Wells and barriers of V on [qMin, qMax] (periodic: [-pi, pi) with wrap-around). */
export function findLandscape(V: (q: number) => number, qMin: number, qMax: number, periodic: boolean, gridPoints = 2000): Landscape {
  if (!(qMax > qMin)) throw new RangeError(`findLandscape: need qMin < qMax, got [${qMin}, ${qMax}]`);
  const n = gridPoints;
  const h = (qMax - qMin) / (periodic ? n : n - 1);
  const x = (i: number) => qMin + i * h;
  const y = new Float64Array(n);
  for (let i = 0; i < n; i++) y[i] = V(x(i));
  const at = (i: number) => y[((i % n) + n) % n];
  const mins: number[] = [], maxs: number[] = [];
  const lo = periodic ? 0 : 1, hi = periodic ? n : n - 1;
  for (let i = lo; i < hi; i++) {
    if (at(i) < at(i - 1) && at(i) <= at(i + 1)) mins.push(i);
    if (at(i) > at(i - 1) && at(i) >= at(i + 1)) maxs.push(i);
  }
  const wrap = (q: number) => (periodic ? q - 2 * Math.PI * Math.floor((q + Math.PI) / (2 * Math.PI)) : q);
  const wells: Well[] = mins.map((i) => {
    const q = wrap(golden(V, x(i) - h, x(i) + h));
    return { index: 0, q, V: V(q) };
  });
  wells.sort((a, b) => a.q - b.q);
  wells.forEach((w, k) => { w.index = k + 1; });
  const barriers: Barrier[] = [];
  const pairs = periodic && wells.length >= 1 ? wells.length : wells.length - 1;
  for (let k = 0; k < pairs; k++) {
    const a = wells[k], b = wells[(k + 1) % wells.length];
    let lo2 = a.q, hi2 = b.q;
    if (hi2 <= lo2) hi2 += 2 * Math.PI;
    // Grid maximum between the two wells, then refine.
    let best = lo2, bestV = -Infinity;
    const m = 400;
    for (let s = 1; s < m; s++) {
      const q = lo2 + ((hi2 - lo2) * s) / m;
      const val = V(q);
      if (val > bestV) { bestV = val; best = q; }
    }
    const step = (hi2 - lo2) / m;
    const q = wrap(golden((z) => -V(z), best - step, best + step));
    barriers.push({ q, V: V(q), between: [a.index, b.index] });
  }
  return { qMin, qMax, periodic, wells, barriers };
}
