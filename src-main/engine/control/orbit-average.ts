// <b^2>: the time average of b(x)^2 = (g dH/dv)^2 over one period of the free undamped orbit at
// the level H*, for the loss compensation u_ff = -lambda H* b / <b^2> (design.md "SDRE on the
// energy coordinate"). Method (our choice): integrate the orbit q' = v, v' = f(q, v) from a point
// (q0, v0 > 0) of the level set with classic RK4 (Hairer, Norsett & Wanner, Solving ODEs I, §II.1)
// on the augmented state (q, v, I), I' = b^2, so the integral is fourth-order accurate too. The
// period ends when q returns to q0 moving upward (libration) or, for an angle, reaches q0 + 2 pi
// (rotation); the crossing is located on the cubic Hermite interpolant of q, and I is read off
// the Hermite interpolant of I at the same instant. The step is refined to period / stepsPerPeriod
// until it stops changing. v0 solves H(q0, v0) = H* by bisection (H grows with |v|: design.md §2).
import type { EnergyFunction } from '../types.ts';

export interface OrbitAverageProblem {
  energy: EnergyFunction;
  /** Undamped acceleration of the model, v' = f(q, v) with u = 0 and no losses. */
  accel: (q: number, v: number) => number;
  /** Input gain g (plant v' = f + g u). */
  inputGain: number;
  /** The level H* of the orbit. */
  level: number;
  /** A position the orbit passes through (e.g. the bottom of the well); H(q0, 0) < H* is required. */
  q0: number;
}

export interface OrbitAverageOptions {
  /** RK4 steps per period in the final pass. Default 4000. */
  stepsPerPeriod?: number;
  /** Give up after this many steps in one pass. Default 2_000_000. */
  maxSteps?: number;
}

export interface OrbitAverageResult {
  status: 'ok' | 'no-orbit' | 'not-closed';
  message: string;
  /** <b^2> over one period (NaN on failure). */
  meanB2: number;
  /** Period of the orbit, in time units of accel. */
  period: number;
  kind: 'libration' | 'rotation' | null;
  /** Velocity at q0 on the level set. */
  v0: number;
  /** |change of meanB2| between the last two passes, relative: an error estimate. */
  relativeChange: number;
}

export function meanSquareInputGain(problem: OrbitAverageProblem, options: OrbitAverageOptions = {}): OrbitAverageResult {
  if (problem === null || typeof problem !== 'object') throw new TypeError('problem: expected {energy, accel, inputGain, level, q0}');
  const { energy, accel, inputGain: g, level, q0 } = problem;
  if (energy === null || typeof energy !== 'object' || typeof energy.H !== 'function' || typeof energy.grad !== 'function') {
    throw new TypeError('energy: expected an EnergyFunction with H(q, v) and grad(q, v, out)');
  }
  if (typeof accel !== 'function') throw new TypeError('accel: expected a function f(q, v) returning the acceleration');
  if (!Number.isFinite(g) || g === 0) throw new RangeError(`inputGain: expected a finite non-zero number, got ${g}`);
  if (!Number.isFinite(level)) throw new RangeError(`level: expected a finite energy, got ${level}`);
  if (!Number.isFinite(q0)) throw new RangeError(`q0: expected a finite position, got ${q0}`);
  const N = options.stepsPerPeriod ?? 4000;
  if (!Number.isInteger(N) || N < 50) throw new RangeError(`options.stepsPerPeriod: expected an integer >= 50, got ${N}`);
  const maxSteps = options.maxSteps ?? 2_000_000;
  if (!Number.isInteger(maxSteps) || maxSteps < 100) throw new RangeError(`options.maxSteps: expected an integer >= 100, got ${maxSteps}`);

  const fail = (status: 'no-orbit' | 'not-closed', message: string, v0 = NaN): OrbitAverageResult =>
    ({ status, message, meanB2: NaN, period: NaN, kind: null, v0, relativeChange: NaN });

  // v0 > 0 with H(q0, v0) = H*.
  const h00 = energy.H(q0, 0);
  if (!(h00 < level)) return fail('no-orbit', `H(q0, 0) = ${h00} is not below the level ${level}: the orbit does not pass q0 = ${q0}`);
  let lo = 0, hi = 1;
  for (let k = 0; energy.H(q0, hi) < level; k++) {
    if (k > 200) return fail('no-orbit', `no velocity reaches the level ${level} at q0 = ${q0}`);
    lo = hi; hi *= 2;
  }
  for (let k = 0; k < 200; k++) {
    const mid = 0.5 * (lo + hi);
    if (mid === lo || mid === hi) break;
    if (energy.H(q0, mid) < level) lo = mid; else hi = mid;
  }
  const v0 = 0.5 * (lo + hi);

  // First step size from the linear stiffness at q0 (or the speed, for fast orbits).
  const dq = 1e-4 * Math.max(1, Math.abs(q0));
  const stiff = Math.abs(accel(q0 + dq, 0) - accel(q0 - dq, 0)) / (2 * dq);
  const omega = Math.max(Math.sqrt(stiff), v0 / Math.max(1, Math.abs(q0)), 1e-6);
  let h = (2 * Math.PI) / omega / 400;
  const isAngle = energy.coordinate === 'angle';
  const grad = new Float64Array(2);
  const b2 = (q: number, v: number): number => { energy.grad(q, v, grad); const b = g * grad[1]; return b * b; };

  let prev: { T: number; I: number; kind: 'libration' | 'rotation' } | null = null;
  for (let pass = 0; pass < 12; pass++) {
    const r = onePeriod(accel, b2, q0, v0, h, isAngle, maxSteps);
    if (r === null) { h /= 4; continue; }
    const mean = r.I / r.T;
    const change = prev ? Math.abs(mean - prev.I / prev.T) / Math.abs(mean) : NaN;
    const hNext = r.T / N;
    if (Math.abs(hNext - h) <= 0.01 * h) {
      return { status: 'ok', message: `${r.kind}, period ${r.T.toPrecision(10)}`, meanB2: mean, period: r.T, kind: r.kind, v0, relativeChange: change };
    }
    prev = r;
    h = hNext;
  }
  return fail('not-closed', `the orbit at level ${level} did not close within ${maxSteps} steps (near a separatrix, or unbounded?)`, v0);
}

