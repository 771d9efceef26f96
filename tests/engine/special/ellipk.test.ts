import { describe, it, expect } from 'vitest';
import { ellipK, ellipKm1, pendulumPeriod } from '../../../src-main/engine/special/ellipk.ts';

const rel = (a: number, b: number): number => Math.abs(a - b) / Math.abs(b);

/** Independent computation: K(m) = ∫_0^{π/2} (1 - m sin^2 t)^(-1/2) dt by the trapezoidal rule over a full
 *  period of the smooth periodic integrand (spectrally accurate: common practice). */
function kByQuadrature(m: number, N = 400): number {
  let s = 0;
  for (let j = 0; j < N; j++) {
    const t = (2 * Math.PI * j) / N;
    s += 1 / Math.sqrt(1 - m * Math.sin(t) ** 2);
  }
  return (s / N) * (Math.PI / 2);
}

describe('ellipK', () => {
  it('matches the tabulated K(0.1), K(0.5), K(0.9) to 1e-12 relative', () => {
    // references.md §1: A&S Table 17.1 (K(0.1), K(0.9) from memory); K(0.5) confirmed via OEIS A093341.
    expect(rel(ellipK(0.1), 1.612441348720219)).toBeLessThan(1e-12);
    expect(rel(ellipK(0.5), 1.854074677301372)).toBeLessThan(1e-12);
    expect(rel(ellipK(0.9), 2.578092113348173)).toBeLessThan(1e-12);
  });

  it('is pi/2 at m = 0 (A&S 17.3.11)', () => {
    expect(ellipK(0)).toBe(Math.PI / 2);
  });

  it('agrees with direct quadrature of its defining integral for negative and positive m', () => {
    // Definition A&S 17.2.6 / DLMF 19.2.8, integrated independently (trapezoidal rule, common practice).
    for (const m of [-5, -0.3, 0.25, 0.7, 0.95]) expect(rel(ellipK(m), kByQuadrature(m, 4000))).toBeLessThan(2e-14);
  });

  it('keeps full accuracy near m = 1 through ellipKm1(p), p = 1 - m', () => {
    // Asymptotic expansion K = L + (p/4)(L - 1) + O(p^2 L), L = ln(4/sqrt(p)) (A&S 17.3.26 and its next
    // term, from memory); for p <= 1e-10 the omitted terms are below 1e-19 relative.
    for (const p of [1e-10, 1e-14, 1e-30, 1e-200]) {
      const L = Math.log(4 / Math.sqrt(p));
      expect(rel(ellipKm1(p), L + (p / 4) * (L - 1))).toBeLessThan(1e-15);
    }
    expect(ellipKm1(0)).toBe(Infinity);
    expect(ellipK(1)).toBe(Infinity);
    // The two entry points agree where 1 - m is exact.
    expect(ellipKm1(0.5)).toBe(ellipK(0.5));
    expect(ellipKm1(0.25)).toBe(ellipK(0.75));
  });

  it('rejects m > 1 and NaN, naming the argument', () => {
    expect(() => ellipK(1.5)).toThrow(/ellipK: m must be/);
    expect(() => ellipK(NaN)).toThrow(/ellipK: m must be/);
    expect(() => ellipKm1(-1e-3)).toThrow(/ellipKm1: p = 1 - m must be/);
  });
});

describe('pendulumPeriod', () => {
  const g = 9.81, l = 0.42;
  const T0 = 1.300079798140; // references.md §5: 2 pi sqrt(0.42/9.81), confirmed formula

  it('tends to the small-angle period 2 pi sqrt(l/g)', () => {
    // references.md §5 (T0 to 1e-9 rel); the amplitude correction at 1e-5 rad is 6e-12 (theta0^2/16).
    expect(rel(pendulumPeriod(1e-5, g, l), T0)).toBeLessThan(1e-9);
    expect(rel(pendulumPeriod(0, 9.80665, 1), 2.006409)).toBeLessThan(5e-7); // references.md §5, published table headline
  });

  it('reproduces the tabulated ratios T/T0 at 30, 90, 150 and 179 degrees', () => {
    // references.md §1: 30°, 90°, 150° confirmed to 6 dp in a published table; 179° not confirmed
    // from a published source (numerical checks only).
    const table: [number, number, number][] = [[30, 1.017408797596, 1e-9], [90, 1.180340599016, 1e-9], [150, 1.762203729504, 1e-9], [179, 3.901065160389, 1e-8]];
    for (const [deg, ratio, tol] of table) {
      expect(rel(pendulumPeriod((deg * Math.PI) / 180, g, l) / T0, ratio)).toBeLessThan(tol);
    }
  });

  it('rejects amplitudes at or beyond pi and non-positive g or l', () => {
    expect(() => pendulumPeriod(Math.PI, g, l)).toThrow(/theta0/);
    expect(() => pendulumPeriod(0.1, 0, l)).toThrow(/pendulumPeriod: g/);
    expect(() => pendulumPeriod(0.1, g, -1)).toThrow(/pendulumPeriod: l/);
  });
});
