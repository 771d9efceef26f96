import { describe, it, expect } from 'vitest';
import { levelHoldGain } from '../../../src-main/engine/control/energy-gain.ts';
import { solveCareScalar } from '../../../src-main/engine/control/care-scalar.ts';
import { expectClose } from './helpers.ts';

describe('levelHoldGain', () => {
  it('with lambda = 0 and eps = 0 is sqrt(Q/R) sign(b): the energy-pumping law (Astrom & Furuta 2000; references.md §6)', () => {
    for (const b of [3, 0.2, -0.7, -1e-200]) expect(levelHoldGain(0, b, 2, 0.5, 0)).toBe(Math.sqrt(2 / 0.5) * Math.sign(b));
    expect(levelHoldGain(0, 0, 2, 0.5, 0)).toBe(0);
  });

  it('equals b p / R with p the scalar CARE solution for a = lambda, b = b(x) (design.md "SDRE on the energy coordinate")', () => {
    for (const lambda of [-0.8, -0.02, 0, 0.05, 1.3]) {
      for (const b of [2.5, -0.4, 1e-3]) {
        const Q = 1.7, R = 0.3;
        const p = solveCareScalar(lambda, b, Q, R).x;
        expectClose(levelHoldGain(lambda, b, Q, R, 0), (b * p) / R, 1e-13, `lambda=${lambda} b=${b}`);
        // and the unrationalised form written in design.md, (lambda + sqrt(lambda^2 + Q b^2/R)) / b
        expectClose(levelHoldGain(lambda, b, Q, R, 0), (lambda + Math.sqrt(lambda * lambda + (Q * b * b) / R)) / b, 1e-9, 'design.md form');
      }
    }
  });

  it('is finite and tends to 0 as b -> 0 when lambda < 0, bounded by Q |b| / (2 R |lambda|)', () => {
    // From the rationalised form Q b / (R (s - lambda)) with s - lambda >= 2 |lambda| (derived by hand).
    const lambda = -0.05, Q = 3, R = 0.5;
    for (const b of [1e-2, 1e-6, 1e-12, 1e-300, 0, -1e-9]) {
      const k = levelHoldGain(lambda, b, Q, R, 0);
      expect(Number.isFinite(k)).toBe(true);
      expect(Math.abs(k)).toBeLessThanOrEqual((Q * Math.abs(b)) / (2 * R * Math.abs(lambda)) * (1 + 1e-15));
    }
    expect(levelHoldGain(lambda, 0, Q, R, 0)).toBe(0);
  });

  it('with eps > 0 and lambda = 0 is sqrt(Q/R) b / sqrt(b^2 + eps^2) (design.md regularised sign)', () => {
    for (const b of [1, 0.01, -0.003, 0]) expectClose(levelHoldGain(0, b, 4, 1, 0.01), 2 * b / Math.sqrt(b * b + 1e-4), 1e-15, `b=${b}`);
  });

  it('with eps > 0 solves the scalar CARE with beta^2 = b^2 + eps^2 and applies it along b', () => {
    for (const lambda of [-0.3, 0.4]) {
      const b = 0.02, eps = 0.05, beta = Math.hypot(b, eps);
      const p = solveCareScalar(lambda, beta, 1, 2).x;
      expectClose(levelHoldGain(lambda, b, 1, 2, eps), (b * p) / 2, 1e-13, `lambda=${lambda}`);
    }
  });
});
