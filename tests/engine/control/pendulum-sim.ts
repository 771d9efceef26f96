// Closed-loop test rig: a pendulum q'' = -w0^2 sin q - c q' + d + g u, integrated with rk4Fixed
// (engine/ode/rk4.ts) between controller samples; the controller's u is held over each sample (ZOH).
import { rk4Fixed } from '../../../src-main/engine/ode/rk4.ts';
import type { EnergyFunction } from '../../../src-main/engine/types.ts';

/** l = 0.42 m, g = 9.81 m/s^2: w0^2 = 23.357142857143 s^-2 (references.md §5). */
export const W02 = 9.81 / 0.42;

/** H = v^2/2 - w0^2 cos q (the brief's pendulum energy, per unit inertia). */
export function pendulumEnergy(lambda = 0, offset = 0): EnergyFunction {
  return {
    coordinate: 'angle',
    H: (q, v) => 0.5 * v * v - W02 * Math.cos(q) + offset,
    grad: (q, v, out) => { out[0] = W02 * Math.sin(q); out[1] = v; },
    lambda,
  };
}

export interface SimOptions {
  q0: number; v0: number;
  /** Controller sample interval. */
  dt: number;
  /** Number of samples. */
  samples: number;
  /** RK4 steps per sample. */
  substeps?: number;
  /** Viscous damping c (per unit inertia). */
  c?: number;
  /** Constant disturbance acceleration. */
  d?: number;
  /** Input gain. */
  g?: number;
}

export interface SimTrace { t: Float64Array; q: Float64Array; v: Float64Array; u: Float64Array }

/** law(q, v, t) returns the input held over the next sample. */
export function simulatePendulum(law: (q: number, v: number, t: number) => number, o: SimOptions): SimTrace {
  const n = o.samples, sub = o.substeps ?? 10, c = o.c ?? 0, d = o.d ?? 0, g = o.g ?? 1;
  const tr: SimTrace = { t: new Float64Array(n + 1), q: new Float64Array(n + 1), v: new Float64Array(n + 1), u: new Float64Array(n) };
  let q = o.q0, v = o.v0;
  tr.q[0] = q; tr.v[0] = v;
  for (let k = 0; k < n; k++) {
    const t = k * o.dt;
    const u = law(q, v, t);
    tr.u[k] = u;
    const r = rk4Fixed((_t, y, dy) => { dy[0] = y[1]; dy[1] = -W02 * Math.sin(y[0]) - c * y[1] + d + g * u; }, t, [q, v], o.dt / sub, sub);
    q = r.y[sub * 2]; v = r.y[sub * 2 + 1];
    tr.t[k + 1] = (k + 1) * o.dt; tr.q[k + 1] = q; tr.v[k + 1] = v;
  }
  return tr;
}
