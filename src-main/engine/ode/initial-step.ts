// Starting step size for an embedded Runge–Kutta pair: the algorithm of Hairer, Nørsett & Wanner,
// "Solving ODEs I", §II.4 ("Starting step size", steps (a)–(f)); the same as HINIT in their DOPRI5.
import type { Rhs } from '../types.ts';

/**
 * Returns a first step (signed by dir = ±1) for an error estimator of order `order` (local error
 * O(h^(order+1))). f0 = f(t0, y0) is given; one more evaluation of rhs is made (counted by the caller).
 * sc[i] = atol[i] + rtol[i] |y0[i]| are the error weights; work is a scratch vector of length n*2.
 */
export function initialStep(
  rhs: Rhs, t0: number, y0: Float64Array, f0: Float64Array, dir: number, order: number,
  rtol: Float64Array, atol: Float64Array, hMax: number, work: Float64Array,
): number {
  const n = y0.length;
  let d0 = 0, d1 = 0;
  for (let i = 0; i < n; i++) {
    const sc = atol[i] + rtol[i] * Math.abs(y0[i]);
    d0 += (y0[i] / sc) ** 2;
    d1 += (f0[i] / sc) ** 2;
  }
  d0 = Math.sqrt(d0 / n);
  d1 = Math.sqrt(d1 / n);
  // (a)-(b): first guess from the sizes of y0 and f0.
  let h0 = d0 < 1e-5 || d1 < 1e-5 ? 1e-6 : 0.01 * (d0 / d1);
  h0 = Math.min(h0, hMax);
  // (c)-(d): one explicit Euler step, and an estimate of the second derivative.
  const y1 = work.subarray(0, n), f1 = work.subarray(n, 2 * n);
  for (let i = 0; i < n; i++) y1[i] = y0[i] + dir * h0 * f0[i];
  rhs(t0 + dir * h0, y1, f1);
  let d2 = 0;
  for (let i = 0; i < n; i++) {
    const sc = atol[i] + rtol[i] * Math.abs(y0[i]);
    d2 += ((f1[i] - f0[i]) / sc) ** 2;
  }
  d2 = Math.sqrt(d2 / n) / h0;
  // (e): h1 from h1^(p+1) max(d1, d2) = 0.01.
  const big = Math.max(d1, d2);
  const h1 = big <= 1e-15 ? Math.max(1e-6, h0 * 1e-3) : (0.01 / big) ** (1 / (order + 1));
  // (f)
  const h = Math.min(100 * h0, h1, hMax);
  return Number.isFinite(h) ? dir * h : dir * Math.min(1e-6, hMax);
}
