import { describe, it, expect } from 'vitest';
import { rk4Fixed } from '../src-main/engine/ode/rk4.ts';

describe('rk4Fixed', () => {
  it('integrates dy/dt = -y to exp(-t) with fourth-order accuracy', () => {
    // Exact solution y = exp(-t): elementary calculus.
    const r = rk4Fixed((_t, y, d) => { d[0] = -y[0]; }, 0, [1], 0.01, 100);
    expect(Math.abs(r.y[100] - Math.exp(-1))).toBeLessThan(1e-9);
  });
});
