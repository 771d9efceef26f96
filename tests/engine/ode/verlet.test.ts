import { describe, it, expect } from 'vitest';
import { solveVerlet } from '../../../src-main/engine/ode/index.ts';
import { duffing, energy, orbitPeriod, pendulum, type Conservative } from './systems.ts';

describe('solveVerlet: accuracy', () => {
  it('reproduces the exact discrete solution of the harmonic oscillator', () => {
    // For x'' = -w^2 x, Störmer–Verlet gives x_{n+1} - 2 x_n + x_{n-1} = -(h w)^2 x_n, whose solution with
    // x_0 = 1, v_0 = 0 is x_n = cos(n h W), cos(h W) = 1 - (h w)^2 / 2 (GNI §I.5, linear stability; from memory).
    const w = 2, h = 0.05, steps = 2000;
    const W = Math.acos(1 - (h * w) ** 2 / 2) / h;
    const r = solveVerlet((_t, q, a) => { a[0] = -w * w * q[0]; }, [1], [0], { h, steps });
    expect(r.status).toBe('done');
    expect(r.t.length).toBe(steps + 1);
    for (let n = 0; n <= steps; n++) expect(Math.abs(r.q[n] - Math.cos(n * h * W))).toBeLessThan(1e-11);
  });

  it('is second order: the error at a fixed time falls by ~4 when h is halved', () => {
    // Pendulum-like q'' = -sin q has no elementary solution; the reference is Verlet itself at h/64 (Richardson
    // reasoning, common practice): err(h) ≈ C h^2 dominates err(h/64).
    const acc = (_t: number, q: Float64Array, a: Float64Array): void => { a[0] = -Math.sin(q[0]); };
    const end = (h: number): number => { const r = solveVerlet(acc, [2], [0], { h, steps: Math.round(8 / h), stride: Math.round(8 / h) }); return r.q[1]; };
    const ref = end(0.1 / 64);
    const e1 = Math.abs(end(0.1) - ref), e2 = Math.abs(end(0.05) - ref), e3 = Math.abs(end(0.025) - ref);
    expect(e1 / e2).toBeGreaterThan(3.6);
    expect(e1 / e2).toBeLessThan(4.4);
    expect(e2 / e3).toBeGreaterThan(3.6);
    expect(e2 / e3).toBeLessThan(4.4);
  });

  it('uses the time argument of a time-dependent acceleration at both half kicks', () => {
    // q'' = cos t, q(0) = 0, v(0) = 0: q = 1 - cos t (elementary). The error must still be O(h^2).
    const run = (h: number): number => {
      const r = solveVerlet((t, _q, a) => { a[0] = Math.cos(t); }, [0], [0], { h, steps: Math.round(3 / h) });
      return Math.abs(r.q[r.q.length - 1] - (1 - Math.cos(3)));
    };
    const ratio = run(0.02) / run(0.01);
    expect(ratio).toBeGreaterThan(3.6);
    expect(ratio).toBeLessThan(4.4);
  });
});

