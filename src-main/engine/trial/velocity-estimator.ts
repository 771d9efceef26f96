// Velocity from sampled positions, as a rig computes it. Two methods:
// - filtered difference: backward difference of the unwrapped reading through a first-order
//   low-pass, discretised exactly for a held input: a = 1 - exp(-2 pi fc T) (Franklin, Powell &
//   Workman, "Digital Control of Dynamic Systems", 3rd ed., §6.3, zero-order-hold equivalent);
// - Luenberger observer (Luenberger, IEEE Trans. Mil. Electron. 8 (1964) 74–80) on a model of the
//   plant: predict with one RK4 step of the model under the applied u, correct by the innovation.
// Angles: readings arrive wrapped to [-pi, pi); every difference is wrapped back to (-pi, pi], so
// the estimate is continuous (unwrapped) as long as |dq| < pi per sample.
import { rk4HeldStep } from '../ode/rk4-held.ts';
import type { Coordinate } from '../types.ts';
import type { EstimatorOptions } from './types.ts';
import { wrapAngle } from './sensor.ts';

export interface VelocityEstimator {
  /** Starts from a first reading; the velocity estimate starts at 0 (the rig knows no better). */
  reset(y0: number): void;
  /** Takes reading y at the new sample; uPrev is the input applied over the last period. */
  update(y: number, uPrev: number, t: number): void;
  /** Current unwrapped position estimate. */
  q: number;
  /** Current velocity estimate. */
  v: number;
}

export const DEFAULT_CUTOFF_HZ = 10;
export const DEFAULT_OBSERVER_HZ = 10;
export const DEFAULT_OBSERVER_ZETA = 0.8;

/** Creates the estimator for a controller period T (seconds). Ideal estimation is handled by the simulator. */
export function makeVelocityEstimator(options: Exclude<EstimatorOptions, { kind: 'ideal' }>, T: number, coordinate: Coordinate): VelocityEstimator {
  const angle = coordinate === 'angle';
  const diff = angle ? (a: number, b: number) => wrapAngle(a - b) : (a: number, b: number) => a - b;
  if (options.kind === 'difference') {
    const fc = options.cutoffHz ?? DEFAULT_CUTOFF_HZ;
    if (!(fc > 0) || !Number.isFinite(fc)) throw new RangeError(`estimator.cutoffHz must be a positive finite number, got ${options.cutoffHz}`);
    const a = 1 - Math.exp(-2 * Math.PI * fc * T);
    let last = 0;
    const est: VelocityEstimator = {
      q: 0,
      v: 0,
      reset(y0) { last = y0; est.q = y0; est.v = 0; },
      update(y) {
        const dq = diff(y, last);
        last = y;
        est.q += dq;
        est.v += a * (dq / T - est.v);
      },
    };
    return est;
  }
  if (options.kind === 'observer') {
    const wo = 2 * Math.PI * (options.bandwidthHz ?? DEFAULT_OBSERVER_HZ);
    const zeta = options.zeta ?? DEFAULT_OBSERVER_ZETA;
    if (!(wo > 0) || !Number.isFinite(wo)) throw new RangeError(`estimator.bandwidthHz must be a positive finite number, got ${options.bandwidthHz}`);
    if (!(zeta > 0) || !Number.isFinite(zeta)) throw new RangeError(`estimator.zeta must be a positive finite number, got ${options.zeta}`);
    if (!options.model || typeof options.model.accel !== 'function') throw new TypeError('estimator.model must have accel(q, v, u, t)');
    // Continuous gains l1 = 2 zeta wo, l2 = wo^2 place the error poles at s^2 + 2 zeta wo s + wo^2;
    // applied once per sample as T l1, T l2 (forward-Euler correction, valid for wo T << 1).
    const g1 = T * 2 * zeta * wo;
    const g2 = T * wo * wo;
    const f = options.model.accel.bind(options.model);
    const qv = new Float64Array(2);
    const est: VelocityEstimator = {
      q: 0,
      v: 0,
      reset(y0) { est.q = y0; est.v = 0; },
      update(y, uPrev, t) {
        // Predict: RK4 on (q, v)' = (v, f(q, v, u, t)) with u held (Hairer, Nørsett & Wanner, Table 1.2).
        rk4HeldStep(f, est.q, est.v, uPrev, t - T, T, qv);
        let qp = qv[0];
        const vp = qv[1];
        // Innovation; for angles wrapped to (-pi, pi], which unwraps the reading against the estimate.
        const e = diff(y, qp);
        qp += g1 * e;
        est.q = qp;
        est.v = vp + g2 * e;
      },
    };
    return est;
  }
  throw new RangeError(`estimator.kind must be 'difference', 'observer' or 'ideal', got ${(options as { kind: unknown }).kind}`);
}
