import { describe, it, expect } from 'vitest';
import { logDecrement, decrementFromAmplitudes, dampingRatioFromDecrement } from '../../../src-main/engine/signal/logdec.ts';
import { rk4Fixed } from '../../../src-main/engine/ode/rk4.ts';
import { addNoise, expectClose, sample } from './helpers.ts';

/** Free decay of x'' + 2 zeta w x' + w^2 x = 0 from (x0, 0), by RK4 with a step of dt/4; samples every dt. */
function simulateDecay(zeta: number, w: number, x0: number, dt: number, n: number): Float64Array {
  const sub = 4;
  const r = rk4Fixed((_t, y, d) => { d[0] = y[1]; d[1] = -2 * zeta * w * y[1] - w * w * y[0]; }, 0, [x0, 0], dt / sub, (n - 1) * sub);
  const x = new Float64Array(n);
  for (let i = 0; i < n; i++) x[i] = r.y[i * sub * 2];
  return x;
}

describe('decrementFromAmplitudes and dampingRatioFromDecrement', () => {
  it('reproduce the worked example of references.md §2', () => {
    // Successive positive peaks 10.0 mm then 8.0 mm: delta = ln 1.25 = 0.223143551314 (tol 1e-12),
    // zeta = 0.035492023706 (tol 1e-9), references.md §2 (definition confirmed, worked example).
    const delta = decrementFromAmplitudes([10.0, 8.0]);
    expectClose(delta, 0.223143551314, 1e-12, 'delta');
    expectClose(dampingRatioFromDecrement(delta), 0.035492023706, 1e-9, 'zeta');
    // The n-period form (1/n) ln(x0/xn) on an exact geometric sequence gives the same delta.
    expectClose(decrementFromAmplitudes([10, 8, 6.4, 5.12, 4.096, 3.2768]), Math.log(1.25), 1e-13, 'n = 5');
    // Inverse formula delta = 2 pi zeta / sqrt(1 - zeta^2) (references.md §2, confirmed).
    const z = 0.2;
    expectClose(dampingRatioFromDecrement((2 * Math.PI * z) / Math.sqrt(1 - z * z)), z, 1e-14, 'inverse');
    expect(() => decrementFromAmplitudes([1])).toThrow(/at least 2 amplitudes/);
    expect(() => decrementFromAmplitudes([1, -2])).toThrow(/amplitudes\[1\] must be positive/);
  });
});

describe('logDecrement', () => {
  it('finds the damping ratio of a simulated noisy free decay within 2 %', () => {
    // Truth: the zeta put into x'' + 2 zeta w x' + w^2 x = 0 (RK4, references.md §2 formulas);
    // the damped period 2 pi / (w sqrt(1 - zeta^2)) is elementary.
    for (const [zeta, f, x0, sigma, seed] of [[0.02, 1.0, 0.5, 0.002, 1], [0.035492023706, 1.6, 0.1, 0.0005, 2], [0.005, 0.7, 1.0, 0.003, 3]]) {
      const w = 2 * Math.PI * f, dt = 0.004;
      const x = addNoise(simulateDecay(zeta, w, x0, dt, 6000), sigma, seed);
      const r = logDecrement(x, dt);
      expect(r.status, r.message).toBe('ok');
      expectClose(r.zeta, zeta, 0.02, `zeta ${zeta}`, 0);
      expectClose(r.period, (2 * Math.PI) / (w * Math.sqrt(1 - zeta * zeta)), 2e-3, 'period', 0);
      expect(r.peaks.length).toBeGreaterThan(10);
    }
  });

  it('finds an offset equilibrium and a lopsided swing', () => {
    // Offset: the same decay about 0.25 (the Aitken estimate of the equilibrium must find it).
    const zeta = 0.03, w = 2 * Math.PI * 1.2, dt = 0.005;
    const base = simulateDecay(zeta, w, 0.4, dt, 4000);
    const r = logDecrement(addNoise(base.map((v) => v + 0.25), 1e-3, 5), dt);
    expect(r.status).toBe('ok');
    expectClose(r.equilibrium, 0.25, 2e-3, 'equilibrium', 1);
    expectClose(r.zeta, zeta, 0.02, 'zeta', 0);
    // Lopsided: maxima 1.3x the minima (same decay): separate intercepts keep delta right
    // (the equilibrium 0 is given, since the Aitken form assumes a symmetric swing).
    const lop = base.map((v) => (v > 0 ? 1.3 * v : v));
    const r2 = logDecrement(lop, dt, { equilibrium: 0, smoothing: false, noiseSigma: 0 });
    expectClose(r2.zeta, zeta, 0.01, 'lopsided zeta', 0);
  });

  it('says too-few-peaks or not-decaying instead of a number', () => {
    const dt = 0.01;
    // Half a period only.
    const short = sample(100, dt, (t) => Math.cos(Math.PI * t));
    const a = logDecrement(short, dt, { smoothing: false, noiseSigma: 0, equilibrium: 0 });
    expect(a.status).toBe('too-few-peaks');
    expect(Number.isNaN(a.zeta)).toBe(true);
    expect(a.message).toMatch(/needs two peaks of the same side/);
    // A growing oscillation.
    const grow = sample(2000, dt, (t) => Math.exp(0.1 * t) * Math.sin(2 * Math.PI * t));
    const b = logDecrement(grow, dt, { smoothing: false, noiseSigma: 0, equilibrium: 0 });
    expect(b.status).toBe('not-decaying');
    expect(b.delta).toBeLessThan(0);
    expect(b.message).toMatch(/do not decay/);
    expect(() => logDecrement(grow, dt, { equilibrium: NaN })).toThrow(/opts.equilibrium must be finite/);
  });
});
