// The energy resolution the sensor allows: the position error (uniform quantization, variance
// step^2 / 12, plus Gaussian noise) and the velocity-estimate error it causes, propagated to H by
// first-order error propagation, sigma_H^2 = (dH/dq sigma_q)^2 + (dH/dv sigma_v)^2 (JCGM 100:2008
// "GUM", §5.1.2), plus the second-order bias |H_qq sigma_q^2 + H_vv sigma_v^2| / 2 that dominates
// near a well bottom where the gradient vanishes. Evaluated at points of the orbit at the target
// level and reported as the RMS over those points (the controller sees H this noisy along its orbit).
import type { EnergyFunction } from '../types.ts';
import type { EstimatorOptions } from './types.ts';
import { DEFAULT_CUTOFF_HZ, DEFAULT_OBSERVER_HZ, DEFAULT_OBSERVER_ZETA } from './velocity-estimator.ts';

export interface SensorSigmas { sigmaQ: number; sigmaV: number }

/**
 * Standard deviations of the measured position and the estimated velocity for a sensor with
 * quantization `step` and noise `noiseStd`, sampled at period T, through the given estimator.
 * Difference + first-order low-pass (a = 1 - exp(-2 pi fc T)), white position error of variance s^2:
 *   var(v^) = (a s / T)^2 * 2 / (2 - a)          (sum of the squared impulse response, exact).
 * Observer with l1 = 2 zeta wo, l2 = wo^2, continuous-time approximation (noise PSD s^2 T):
 *   var(v^) = s^2 T wo^3 / (4 zeta)               (integral of |l2 s / (s^2 + l1 s + l2)|^2).
 */
export function sensorSigmas(step: number, noiseStd: number, T: number, estimator: EstimatorOptions = { kind: 'difference' }): SensorSigmas {
  if (!(step >= 0)) throw new RangeError(`sensorSigmas: step must be >= 0, got ${step}`);
  if (!(noiseStd >= 0)) throw new RangeError(`sensorSigmas: noiseStd must be >= 0, got ${noiseStd}`);
  if (!(T > 0)) throw new RangeError(`sensorSigmas: T must be > 0, got ${T}`);
  const s2 = (step * step) / 12 + noiseStd * noiseStd;
  const s = Math.sqrt(s2);
  if (estimator.kind === 'ideal') return { sigmaQ: 0, sigmaV: 0 };
  if (estimator.kind === 'difference') {
    const a = 1 - Math.exp(-2 * Math.PI * (estimator.cutoffHz ?? DEFAULT_CUTOFF_HZ) * T);
    return { sigmaQ: s, sigmaV: ((a * s) / T) * Math.sqrt(2 / (2 - a)) };
  }
  const wo = 2 * Math.PI * (estimator.bandwidthHz ?? DEFAULT_OBSERVER_HZ);
  const zeta = estimator.zeta ?? DEFAULT_OBSERVER_ZETA;
  return { sigmaQ: s, sigmaV: Math.sqrt((s2 * T * wo ** 3) / (4 * zeta)) };
}

/** RMS energy uncertainty over the given points (q[i], v[i]) of an orbit. */
export function energyResolution(energy: EnergyFunction, q: ArrayLike<number>, v: ArrayLike<number>, sigmas: SensorSigmas): number {
  const n = q.length;
  if (v.length !== n) throw new RangeError(`energyResolution: q and v must share one length (got ${n}, ${v.length})`);
  if (n === 0) throw new RangeError('energyResolution: needs at least one orbit point');
  const { sigmaQ, sigmaV } = sigmas;
  const g = new Float64Array(2);
  // Second derivatives by central differences of the gradient (steps scaled to the errors).
  const dq = Math.max(sigmaQ, 1e-6), dv = Math.max(sigmaV, 1e-6);
  const gp = new Float64Array(2), gm = new Float64Array(2);
  let sum = 0;
  for (let i = 0; i < n; i++) {
    energy.grad(q[i], v[i], g);
    energy.grad(q[i] + dq, v[i], gp); energy.grad(q[i] - dq, v[i], gm);
    const hqq = (gp[0] - gm[0]) / (2 * dq);
    energy.grad(q[i], v[i] + dv, gp); energy.grad(q[i], v[i] - dv, gm);
    const hvv = (gp[1] - gm[1]) / (2 * dv);
    const first = Math.hypot(g[0] * sigmaQ, g[1] * sigmaV);
    const second = 0.5 * Math.abs(hqq * sigmaQ * sigmaQ + hvv * sigmaV * sigmaV);
    const e = first + second;
    sum += e * e;
  }
  return Math.sqrt(sum / n);
}
