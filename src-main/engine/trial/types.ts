// Shapes shared by the closed-loop trial code: the plant and controller seen by the simulator,
// sensor and estimator settings, and the recorded trace. Plain data and interfaces only.
import type { Coordinate } from '../types.ts';

/**
 * The plant the simulator integrates: q'' = accel(q, v, u, t). Any object with this shape will
 * do (a plant from engine/plant, a model derived from H, a test rig written inline).
 */
export interface TrialPlant {
  coordinate: Coordinate;
  accel(q: number, v: number, u: number, t: number): number;
  /** The plant's own (true) energy when known, for reporting; the metrics use the model's H. */
  energy?(q: number, v: number): number;
}

/**
 * A sampled-data controller with explicit internal state. The simulator calls reset() once,
 * then step() once per controller period with the measured position, the estimated velocity,
 * the sample time and the period; the returned u is held (zero-order hold) until the next call.
 */
export interface Controller {
  reset(): void;
  step(q: number, v: number, t: number, dt: number): number;
  /** Supervisor stage after the last step (1, 2, ...), when the controller has stages. */
  stage?(): number;
}

/** Position sensor: an encoder or ADC with quantization and additive Gaussian noise. */
export interface SensorOptions {
  /** Resolution in bits over `range` (e.g. 12 bits over 2 pi for an angle encoder). */
  bits?: number;
  /** Span the bits cover, in the unit of q. Default 2 pi for angles; required with `bits` for linear. */
  range?: number;
  /** Quantization step in the unit of q (alternative to bits/range). 0 = no quantization. */
  step?: number;
  /** Standard deviation of the additive Gaussian noise, unit of q (added before quantization). */
  noiseStd?: number;
}

/**
 * How the controller's velocity is obtained from the measured positions.
 * - 'difference': backward difference of the unwrapped measured position, passed through a
 *   first-order low-pass with cutoff `cutoffHz` (default 10 Hz); y_k = y_{k-1} + a (d_k - y_{k-1}),
 *   a = 1 - exp(-2 pi fc T) (the exact discretisation of 1/(1 + s/(2 pi fc)) for a held input).
 * - 'observer': Luenberger observer on a model q'' = accel(q, v, u): one RK4 step of the model
 *   with the applied u per sample, then the correction q^ += T l1 e, v^ += T l2 e with the
 *   innovation e = y - q^ and l1 = 2 zeta wo, l2 = wo^2 (error dynamics s^2 + 2 zeta wo s + wo^2,
 *   wo = 2 pi `bandwidthHz`, default 10 Hz, zeta default 0.8).
 * - 'ideal': the controller sees the true q and v (tests only).
 */
export type EstimatorOptions =
  | { kind: 'difference'; cutoffHz?: number }
  | { kind: 'observer'; model: Pick<TrialPlant, 'accel'>; bandwidthHz?: number; zeta?: number }
  | { kind: 'ideal' };

/** A recorded closed-loop trace, decimated; columns share one length. q is the true (unwrapped) position. */
export interface Trace {
  t: Float64Array;
  q: Float64Array;
  v: Float64Array;
  /** Applied input (after delay), held over [t_k, t_k + decimation periods). */
  u: Float64Array;
  /** The model's H at the true state. */
  H: Float64Array;
  /** Supervisor stage, when the controller reports one. */
  stage?: Float64Array;
}
