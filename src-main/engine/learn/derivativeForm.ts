// Derivative form of the eigenfunction problem, the cross-check of the weak form (design.md §2):
// d/dt theta(x) xi = lambda (theta(x) - theta(x*)) xi, with d/dt theta_j = dtheta_j/dq v +
// dtheta_j/dv a by the chain rule, v and a from Savitzky–Golay derivatives of the position.
// Minimise |R(lambda) xi|^2 subject to xi' C xi = 1 (generalized eigenproblem, Golub & Van Loan
// §8.7), lambda by a 1-D search. Gram of the 2p columns [theta_dot, theta - w] streamed in chunks.
import { generalizedEigen } from './geneig.ts';
import { termEvaluator, type Term } from './library.ts';
import { minimize1d } from './minimize1d.ts';

export interface DerivativeGram { p: number; n: number; J: Float64Array }

export function accumulateDerivativeGram(q: Float64Array, v: Float64Array, a: Float64Array, terms: Term[], shift: Float64Array, chunk = 2048): DerivativeGram {
  const p = terms.length, P = 2 * p, n = q.length;
  const J = new Float64Array(P * P);
  const X = new Float64Array(P * chunk);
  const ev = termEvaluator(terms, chunk);
  for (let s = 0; s < n; s += chunk) {
    const m = Math.min(chunk, n - s);
    ev.rates(q, v, a, s, m, X, chunk);
    ev.evaluate(q, v, s, m, X.subarray(p * chunk), chunk);
    for (let j = 0; j < p; j++) {
      const o = (p + j) * chunk;
      for (let i = 0; i < m; i++) X[o + i] -= shift[j];
    }
    for (let j = 0; j < P; j++) for (let k = j; k < P; k++) {
      let acc = 0;
      const oj = j * chunk, ok = k * chunk;
      for (let i = 0; i < m; i++) acc += X[oj + i] * X[ok + i];
      J[j * P + k] += acc;
    }
  }
  for (let j = 0; j < P; j++) for (let k = j + 1; k < P; k++) J[k * P + j] = J[j * P + k];
  return { p, n, J };
}

export function addDerivativeGram(a: DerivativeGram, b: DerivativeGram): DerivativeGram {
  const J = Float64Array.from(a.J);
  for (let i = 0; i < J.length; i++) J[i] += b.J[i];
  return { p: a.p, n: a.n + b.n, J };
}

export interface DerivativeFormResult { lambda: number; mu1: number; xi: Float64Array }

/** Solves the derivative form on the `active` terms, C the covariance of those terms (from the weak form). */
export function solveDerivativeForm(dg: DerivativeGram, C: Float64Array, active: number[], lambdaRange: [number, number]): DerivativeFormResult {
  const p = dg.p, P = 2 * p, k = active.length;
  const build = (lambda: number) => {
    const A = new Float64Array(k * k);
    for (let a = 0; a < k; a++) for (let b = 0; b < k; b++) {
      const i = active[a], j = active[b];
      const tt = dg.J[i * P + j], tx = dg.J[i * P + p + j] + dg.J[j * P + p + i], xx = dg.J[(p + i) * P + p + j];
      A[a * k + b] = (tt - lambda * tx + lambda * lambda * xx) / dg.n;
    }
    return generalizedEigen(A, C, k);
  };
  const best = minimize1d((l) => build(l).values[0], lambdaRange[0], lambdaRange[1], { scan: 10 });
  const e = build(best.x);
  const xi = new Float64Array(p);
  for (let a = 0; a < k; a++) xi[active[a]] = e.vectors[a * k];
  return { lambda: best.x, mu1: e.values[0], xi };
}
