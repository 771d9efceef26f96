import { describe, it, expect } from 'vitest';
import { generalizedEigen } from '../../../src-main/engine/learn/geneig.ts';

describe('generalizedEigen', () => {
  it('solves A x = mu C x for a 2 x 2 pair with a closed-form answer', () => {
    // A = diag(2, 3), C = [[2, 1], [1, 2]]: det(A - mu C) = 3 mu^2 - 10 mu + 6 = 0,
    // mu = (5 -+ sqrt(7)) / 3 (quadratic formula; elementary algebra).
    const r = generalizedEigen(Float64Array.from([2, 0, 0, 3]), Float64Array.from([2, 1, 1, 2]), 2);
    expect(r.values[0]).toBeCloseTo((5 - Math.sqrt(7)) / 3, 12);
    expect(r.values[1]).toBeCloseTo((5 + Math.sqrt(7)) / 3, 12);
    expect(r.ridge).toBe(0);
    // Residual and C-normalisation of the first eigenvector.
    const x = [r.vectors[0], r.vectors[2]];
    const mu = r.values[0];
    expect(2 * x[0] - mu * (2 * x[0] + x[1])).toBeCloseTo(0, 12);
    expect(3 * x[1] - mu * (x[0] + 2 * x[1])).toBeCloseTo(0, 12);
    expect(2 * x[0] * x[0] + 2 * x[0] * x[1] + 2 * x[1] * x[1]).toBeCloseTo(1, 12);
  });

  it('adds and reports a ridge when C is singular, and names a zero-variance term', () => {
    const r = generalizedEigen(Float64Array.from([1, 0, 0, 1]), Float64Array.from([1, 1, 1, 1]), 2);
    expect(r.ridge).toBeGreaterThan(0);
    expect(() => generalizedEigen(Float64Array.from([1, 0, 0, 1]), Float64Array.from([1, 0, 0, 0]), 2)).toThrow(/C\[1\]\[1\] must be positive/);
  });
});
