import { describe, it, expect } from 'vitest';
import { mismatchFactors, noiseStream } from '../../../src-main/engine/trial/mismatch.ts';

describe('mismatchFactors', () => {
  it('draws factors in [1 - p, 1 + p], the same for the same (seed, run), whatever the name order', () => {
    const a = mismatchFactors(['m', 'l', 'c'], 0.15, 42, 7);
    const b = mismatchFactors(['c', 'm', 'l'], 0.15, 42, 7);
    expect(a).toEqual(b);
    const c = mismatchFactors(['m', 'l', 'c'], 0.15, 42, 8);
    expect(c).not.toEqual(a);
    for (let run = 0; run < 200; run++) {
      for (const f of Object.values(mismatchFactors(['a', 'b'], 0.15, 1, run))) {
        expect(f).toBeGreaterThanOrEqual(0.85);
        expect(f).toBeLessThanOrEqual(1.15);
      }
    }
  });

  it('is uniform: mean 1 and variance p^2 / 3 over many runs (uniform distribution moments)', () => {
    const p = 0.2, n = 20000;
    let s = 0, s2 = 0;
    for (let run = 0; run < n; run++) { const f = mismatchFactors(['x'], p, 99, run).x - 1; s += f; s2 += f * f; }
    expect(Math.abs(s / n)).toBeLessThan(5 * p / Math.sqrt(3 * n));
    expect(Math.abs(s2 / n / (p * p / 3) - 1)).toBeLessThan(0.03);
  });

  it('keeps the noise streams apart from the parameter streams; refuses bad arguments', () => {
    for (let i = 0; i < 5; i++) expect(noiseStream(i) % 2).toBe(0);
    expect(() => mismatchFactors(['x'], 1, 0, 0)).toThrow(/p must be/);
    expect(() => mismatchFactors(['x'], 0.1, -1, 0)).toThrow(/seed/);
  });
});
