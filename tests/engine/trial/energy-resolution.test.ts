import { describe, it, expect } from 'vitest';
import { energyResolution, sensorSigmas } from '../../../src-main/engine/trial/energy-resolution.ts';
import { makeVelocityEstimator } from '../../../src-main/engine/trial/velocity-estimator.ts';
import { Pcg32 } from '../../../src-main/engine/signal/random.ts';
import type { EnergyFunction } from '../../../src-main/engine/types.ts';

describe('sensorSigmas', () => {
  it('position error: step^2 / 12 + noise^2 (uniform quantization error, Widrow & Kollar 2008)', () => {
    const s = sensorSigmas(0.012, 0.003, 1e-3, { kind: 'ideal' });
    expect(s.sigmaQ).toBe(0);
    const d = sensorSigmas(0.012, 0.003, 1e-3);
    expect(d.sigmaQ).toBeCloseTo(Math.sqrt(0.012 ** 2 / 12 + 0.003 ** 2), 15);
  });

  it('filtered-difference velocity error matches a direct simulation of the estimator on white noise', () => {
    // Independent computation: feed the real estimator pure white position noise and measure the sd.
    const T = 1e-3, sd = 0.01, fc = 10;
    const rng = new Pcg32(17, 1);
    const e = makeVelocityEstimator({ kind: 'difference', cutoffHz: fc }, T, 'linear');
    e.reset(0);
    let s2 = 0, n = 0;
    for (let k = 1; k <= 200000; k++) {
      e.update(sd * rng.normal(), 0, k * T);
      if (k > 1000) { s2 += e.v * e.v; n++; }
    }
    const predicted = sensorSigmas(0, sd, T, { kind: 'difference', cutoffHz: fc }).sigmaV;
    expect(Math.abs(Math.sqrt(s2 / n) / predicted - 1)).toBeLessThan(0.02);
  });

  it('observer velocity error is close to the continuous-time formula s^2 T wo^3 / (4 zeta)', () => {
    const T = 1e-3, sd = 0.001;
    const rng = new Pcg32(18, 1);
    const e = makeVelocityEstimator({ kind: 'observer', model: { accel: () => 0 }, bandwidthHz: 5 }, T, 'linear');
    e.reset(0);
    let s2 = 0, n = 0;
    for (let k = 1; k <= 200000; k++) {
      e.update(sd * rng.normal(), 0, k * T);
      if (k > 2000) { s2 += e.v * e.v; n++; }
    }
    const predicted = sensorSigmas(0, sd, T, { kind: 'observer', model: { accel: () => 0 }, bandwidthHz: 5 }).sigmaV;
    // The formula ignores the discretisation (wo T = 0.03): allow 10%.
    expect(Math.abs(Math.sqrt(s2 / n) / predicted - 1)).toBeLessThan(0.1);
  });
});

describe('energyResolution', () => {
  // Unit oscillator H = (q^2 + v^2) / 2: grad = (q, v), Hessian = I.
  const H: EnergyFunction = { coordinate: 'linear', lambda: 0, H: (q, v) => 0.5 * (q * q + v * v), grad: (q, v, o) => { o[0] = q; o[1] = v; } };

  it('propagates errors to first order plus the second-order term (hand computation)', () => {
    // At (q, v) = (0.3, 0.4): first order sqrt((0.3*0.01)^2 + (0.4*0.02)^2), second order (0.01^2 + 0.02^2)/2.
    const r = energyResolution(H, [0.3], [0.4], { sigmaQ: 0.01, sigmaV: 0.02 });
    expect(r).toBeCloseTo(Math.hypot(0.003, 0.008) + 0.5 * (1e-4 + 4e-4), 9);
  });

  it('is the second-order term alone at the well bottom, and the RMS over several points', () => {
    expect(energyResolution(H, [0], [0], { sigmaQ: 0.1, sigmaV: 0.2 })).toBeCloseTo(0.5 * (0.01 + 0.04), 9);
    const a = energyResolution(H, [1], [0], { sigmaQ: 0.01, sigmaV: 0 });
    const b = energyResolution(H, [0], [2], { sigmaQ: 0.01, sigmaV: 0.01 });
    expect(energyResolution(H, [1, 0], [0, 2], { sigmaQ: 0.01, sigmaV: 0.01 })).toBeGreaterThan(0);
    expect(a).toBeCloseTo(0.01 + 0.5 * 1e-4, 9);
    expect(b).toBeCloseTo(0.02 + 0.5 * 2e-4, 9);
    expect(() => energyResolution(H, [], [], { sigmaQ: 0, sigmaV: 0 })).toThrow(/at least one/);
  });
});
