import { describe, expect, it } from 'vitest';
import { motionFromEnergy } from '../../src-main/design/motion.ts';
import { compileFormula } from '../../src-main/engine/formula/index.ts';

describe('motionFromEnergy', () => {
  it('gives the Duffing double well q\'\' = q - q^3 + lambda v + g u (references.md, Duffing double well)', () => {
    const m = motionFromEnergy('0.5*v^2 - 0.5*q^2 + 0.25*q^4 + 0.25', -0.02, 2, [-1.5, 0, 1.5]);
    if (typeof m === 'string') throw new Error(m);
    const a = compileFormula(m.acceleration, ['q', 'v', 'u', 't']);
    for (const [q, v, u] of [[0.3, 1, 0.5], [-1.2, -0.4, -1], [2, 0, 0]]) {
      expect(a.eval(Float64Array.from([q, v, u, 0]))).toBeCloseTo(q - q ** 3 - 0.02 * v + 2 * u, 12);
      expect(m.undamped(q, v)).toBeCloseTo(q - q ** 3, 12);
    }
    expect(m.mass(0.7)).toBe(1);
  });

  it('handles a position-dependent mass: M v\' + 1/2 M\' v^2 + V\' = 0 (Euler-Lagrange, Goldstein §1.4, from memory)', () => {
    // H = 1/2 (1 + q^2) v^2 + q^2/2: M = 1 + q^2, M' = 2q, V' = q.
    const m = motionFromEnergy('0.5*(1 + q^2)*v^2 + 0.5*q^2', 0, 1, [-1, 0, 1]);
    if (typeof m === 'string') throw new Error(m);
    for (const [q, v] of [[0.5, 2], [-1.5, 0.3]]) {
      expect(m.undamped(q, v)).toBeCloseTo(-(0.5 * 2 * q * v * v + q) / (1 + q * q), 12);
    }
  });

  it('refuses energies that are not 1/2 M(q) v^2 + V(q), or whose M is not positive, with the reason', () => {
    expect(motionFromEnergy('0.5*v^2 + 0.1*v^4 + q^2', 0, 1, [0])).toMatch(/depends on v/);
    expect(motionFromEnergy('0.5*v^2 + q*v + q^2', 0, 1, [0.5])).toMatch(/not of the form/);
    expect(motionFromEnergy('0.5*q*v^2 + q^2', 0, 1, [-1, 1])).toMatch(/M\(q\) = d2H\/dv2 is -1 at q = -1, not positive/);
  });
});
