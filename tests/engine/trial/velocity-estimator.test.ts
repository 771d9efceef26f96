import { describe, it, expect } from 'vitest';
import { makeVelocityEstimator } from '../../../src-main/engine/trial/velocity-estimator.ts';
import { wrapAngle } from '../../../src-main/engine/trial/sensor.ts';

describe('filtered-difference velocity estimate', () => {
  it('follows a ramp as v_k = a (1 - (1 - alpha)^k), alpha = 1 - exp(-2 pi fc T)', () => {
    // For q = a t the backward difference is exactly a; the first-order recursion then gives the
    // geometric approach above (elementary algebra of y_k = y_{k-1} + alpha (a - y_{k-1}), y_0 = 0).
    const T = 1e-3, fc = 10, a = 2.5;
    const alpha = 1 - Math.exp(-2 * Math.PI * fc * T);
    const e = makeVelocityEstimator({ kind: 'difference', cutoffHz: fc }, T, 'linear');
    e.reset(0);
    for (let k = 1; k <= 200; k++) {
      e.update(a * k * T, 0, k * T);
      expect(e.v).toBeCloseTo(a * (1 - (1 - alpha) ** k), 12);
    }
  });

  it('unwraps angle readings across +-pi: the position estimate is continuous', () => {
    // Rotation at 3 rad/s read by a wrapping encoder: the estimate must equal the true angle.
    const T = 1e-3, w = 3;
    const e = makeVelocityEstimator({ kind: 'difference' }, T, 'angle');
    e.reset(wrapAngle(3.0));
    for (let k = 1; k <= 3000; k++) {
      const q = 3.0 + w * k * T;
      e.update(wrapAngle(q), 0, k * T);
      expect(e.q).toBeCloseTo(q, 9);
    }
    expect(e.v).toBeCloseTo(w, 9); // steady state after 30 filter time constants
  });

  it('model observer converges to the true velocity of a harmonic oscillator', () => {
    // q = A cos(w t), v = -A w sin(w t) (exact solution of q'' = -w^2 q); model identical to the plant.
    const T = 1e-3, w = 4, A = 0.7;
    const e = makeVelocityEstimator({ kind: 'observer', model: { accel: (q) => -w * w * q } }, T, 'linear');
    e.reset(A);
    let err = 0;
    for (let k = 1; k <= 4000; k++) {
      const t = k * T;
      e.update(A * Math.cos(w * t), 0, t);
      if (t > 2) err = Math.max(err, Math.abs(e.v + A * w * Math.sin(w * t)));
    }
    expect(err).toBeLessThan(1e-6);
  });

  it('refuses bad settings, naming the field', () => {
    expect(() => makeVelocityEstimator({ kind: 'difference', cutoffHz: 0 }, 1e-3, 'linear')).toThrow(/estimator\.cutoffHz/);
    expect(() => makeVelocityEstimator({ kind: 'observer', model: { accel: () => 0 }, bandwidthHz: -1 }, 1e-3, 'linear')).toThrow(/estimator\.bandwidthHz/);
    expect(() => makeVelocityEstimator({ kind: 'nope' } as never, 1e-3, 'linear')).toThrow(/estimator\.kind/);
  });
});
