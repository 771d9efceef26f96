import { describe, it, expect } from 'vitest';
import { buildLibrary, formulaOf, termEvaluator, termGrad, termValue } from '../../../src-main/engine/learn/library.ts';
import { compileFormula } from '../../../src-main/engine/formula/index.ts';

describe('term library', () => {
  it('has the monomials q^a v^b with 1 <= a+b <= d (d = 6: 27 terms) and halves v^b to even b on request', () => {
    // Counting: sum_{k=1..6} (k+1) = 27 (common practice: monomials of two variables).
    expect(buildLibrary({ coordinate: 'linear', degree: 6 }).length).toBe(27);
    const even = buildLibrary({ coordinate: 'linear', degree: 4, evenV: true });
    expect(even.every((t) => t.kind === 'mono' && t.b % 2 === 0)).toBe(true);
    expect(even.length).toBe(1 + 2 + 2 + 3);
  });

  it('orders terms by degree so that a lower degree is a prefix (H is found before H^2)', () => {
    const d2 = buildLibrary({ coordinate: 'angle', degree: 2 });
    const d4 = buildLibrary({ coordinate: 'angle', degree: 4 });
    expect(d4.slice(0, d2.length)).toEqual(d2);
  });

  it('evaluates columns and time derivatives that agree with pointwise values and a finite-difference chain rule', () => {
    const terms = buildLibrary({ coordinate: 'angle', degree: 4 });
    const n = 7;
    const q = Float64Array.from({ length: n }, (_, i) => -2 + 0.7 * i), v = Float64Array.from({ length: n }, (_, i) => 1.3 - 0.4 * i);
    const a = Float64Array.from({ length: n }, (_, i) => 0.2 * i - 0.5);
    const ev = termEvaluator(terms, n);
    const X = new Float64Array(terms.length * n), R = new Float64Array(terms.length * n);
    ev.evaluate(q, v, 0, n, X, n);
    ev.rates(q, v, a, 0, n, R, n);
    const g = new Float64Array(2), h = 1e-6;
    terms.forEach((t, j) => {
      for (let i = 0; i < n; i++) {
        expect(X[j * n + i]).toBeCloseTo(termValue(t, q[i], v[i]), 12);
        termGrad(t, q[i], v[i], g);
        // Central differences (independent of termGrad's formulas).
        const dq = (termValue(t, q[i] + h, v[i]) - termValue(t, q[i] - h, v[i])) / (2 * h);
        const dv = (termValue(t, q[i], v[i] + h) - termValue(t, q[i], v[i] - h)) / (2 * h);
        expect(g[0]).toBeCloseTo(dq, 5);
        expect(g[1]).toBeCloseTo(dv, 5);
        expect(R[j * n + i]).toBeCloseTo(dq * v[i] + dv * a[i], 5);
      }
    });
  });

  it('prints a formula that our parser reads back to the same function', () => {
    const terms = buildLibrary({ coordinate: 'angle', degree: 3 });
    const coef = terms.map((_, j) => (j % 3 === 0 ? 0 : 0.37 * (j + 1) * (j % 2 ? -1 : 1)));
    const f = compileFormula(formulaOf(terms, coef, 1.25), ['q', 'v']);
    for (const [q, v] of [[0.3, -1.1], [2.5, 0.4], [-1, 2]]) {
      const want = 1.25 + terms.reduce((s, t, j) => s + coef[j] * termValue(t, q, v), 0);
      expect(f.eval(Float64Array.from([q, v]))).toBeCloseTo(want, 4);
    }
  });
});