/** One period by RK4 on (q, v, I); null when it does not close within maxSteps. */
function onePeriod(f: (q: number, v: number) => number, b2: (q: number, v: number) => number,
  q0: number, v0: number, h: number, isAngle: boolean, maxSteps: number): { T: number; I: number; kind: 'libration' | 'rotation' } | null {
  let q = q0, v = v0, I = 0, t = 0;
  let a = f(q, v), c = b2(q, v);
  const top = q0 + 2 * Math.PI;
  for (let k = 0; k < maxSteps; k++) {
    // RK4 on q' = v, v' = f(q, v), I' = b2(q, v).
    const k1q = v, k1v = a, k1i = c;
    const q2 = q + 0.5 * h * k1q, v2 = v + 0.5 * h * k1v;
    const k2q = v2, k2v = f(q2, v2), k2i = b2(q2, v2);
    const q3 = q + 0.5 * h * k2q, v3 = v + 0.5 * h * k2v;
    const k3q = v3, k3v = f(q3, v3), k3i = b2(q3, v3);
    const q4 = q + h * k3q, v4 = v + h * k3v;
    const k4q = v4, k4v = f(q4, v4), k4i = b2(q4, v4);
    const qn = q + (h / 6) * (k1q + 2 * k2q + 2 * k3q + k4q);
    const vn = v + (h / 6) * (k1v + 2 * k2v + 2 * k3v + k4v);
    const In = I + (h / 6) * (k1i + 2 * k2i + 2 * k3i + k4i);
    if (!Number.isFinite(qn) || !Number.isFinite(vn)) return null;
    const an = f(qn, vn), cn = b2(qn, vn);
    let target = NaN;
    let kind: 'libration' | 'rotation' = 'libration';
    if (q < q0 && qn >= q0) target = q0;
    else if (isAngle && q < top && qn >= top) { target = top; kind = 'rotation'; }
    if (target === target) {
      const th = hermiteRoot(q, v, qn, vn, h, target);
      return { T: t + th * h, I: hermite(I, c, In, cn, h, th), kind };
    }
    q = qn; v = vn; I = In; a = an; c = cn; t += h;
  }
  return null;
}

/** Cubic Hermite interpolant on [0, 1] of y with end slopes dy0, dy1 (per unit time, step h). */
function hermite(y0: number, dy0: number, y1: number, dy1: number, h: number, s: number): number {
  const s2 = s * s, s3 = s2 * s;
  return (2 * s3 - 3 * s2 + 1) * y0 + (s3 - 2 * s2 + s) * h * dy0 + (-2 * s3 + 3 * s2) * y1 + (s3 - s2) * h * dy1;
}

/** s in [0, 1] where the Hermite interpolant of q crosses target (sign change at the ends), by bisection. */
function hermiteRoot(q0: number, v0: number, q1: number, v1: number, h: number, target: number): number {
  let lo = 0, hi = 1;
  for (let k = 0; k < 60; k++) {
    const mid = 0.5 * (lo + hi);
    if (hermite(q0, v0, q1, v1, h, mid) < target) lo = mid; else hi = mid;
  }
  return 0.5 * (lo + hi);
}
