// rk4HeldStep against the exact solution of q'' = -w^2 q + u with u held: q(t) = u/w^2 +
// (q0 - u/w^2) cos wt + (v0/w) sin wt (elementary ODE), and its fourth order: halving h cuts the
// error by about 2^4 = 16 over a fixed time (Hairer, Nørsett & Wanner, §II.1).
import { describe, expect, it } from 'vitest';
import { rk4HeldStep } from '../../../src-main/engine/ode/index.ts';

function run(h: number, T: number) {
  const w = 3, u = 2, out = new Float64Array(2);
  let q = 0.5, v = -1;
  const steps = Math.round(T / h);
  for (let k = 0; k < steps; k++) {
    rk4HeldStep((x, _v, uu) => -w * w * x + uu, q, v, u, k * h, h, out);
    q = out[0];
    v = out[1];
  }
  const qs = u / (w * w);
  const exact = qs + (0.5 - qs) * Math.cos(w * T) + (-1 / w) * Math.sin(w * T);
  return Math.abs(q - exact);
}

describe('rk4HeldStep', () => {
  it('follows the exact held-input solution with fourth-order accuracy', () => {
    const e1 = run(0.02, 2);
    const e2 = run(0.01, 2);
    expect(e1).toBeLessThan(1e-6);
    expect(e1 / e2).toBeGreaterThan(12);
    expect(e1 / e2).toBeLessThan(20);
  });
});
