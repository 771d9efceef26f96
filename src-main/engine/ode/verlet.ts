// Störmer–Verlet (velocity Verlet) for q'' = a(t, q): Hairer, Lubich & Wanner, "Geometric Numerical
// Integration" (2nd ed.), §I.3.2, eq. (3.4) in its "kick–drift–kick" form:
//   v_{n+1/2} = v_n + (h/2) a(t_n, q_n)
//   q_{n+1}   = q_n + h v_{n+1/2}
//   v_{n+1}   = v_{n+1/2} + (h/2) a(t_{n+1}, q_{n+1})
// Second order, symmetric, and symplectic for a = -grad V(q) (so the energy error stays bounded,
// O(h^2), with no drift over long times: GNI §I.3 and ch. IX). One evaluation of a per step: the
// acceleration at the end of a step is reused at the start of the next.
//
// Scope: the acceleration may depend on q and t only. Velocity-dependent forces (damping,
// a(q, v, t)) make the second half-kick implicit in v_{n+1}; this explicit form is then neither
// symmetric nor symplectic and drops to first order, so it is not offered here: integrate damped or
// forced-by-velocity systems with solveDopri5.
import { argError, checkFinite, checkFunction, checkInteger, checkPositive, checkVector } from './check-args.ts';

/** Acceleration a(t, q): writes d^2q/dt^2 (length n) into out; must not keep references to q or out. */
export type Accel = (t: number, q: Float64Array, out: Float64Array) => void;

export interface VerletOptions {
  /** Step size (positive). */
  h: number;
  /** Number of steps. */
  steps: number;
  /** Initial time (default 0). */
  t0?: number;
  /** Keep every stride-th step (default 1; the first point is always kept, and the last whenever steps is a multiple of stride). */
  stride?: number;
  /** Called after each step with t, q, v (the solver's buffers: read, do not keep). Return false to stop. */
  onStep?: (t: number, q: Float64Array, v: Float64Array) => void | boolean;
}

export interface VerletResult {
  status: 'done' | 'non-finite' | 'stopped';
  message: string;
  /** Kept times. */
  t: Float64Array;
  /** Positions and velocities at the kept times, row-major: q[k * n + i]. */
  q: Float64Array;
  v: Float64Array;
  /** Number of coordinates. */
  n: number;
  /** Steps taken and acceleration evaluations. */
  nSteps: number;
  nfev: number;
}

const FN = 'solveVerlet';

/** Integrates q'' = accel(t, q) from (t0, q0, v0) with `steps` steps of size h. q0 and v0 are copied. */
export function solveVerlet(accel: Accel, q0: ArrayLike<number>, v0: ArrayLike<number>, options: VerletOptions): VerletResult {
  checkFunction(FN, 'accel', accel);
  const q = checkVector(FN, 'q0', q0);
  const n = q.length;
  const v = checkVector(FN, 'v0', v0, n);
  if (options === null || typeof options !== 'object') throw argError(FN, 'options', 'an object {h, steps, t0?, stride?, onStep?}', options);
  const h = checkPositive(FN, 'options.h', options.h);
  const steps = checkInteger(FN, 'options.steps', options.steps, 0);
  const t0 = options.t0 === undefined ? 0 : checkFinite(FN, 'options.t0', options.t0);
  const stride = options.stride === undefined ? 1 : checkInteger(FN, 'options.stride', options.stride, 1);
  const onStep = options.onStep;
  if (onStep !== undefined) checkFunction(FN, 'options.onStep', onStep);

  const kept = Math.floor(steps / stride) + 1;
  const tOut = new Float64Array(kept), qOut = new Float64Array(kept * n), vOut = new Float64Array(kept * n);
  tOut[0] = t0;
  qOut.set(q, 0);
  vOut.set(v, 0);
  let nKept = 1;
  const a = new Float64Array(n);
  accel(t0, q, a);
  let nfev = 1;
  let status: VerletResult['status'] = 'done';
  let message = '';
  let k = 0;
  const hh = 0.5 * h;
  for (k = 1; k <= steps; k++) {
    const t = t0 + k * h;
    for (let i = 0; i < n; i++) {
      v[i] += hh * a[i]; // half kick
      q[i] += h * v[i]; // drift
    }
    accel(t, q, a);
    nfev++;
    let finite = true;
    for (let i = 0; i < n; i++) {
      v[i] += hh * a[i]; // half kick
      if (!Number.isFinite(v[i]) || !Number.isFinite(q[i])) finite = false;
    }
    if (k % stride === 0) {
      tOut[nKept] = t;
      qOut.set(q, nKept * n);
      vOut.set(v, nKept * n);
      nKept++;
    }
    if (!finite) {
      status = 'non-finite';
      message = `non-finite state at step ${k} (t = ${t})`;
      break;
    }
    if (onStep && onStep(t, q, v) === false) {
      status = 'stopped';
      message = `stopped by options.onStep at step ${k} (t = ${t})`;
      break;
    }
  }
  const nSteps = Math.min(k, steps);
  if (!message) message = `${steps} steps of h = ${h} to t = ${t0 + steps * h}`;
  return {
    status, message, t: tOut.slice(0, nKept), q: qOut.slice(0, nKept * n), v: vOut.slice(0, nKept * n), n, nSteps, nfev,
  };
}
