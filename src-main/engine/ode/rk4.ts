// Classic fixed-step fourth-order Runge–Kutta (Hairer, Nørsett & Wanner, "Solving ODEs I", §II.1, Table 1.2).
import type { Rhs } from '../types.ts';

/** Work arrays for rk4Step, allocated once per state dimension. */
export interface Rk4Work { k1: Float64Array; k2: Float64Array; k3: Float64Array; k4: Float64Array; tmp: Float64Array }

export function rk4Work(n: number): Rk4Work {
  return { k1: new Float64Array(n), k2: new Float64Array(n), k3: new Float64Array(n), k4: new Float64Array(n), tmp: new Float64Array(n) };
}

/** One RK4 step from (t, y) with step h; writes the new state into out (may alias y). */
export function rk4Step(rhs: Rhs, t: number, y: Float64Array, h: number, out: Float64Array, w: Rk4Work): void {
  const n = y.length;
  const { k1, k2, k3, k4, tmp } = w;
  rhs(t, y, k1);
  for (let i = 0; i < n; i++) tmp[i] = y[i] + 0.5 * h * k1[i];
  rhs(t + 0.5 * h, tmp, k2);
  for (let i = 0; i < n; i++) tmp[i] = y[i] + 0.5 * h * k2[i];
  rhs(t + 0.5 * h, tmp, k3);
  for (let i = 0; i < n; i++) tmp[i] = y[i] + h * k3[i];
  rhs(t + h, tmp, k4);
  for (let i = 0; i < n; i++) out[i] = y[i] + (h / 6) * (k1[i] + 2 * k2[i] + 2 * k3[i] + k4[i]);
}

export interface FixedStepResult {
  /** Sample times t0 + k h, k = 0..steps. */
  t: Float64Array;
  /** States, row-major: y[k * n + i] is component i at time t[k]. */
  y: Float64Array;
  n: number;
}

/** Integrates `steps` RK4 steps of size h from (t0, y0). y0 is not modified. */
export function rk4Fixed(rhs: Rhs, t0: number, y0: ArrayLike<number>, h: number, steps: number): FixedStepResult {
  if (!(h > 0) || !Number.isFinite(h)) throw new RangeError(`rk4Fixed: step h must be a positive finite number, got ${h}`);
  if (!Number.isInteger(steps) || steps < 0) throw new RangeError(`rk4Fixed: steps must be a non-negative integer, got ${steps}`);
  const n = y0.length;
  const w = rk4Work(n);
  const t = new Float64Array(steps + 1);
  const y = new Float64Array((steps + 1) * n);
  const cur = Float64Array.from(y0);
  y.set(cur, 0);
  t[0] = t0;
  for (let k = 1; k <= steps; k++) {
    rk4Step(rhs, t0 + (k - 1) * h, cur, h, cur, w);
    t[k] = t0 + k * h;
    y.set(cur, k * n);
  }
  return { t, y, n };
}
