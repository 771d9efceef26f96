import { describe, expect, it } from 'vitest';
import { runClosedLoop } from '../../../src-main/engine/plan/index.ts';

describe('runClosedLoop', () => {
  it('integrates the free oscillator q" = -q to RK4 accuracy (q = cos t, analytic)', () => {
    const r = runClosedLoop({
      accel: (q) => -q, controller: { reset() {}, step: () => 0 }, q0: 1, v0: 0, rateHz: 100, maxDuration: 2,
      observe: () => true,
    });
    expect(r.status).toBe('timeout');
    expect(r.t).toBeCloseTo(2, 12);
    expect(Math.abs(r.q - Math.cos(2))).toBeLessThan(1e-9);
    expect(Math.abs(r.v + Math.sin(2))).toBeLessThan(1e-9);
  });

  it('delays the held input by whole samples: q" = u with u = 1 after d periods gives q = (t - dT)^2 / 2', () => {
    const seen: number[] = [];
    const r = runClosedLoop({
      accel: (_q, _v, u) => u, controller: { reset() {}, step: () => 1, stage: () => 7 }, q0: 0, v0: 0, rateHz: 10, delaySamples: 3, maxDuration: 1,
      observe: (_t, _q, _v, s) => { seen.push(s); return true; },
    });
    // RK4 is exact for this quadratic (HNW §II.1): the delayed step starts at 0.3 s.
    expect(r.q).toBeCloseTo((1 - 0.3) ** 2 / 2, 12);
    expect(seen.every((s) => s === 7)).toBe(true);
  });

  it('stops when the observer says so, and reports divergence', () => {
    const r = runClosedLoop({ accel: () => 0, controller: { reset() {}, step: () => 0 }, q0: 0, v0: 1, rateHz: 10, maxDuration: 10, observe: (t) => t < 0.45 });
    expect(r.status).toBe('stopped');
    expect(r.t).toBeCloseTo(0.5, 12);
    const d = runClosedLoop({ accel: (q) => q * q * q * 1e6, controller: { reset() {}, step: () => 0 }, q0: 10, v0: 0, rateHz: 10, maxDuration: 10, observe: () => true });
    expect(d.status).toBe('diverged');
  });
});