describe('solveVerlet: energy over 1000 periods', () => {
  // Backward error analysis: Störmer–Verlet (kick–drift–kick) exactly conserves, up to O(h^4) and
  // exponentially small terms, the modified energy H~ = H + h^2 H2 with H2 = V''(q) v^2 / 12 - V'(q)^2 / 24
  // (GNI §IX.3 and §IX.8, the modified Hamiltonian of splitting methods via the symmetric BCH formula;
  // coefficients from memory). So |H(t) - H(0)| ≈ h^2 |H2(t) - H2(0)|: bounded, O(h^2), no drift.
  const cases: [Conservative, number, string][] = [
    [pendulum, (120 * Math.PI) / 180, 'pendulum at 120 degrees'],
    [duffing, 1.3, 'Duffing orbit inside the right well'],
    [duffing, 1.6, 'Duffing orbit around both wells'],
  ];
  for (const [sys, q0, label] of cases) {
    it(`keeps the energy error of the ${label} bounded, O(h^2), without drift`, () => {
      const period = orbitPeriod(sys, q0);
      const h = period / 200, steps = 200 * 1000;
      const H0 = energy(sys, q0, 0);
      const H2 = (q: number, v: number): number => (sys.d2V(q) * v * v) / 12 - sys.dV(q) ** 2 / 24;
      const H20 = H2(q0, 0);
      let firstMax = 0, lastMax = 0, allMax = 0, predicted = 0;
      const r = solveVerlet((_t, q, a) => { a[0] = -sys.dV(q[0]); }, [q0], [0], {
        h, steps, stride: steps,
        onStep: (t, q, v) => {
          const e = Math.abs(energy(sys, q[0], v[0]) - H0);
          allMax = Math.max(allMax, e);
          if (t <= 100 * period) firstMax = Math.max(firstMax, e);
          if (t >= 900 * period) lastMax = Math.max(lastMax, e);
          if (t <= 2 * period) predicted = Math.max(predicted, h * h * Math.abs(H2(q[0], v[0]) - H20));
        },
      });
      expect(r.status).toBe('done');
      expect(r.nfev).toBe(steps + 1); // one acceleration per step (FSAL of the half kicks)
      // No drift: the worst error in the last 10% matches the worst in the first 10%.
      expect(Math.abs(lastMax / firstMax - 1)).toBeLessThan(0.01);
      // Size: the O(h^2) modified-energy prediction, within 2%.
      expect(Math.abs(allMax / predicted - 1)).toBeLessThan(0.02);
    });
  }
});

describe('solveVerlet: options and arguments', () => {
  const acc = (_t: number, q: Float64Array, a: Float64Array): void => { a[0] = -q[0]; a[1] = -4 * q[1]; };

  it('keeps every stride-th step and the start time t0, and never modifies q0 or v0', () => {
    const q0 = [1, 0], v0 = [0, 2];
    const r = solveVerlet(acc, q0, v0, { h: 0.01, steps: 100, stride: 25, t0: 5 });
    expect(Array.from(r.t).map((t) => Math.round(t * 1e9) / 1e9)).toEqual([5, 5.25, 5.5, 5.75, 6]);
    expect(r.n).toBe(2);
    expect(r.q.length).toBe(10);
    // Uncoupled oscillators: q1 = cos t, q2 = sin 2t after 1 s (elementary), to O(h^2).
    expect(Math.abs(r.q[8] - Math.cos(1))).toBeLessThan(1e-4);
    expect(Math.abs(r.q[9] - Math.sin(2))).toBeLessThan(1e-4);
    expect(q0).toEqual([1, 0]);
    expect(v0).toEqual([0, 2]);
  });

  it('stops when onStep returns false and reports a non-finite state', () => {
    const s = solveVerlet(acc, [1, 0], [0, 1], { h: 0.1, steps: 100, onStep: (t) => t < 1 - 1e-9 });
    expect(s.status).toBe('stopped');
    expect(s.nSteps).toBe(10);
    const nf = solveVerlet((_t, q, a) => { a[0] = q[0] > 2 ? NaN : 1; }, [0], [0], { h: 0.5, steps: 100 });
    expect(nf.status).toBe('non-finite');
    expect(nf.message).toMatch(/step \d+/);
  });

  it('throws on bad arguments, naming them', () => {
    expect(() => solveVerlet(acc, [1, 0], [0], { h: 0.1, steps: 1 })).toThrow(/v0 must be an array of length 2/);
    expect(() => solveVerlet(acc, [], [], { h: 0.1, steps: 1 })).toThrow(/q0 must be a non-empty array/);
    expect(() => solveVerlet(acc, [1, 0], [0, 0], { h: -0.1, steps: 1 })).toThrow(/options.h must be a positive/);
    expect(() => solveVerlet(acc, [1, 0], [0, 0], { h: 0.1, steps: 1.5 })).toThrow(/options.steps must be an integer/);
    expect(() => solveVerlet(acc, [1, 0], [0, 0], { h: 0.1, steps: 1, stride: 0 })).toThrow(/options.stride must be an integer >= 1/);
    expect(() => solveVerlet('x' as never, [1], [0], { h: 0.1, steps: 1 })).toThrow(/accel must be a function/);
  });
});
