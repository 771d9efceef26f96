// Integral (weak, lagged) form of the Koopman eigenfunction problem for a conserved energy:
// minimise xi' (D'D) xi subject to xi' C xi = 1, D the rows theta(x(t+tau)) - exp(lambda tau)
// theta(x(t)) pooled over the lags, C the covariance of theta over the data (design.md §2,
// "Learning H"); the minimiser is the smallest generalized eigenpair of (D'D, C)
// (Golub & Van Loan §8.7). The eigenvalue mu = mean squared lagged residual / variance is the
// relative non-conservation. A shift w = theta(x*) (x* the equilibrium) makes the eigenfunction
// vanish at x*, as any eigenfunction with lambda != 0 must.
import type { GramSet } from './gram.ts';
import { generalizedEigen, type GenEigResult } from './geneig.ts';

export interface WeakMatrices {
  /** Pooled lagged residual Gram divided by the number of lagged pairs (p x p). */
  A: Float64Array;
  /** Covariance of the terms over the data (p x p). */
  C: Float64Array;
  p: number;
}

/**
 * D(lambda)'D(lambda)/count and C from a Gram set; `active` selects a subset of the terms (in order).
 * Algebra: with d0 = theta_{i+L} - theta_i, b~ = theta_i - w, eps = 1 - exp(lambda tau),
 * the residual row is d0 + eps b~, so D'D = D0 + eps (E - D0 - sD w' - w sD') + eps^2 B~'B~,
 * E = Flast - Ffirst, sD = sumLast - sumFirst, B~'B~ = G - Flast - sB w' - w sB' + count w w'.
 */
export function weakMatrices(g: GramSet, dt: number, lambda: number, shift: Float64Array | null, active?: number[]): WeakMatrices {
  const P = g.p;
  const idx = active ?? Array.from({ length: P }, (_, i) => i);
  const p = idx.length;
  const A = new Float64Array(p * p);
  const C = new Float64Array(p * p);
  const n = g.n;
  let count = 0;
  for (const lg of g.lags) count += lg.count;
  if (n < 2 || count === 0) throw new RangeError('weakMatrices: no lagged pairs in the data (segments shorter than the lags)');
  for (const lg of g.lags) {
    if (lg.count === 0) continue;
    const eps = -Math.expm1(lambda * lg.lag * dt);
    for (let a = 0; a < p; a++) {
      const i = idx[a];
      const wi = shift ? shift[i] : 0;
      const sDi = lg.sumLast[i] - lg.sumFirst[i];
      const sBi = g.sum[i] - lg.sumLast[i];
      for (let b = a; b < p; b++) {
        const j = idx[b];
        const wj = shift ? shift[j] : 0;
        const sDj = lg.sumLast[j] - lg.sumFirst[j];
        const sBj = g.sum[j] - lg.sumLast[j];
        const ij = i * P + j;
        const D0 = lg.D0[ij];
        const cross = lg.Flast[ij] - lg.Ffirst[ij] - D0 - sDi * wj - wi * sDj;
        const bb = g.G[ij] - lg.Flast[ij] - sBi * wj - wi * sBj + lg.count * wi * wj;
        const val = D0 + eps * cross + eps * eps * bb;
        A[a * p + b] += val;
      }
    }
  }
  for (let a = 0; a < p; a++) {
    const i = idx[a];
    for (let b = a; b < p; b++) {
      const j = idx[b];
      const c = g.G[i * P + j] / n - (g.sum[i] / n) * (g.sum[j] / n);
      C[a * p + b] = c; C[b * p + a] = c;
      const x = A[a * p + b] / count;
      A[a * p + b] = x; A[b * p + a] = x;
    }
  }
  return { A, C, p };
}

export interface WeakSolution {
  /** All relative non-conservations, ascending (mu_1 <= mu_2 <= ...). */
  mu: Float64Array;
  /** Coefficients of the best eigenfunction over all P library terms (zeros outside `active`). */
  xi: Float64Array;
  /** mu_2 / mu_1 (Infinity when mu_1 <= 0). */
  gap: number;
  ridge: number;
  eig: GenEigResult;
}

export function solveWeak(g: GramSet, dt: number, lambda: number, shift: Float64Array | null, active?: number[]): WeakSolution {
  const idx = active ?? Array.from({ length: g.p }, (_, i) => i);
  const { A, C, p } = weakMatrices(g, dt, lambda, shift, idx);
  const eig = generalizedEigen(A, C, p);
  const xi = new Float64Array(g.p);
  for (let a = 0; a < p; a++) xi[idx[a]] = eig.vectors[a * p];
  const mu = eig.values;
  const m1 = Math.max(mu[0], 0);
  const gap = p > 1 ? (m1 > 0 ? mu[1] / m1 : Infinity) : Infinity;
  return { mu, xi, gap, ridge: eig.ridge, eig };
}

/**
 * Relative non-conservation xi'Axi / xi'Cxi of given coefficients (all P terms) on a Gram set,
 * e.g. a held-out run; C from `normalizeBy` when given (a held-out run spans a narrow band of
 * energies, so its own variance would exaggerate mu).
 */
export function nonConservation(g: GramSet, dt: number, lambda: number, shift: Float64Array | null, xi: Float64Array, normalizeBy?: GramSet): number {
  const idx: number[] = [];
  for (let i = 0; i < g.p; i++) if (xi[i] !== 0) idx.push(i);
  if (idx.length === 0) return NaN;
  const { A, p } = weakMatrices(g, dt, lambda, shift, idx);
  const { C } = weakMatrices(normalizeBy ?? g, dt, lambda, shift, idx);
  let num = 0, den = 0;
  for (let a = 0; a < p; a++) for (let b = 0; b < p; b++) {
    const w = xi[idx[a]] * xi[idx[b]];
    num += w * A[a * p + b];
    den += w * C[a * p + b];
  }
  return den > 0 ? num / den : NaN;
}
