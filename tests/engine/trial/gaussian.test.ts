import { describe, it, expect } from 'vitest';
import { gaussianSource } from '../../../src-main/engine/trial/gaussian.ts';
import { Pcg32 } from '../../../src-main/engine/signal/random.ts';

describe('gaussianSource', () => {
  it('has mean 0, variance 1 and P(|x| < 1) = 0.6827 (standard normal, A&S 26.2.2 / Table 26.1)', () => {
    const rng = new Pcg32(9, 1);
    const normal = gaussianSource(() => rng.uniform());
    const n = 100000;
    let s = 0, s2 = 0, inside = 0;
    for (let i = 0; i < n; i++) { const x = normal(); s += x; s2 += x * x; if (Math.abs(x) < 1) inside++; }
    expect(Math.abs(s / n)).toBeLessThan(0.015); // 4.7 standard errors
    expect(Math.abs(s2 / n - 1)).toBeLessThan(0.02);
    // erf(1/sqrt 2) = 0.682689 (A&S Table 26.1, from memory); binomial s.e. 0.0015.
    expect(Math.abs(inside / n - 0.682689)).toBeLessThan(0.006);
  });

  it('returns exactly the Box–Muller pair for known uniforms (Box & Muller 1958)', () => {
    const us = [0.25, 0.125];
    let i = 0;
    const normal = gaussianSource(() => us[i++]);
    const r = Math.sqrt(-2 * Math.log(0.25));
    expect(normal()).toBeCloseTo(r * Math.cos(2 * Math.PI * 0.125), 15);
    expect(normal()).toBeCloseTo(r * Math.sin(2 * Math.PI * 0.125), 15);
  });
});
