import { describe, it, expect } from 'vitest';
import * as T from '../../../src-main/engine/ode/dopri5-tableau.ts';

// Independent check of the transcribed coefficients: the Runge–Kutta order conditions
// (Butcher; HNW "Solving ODEs I" §II.2, Table 2.2) evaluated with the tableau's own numbers.
const c = [0, T.C2, T.C3, T.C4, T.C5, 1, 1];
const A = [
  [],
  [T.A21],
  [T.A31, T.A32],
  [T.A41, T.A42, T.A43],
  [T.A51, T.A52, T.A53, T.A54],
  [T.A61, T.A62, T.A63, T.A64, T.A65],
  [T.B1, 0, T.B3, T.B4, T.B5, T.B6],
];
const b = [T.B1, 0, T.B3, T.B4, T.B5, T.B6, 0];
const bh = [T.BH1, 0, T.BH3, T.BH4, T.BH5, T.BH6, T.BH7];
const s = 7;
const Ac = (v: number[]): number[] => A.map((row) => row.reduce((acc, a, j) => acc + a * v[j], 0));
const dot = (u: number[], v: number[]): number => u.reduce((acc, x, i) => acc + x * v[i], 0);
const pow = (k: number): number[] => c.map((x) => x ** k);

describe('Dormand–Prince 5(4) tableau', () => {
  it('has row sums equal to the nodes c_i', () => {
    for (let i = 1; i < s; i++) expect(Math.abs(A[i].reduce((x, y) => x + y, 0) - c[i])).toBeLessThan(1e-15);
  });

  it('satisfies the order conditions up to order 5 with b and up to order 4 with b-hat', () => {
    const conds = (w: number[]): [number, number][] => [
      [dot(w, pow(0)), 1], [dot(w, pow(1)), 1 / 2],
      [dot(w, pow(2)), 1 / 3], [dot(w, Ac(pow(1))), 1 / 6],
      [dot(w, pow(3)), 1 / 4], [dot(w, c.map((x, i) => x * Ac(pow(1))[i])), 1 / 8], [dot(w, Ac(pow(2))), 1 / 12], [dot(w, Ac(Ac(pow(1)))), 1 / 24],
      // order 5 (a selection of the nine trees)
      [dot(w, pow(4)), 1 / 5], [dot(w, Ac(pow(3))), 1 / 20], [dot(w, Ac(Ac(Ac(pow(1))))), 1 / 120],
      [dot(w, c.map((x, i) => x * x * Ac(pow(1))[i])), 1 / 10], [dot(w, Ac(pow(1)).map((x) => x * x)), 1 / 20],
    ];
    conds(b).forEach(([got, want]) => expect(Math.abs(got - want)).toBeLessThan(1e-14));
    conds(bh).slice(0, 8).forEach(([got, want]) => expect(Math.abs(got - want)).toBeLessThan(1e-14));
    // The embedded pair differs at order 5 (otherwise the error estimate would vanish).
    expect(Math.abs(dot(bh, pow(4)) - 1 / 5)).toBeGreaterThan(1e-6);
  });

  it('has error weights e = b - b-hat and dense-output weights d summing to zero', () => {
    const e = [T.E1, 0, T.E3, T.E4, T.E5, T.E6, T.E7];
    e.forEach((x, i) => expect(Math.abs(x - (b[i] - bh[i]))).toBeLessThan(1e-16));
    // Σ d_i = 0 so that the θ²(1-θ)² correction vanishes for y' = const (HNW §II.6 construction).
    expect(Math.abs(T.D1 + T.D3 + T.D4 + T.D5 + T.D6 + T.D7)).toBeLessThan(1e-14);
  });

  it('interpolates the end points and end slopes of a step exactly (Hermite conditions)', () => {
    // u(0) = y0, u(1) = y1, u'(0) = h k1, u'(1) = h k7 in θ for any r5 (from the form of dopri5Interp).
    const n = 1, y0 = 0.3, y1 = 0.9, hk1 = 0.5, hk7 = 0.7, r5 = 0.123;
    const dy = y1 - y0, bspl = hk1 - dy;
    const r = Float64Array.from([y0, dy, bspl, dy - hk7 - bspl, r5]);
    const out = new Float64Array(1);
    const u = (th: number): number => { T.dopri5Interp(r, 0, n, th, out); return out[0]; };
    expect(u(0)).toBe(y0);
    expect(Math.abs(u(1) - y1)).toBeLessThan(1e-15);
    const d = 1e-6; // central differences (common practice)
    expect(Math.abs((u(d) - u(-d)) / (2 * d) - hk1)).toBeLessThan(1e-8);
    expect(Math.abs((u(1 + d) - u(1 - d)) / (2 * d) - hk7)).toBeLessThan(1e-8);
  });
});
