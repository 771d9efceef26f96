import { describe, it, expect } from 'vitest';
import { solveCareScalar } from '../../../src-main/engine/control/care-scalar.ts';
import { expectClose } from './helpers.ts';

describe('solveCareScalar (closed form)', () => {
  it('a = b = q = r = 1 gives x = k = 1 + sqrt(2) (references.md §3, scalar row; closed form from memory)', () => {
    const s = solveCareScalar(1, 1, 1, 1);
    expect(s.status).toBe('ok');
    expectClose(s.x, 2.414213562373095, 1e-12, 'x');
    expectClose(s.k, 2.414213562373095, 1e-12, 'k');
  });

  it('a = -2, b = 0.5, q = 3, r = 0.2 (references.md §3, scalar row)', () => {
    const s = solveCareScalar(-2, 0.5, 3, 0.2);
    expectClose(s.x, 0.627105745132009, 1e-12, 'x');
    expectClose(s.k, 1.567764362830022, 1e-12, 'k');
    expectClose(s.closedLoop, -2.783882181415011, 1e-12, 'closed loop');
  });

  it('solves its own equation 2 a x - b^2 x^2 / r + q = 0 with a stable closed loop, both signs of a', () => {
    for (const [a, b, q, r] of [[3, 0.01, 2, 1], [-3, 0.01, 2, 1], [-1e-3, 5, 1e-4, 7], [2, -1, -1, 1]]) {
      const s = solveCareScalar(a, b, q, r);
      expect(s.status).toBe('ok');
      const res = 2 * a * s.x - (b * b * s.x * s.x) / r + q;
      expect(Math.abs(res) / (Math.abs(2 * a * s.x) + (b * b * s.x * s.x) / r + Math.abs(q))).toBeLessThan(1e-14);
      expect(a - b * s.k).toBeLessThan(0);
    }
  });

  it('b = 0: x = -q/(2a) when a < 0, no stabilizing solution when a >= 0', () => {
    const s = solveCareScalar(-4, 0, 2, 1);
    expect(s.x).toBe(-2 / -8);
    expect(s.k).toBe(0);
    expect(solveCareScalar(0.5, 0, 1, 1).status).toBe('no-stabilizing-solution');
    expect(solveCareScalar(0, 0, 1, 1).status).toBe('no-stabilizing-solution');
  });

  it('small b with a < 0 tends continuously to the b = 0 value (no cancellation)', () => {
    // x(b) = -q/(2a) + O(b^2) from the series of the closed form (derived by hand).
    expectClose(solveCareScalar(-4, 1e-9, 2, 1).x, 0.25, 1e-15, 'x');
  });

  it('q < 0 with a^2 r + q b^2 < 0: eigenvalues on the imaginary axis, no stabilizing solution', () => {
    expect(solveCareScalar(0.5, 1, -1, 1).status).toBe('no-stabilizing-solution');
  });

  it('names a bad argument', () => {
    expect(() => solveCareScalar(1, 1, 1, 0)).toThrow(/r: expected a positive/);
    expect(() => solveCareScalar(NaN, 1, 1, 1)).toThrow(/a: expected a finite/);
  });
});
