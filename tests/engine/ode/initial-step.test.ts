import { describe, it, expect } from 'vitest';
import { initialStep } from '../../../src-main/engine/ode/initial-step.ts';

describe('initialStep (HNW §II.4)', () => {
  it('follows steps (a)-(f) on y\' = -2 y, worked by hand', () => {
    // y0 = 1, rtol = 1e-6, atol = 0: sc = 1e-6, d0 = 1e6, d1 = 2e6, h0 = 0.01 d0/d1 = 0.005;
    // f1 - f0 = lambda^2 h0 y0, so d2 = 4e6; h1 = (0.01 / 4e6)^(1/5); h = min(100 h0, h1) = h1.
    const rhs = (_t: number, y: Float64Array, d: Float64Array): void => { d[0] = -2 * y[0]; };
    const y0 = Float64Array.of(1), f0 = Float64Array.of(-2);
    const h = initialStep(rhs, 0, y0, f0, 1, 4, Float64Array.of(1e-6), Float64Array.of(0), 10, new Float64Array(2));
    expect(Math.abs(h - (0.01 / 4e6) ** 0.2)).toBeLessThan(1e-15);
    // Backwards: same size, negative sign (the second derivative estimate is symmetric here).
    const hb = initialStep(rhs, 0, y0, f0, -1, 4, Float64Array.of(1e-6), Float64Array.of(0), 10, new Float64Array(2));
    expect(Math.abs(hb + (0.01 / 4e6) ** 0.2)).toBeLessThan(1e-15);
    // Capped by hMax.
    expect(initialStep(rhs, 0, y0, f0, 1, 4, Float64Array.of(1e-6), Float64Array.of(0), 1e-3, new Float64Array(2))).toBe(1e-3);
  });

  it('falls back to 1e-6-based guesses for a zero state and zero derivative (steps (a) and (e))', () => {
    // y' = 0, y0 = 0: d0 = d1 = 0 so h0 = 1e-6; d2 = 0 so h1 = max(1e-6, 1e-3 h0) = 1e-6; h = min(1e-4, 1e-6).
    const h = initialStep((_t, _y, d) => { d[0] = 0; }, 0, Float64Array.of(0), Float64Array.of(0), 1, 4, Float64Array.of(1e-6), Float64Array.of(1e-9), 1, new Float64Array(2));
    expect(h).toBe(1e-6);
  });
});
