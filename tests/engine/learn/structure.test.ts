import { describe, it, expect } from 'vitest';
import { equationsOfMotion, nonSeparableShare, replayError, separableParts } from '../../../src-main/engine/learn/structure.ts';
import type { Term } from '../../../src-main/engine/learn/library.ts';
import { rk4Fixed } from '../../../src-main/engine/ode/rk4.ts';

describe('structure check and equations of motion', () => {
  // H = 1/2 (1 + q^2) v^2 + q^2/2: Euler–Lagrange gives (1+q^2) v' + q v^2 + q = 0 (derived by hand).
  const terms: Term[] = [{ kind: 'mono', a: 0, b: 2 }, { kind: 'mono', a: 2, b: 2 }, { kind: 'mono', a: 2, b: 0 }, { kind: 'mono', a: 1, b: 1 }];
  const coef = [0.5, 0.5, 0.5, 0];

  it('derives M(q), V(q) and the acceleration from H', () => {
    const s = separableParts(terms, coef);
    const rhs = equationsOfMotion(s, 0);
    const d = new Float64Array(2);
    for (const [q, v] of [[0.3, 1.2], [-1.1, 0.4], [2, -2]]) {
      rhs(0, Float64Array.from([q, v]), d);
      expect(d[0]).toBe(v);
      expect(d[1]).toBeCloseTo((-q * v * v - q) / (1 + q * q), 12);
    }
  });

  it('measures the share of terms that are neither v^0 nor v^2', () => {
    const q = Float64Array.from({ length: 50 }, (_, i) => Math.sin(i)), v = Float64Array.from({ length: 50 }, (_, i) => Math.cos(1.3 * i));
    expect(nonSeparableShare(terms, coef, q, v)).toBe(0);
    expect(nonSeparableShare(terms, [0.5, 0.5, 0.5, 0.1], q, v)).toBeGreaterThan(0.01);
  });

  it('replays a run of the exact model with a tiny error (independent RK4 simulation as the reference)', () => {
    // Damped harmonic oscillator, H = v^2/2 + 4 q^2/2, lambda = -2 zeta omega = -0.2: q'' = -4 q - 0.2 q'.
    const h: Term[] = [{ kind: 'mono', a: 0, b: 2 }, { kind: 'mono', a: 2, b: 0 }];
    const s = separableParts(h, [0.5, 2]);
    const dt = 0.01, steps = 1000;
    const ref = rk4Fixed((_t, y, d) => { d[0] = y[1]; d[1] = -4 * y[0] - 0.2 * y[1]; }, 0, [1, 0], dt / 8, steps * 8);
    const q = Float64Array.from({ length: steps + 1 }, (_, i) => ref.y[2 * 8 * i]);
    const e = replayError(s, -0.2, 1, 0, dt, q, 0, steps);
    expect(e.relative).toBeLessThan(1e-6);
  });
});
