import { describe, it, expect } from 'vitest';
import { rk4Fixed } from '../../../src-main/engine/ode/rk4.ts';
import { buildLibrary, termValue } from '../../../src-main/engine/learn/library.ts';
import { accumulateGrams, sumGramSets } from '../../../src-main/engine/learn/gram.ts';
import { solveWeak, weakMatrices } from '../../../src-main/engine/learn/weakForm.ts';

// Unforced double-well Duffing q'' = a q - b q^3 (references.md "Duffing double well"), exact states.
function duffingRun(q0: number, v0: number, a: number, b: number, dt: number, steps: number) {
  const r = rk4Fixed((_t, y, d) => { d[0] = y[1]; d[1] = a * y[0] - b * y[0] ** 3; }, 0, [q0, v0], dt, steps);
  const q = new Float64Array(steps + 1), v = new Float64Array(steps + 1);
  for (let i = 0; i <= steps; i++) { q[i] = r.y[2 * i]; v[i] = r.y[2 * i + 1]; }
  return { q, v };
}

describe('weak form on exact states', () => {
  it('streamed Gram algebra equals the residual Gram built row by row', () => {
    // Independent computation: D(lambda)'D(lambda) and the covariance formed directly from the rows.
    const { q, v } = duffingRun(0.3, 0.9, 1, 1, 0.01, 700);
    const terms = buildLibrary({ coordinate: 'linear', degree: 3 });
    const lags = [7, 30];
    const g = accumulateGrams(q, v, terms, lags, { chunk: 64 });
    const lambda = -0.37, dt = 0.01;
    const shift = Float64Array.from(terms.map((t) => termValue(t, 0.8, -0.2)));
    const { A, C, p } = weakMatrices(g, dt, lambda, shift);
    const row = (i: number) => terms.map((t, j) => termValue(t, q[i], v[i]) - shift[j]);
    const Ad = new Float64Array(p * p);
    let count = 0;
    for (const L of lags) {
      const c = Math.exp(lambda * L * dt);
      for (let i = 0; i + L < q.length; i++) {
        const a = row(i + L), b = row(i);
        const d = a.map((x, j) => x - c * b[j]);
        for (let j = 0; j < p; j++) for (let k = 0; k < p; k++) Ad[j * p + k] += d[j] * d[k];
        count++;
      }
    }
    const n = q.length;
    const mean = terms.map((t) => { let s = 0; for (let i = 0; i < n; i++) s += termValue(t, q[i], v[i]); return s / n; });
    for (let j = 0; j < p; j++) for (let k = 0; k < p; k++) {
      expect(A[j * p + k]).toBeCloseTo(Ad[j * p + k] / count, 10);
      let c = 0;
      for (let i = 0; i < n; i++) c += (termValue(terms[j], q[i], v[i]) - mean[j]) * (termValue(terms[k], q[i], v[i]) - mean[k]);
      expect(C[j * p + k]).toBeCloseTo(c / n, 10);
    }
  });

  it('recovers the Duffing energy v^2/2 - q^2/2 + q^4/4 from exact states of several runs', () => {
    // Analytic energy of q'' = q - q^3 (references.md "Duffing double well", a = b = 1).
    const runs = [[0.2, 0.3], [1.2, 0], [-0.5, 0.9], [1.6, 0.2], [0.9, -0.1]].map(([q0, v0]) => duffingRun(q0, v0, 1, 1, 0.02, 1500));
    const terms = buildLibrary({ coordinate: 'linear', degree: 4 });
    const lags = [10, 23, 41];
    const g = sumGramSets(runs.map((r) => accumulateGrams(r.q, r.v, terms, lags)), terms.length, lags);
    const sol = solveWeak(g, 0.02, 0, null);
    const iv2 = terms.findIndex((t) => t.kind === 'mono' && t.a === 0 && t.b === 2);
    const xi = Array.from(sol.xi, (x) => x / sol.xi[iv2] / 2);
    const want = terms.map((t) => (t.kind === 'mono' && t.a === 0 && t.b === 2 ? 0.5 : t.kind === 'mono' && t.a === 2 && t.b === 0 ? -0.5 : t.kind === 'mono' && t.a === 4 && t.b === 0 ? 0.25 : 0));
    for (let j = 0; j < terms.length; j++) expect(xi[j]).toBeCloseTo(want[j], 5);
    expect(sol.mu[0]).toBeLessThan(1e-9);
    // H^2 needs degree 8, so at degree 4 the next candidate is far less conserved.
    expect(sol.gap).toBeGreaterThan(1e4);
  });
});
