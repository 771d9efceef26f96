// Level-hold controller: the SDRE energy-level law of design.md "SDRE on the energy coordinate"
// as a controller object with explicit internal state (previous u for the rate limit, integral
// state w), stepped once per controller sample; the caller holds u over the sample (ZOH).
// Per sample, with b = g dH/dv and z = H - H*:
//   plain law      u_fb = -k(b) z, k from levelHoldGain (scalar Riccati, energy-gain.ts);
//   integral law   state (z, w), w' = z: A = [[lambda, 0], [1, 0]], B = [b; 0], Q = diag(Qz, Qw),
//                  one 2x2 CARE per sample (care2.ts, with b^2 + eps^2 in G as in the plain law),
//                  u_fb = -(b / R) (X11 z + X12 w);
//   loss compensation u_ff = -lambda H* b / <b^2> when <b^2> is given (orbit-average.ts);
//   then saturation |u| <= uMax, then the rate limit |u - u_prev| <= rateMax dt.
// Anti-windup: conditional integration (clamping; Astrom & Hagglund, "Advanced PID Control",
// 2006, §3.5, from memory): w is frozen for a sample when the output is limited and the
// integrator's increment would push the command further past the limit; otherwise w += z dt
// (forward Euler, after u is computed). At the start (and after reset) u_prev = 0, w = 0.
import type { EnergyFunction } from '../types.ts';
import { care2, care2Work, CARE2_OK } from './care2.ts';
import { levelHoldGain } from './energy-gain.ts';
import type { LevelTarget } from './targets.ts';

export interface LevelHoldDesign {
  energy: EnergyFunction;
  /** Input gain g of the plant q' = v, v' = f(q, v) + g u. */
  inputGain: number;
  /** H*: a number or a LevelTarget. */
  target: number | LevelTarget;
  /** Weight on z^2 (Qz in the integral variant), > 0. */
  Q: number;
  /** Weight on u^2, > 0. */
  R: number;
  /** Sign regularisation: b / sqrt(b^2 + eps^2); 0 = the unregularised law. Default 0. */
  eps?: number;
  /** Koopman eigenvalue used by the law; default energy.lambda. */
  lambda?: number;
  /** |u| <= uMax. Default Infinity. */
  uMax?: number;
  /** |du/dt| <= rateMax, applied per sample. Default Infinity. */
  rateMax?: number;
  /** <b^2> on the orbit at H* (meanSquareInputGain); given: adds u_ff = -lambda H* b / <b^2>. */
  meanB2?: number;
  /** Integral action: weight Qw on w^2; anti-windup 'conditional' (default) or 'none' (for comparison only). */
  integral?: { Qw: number; antiWindup?: 'conditional' | 'none' };
}

export interface LevelHoldState { q: number; v: number; t: number }

export interface LevelHoldOutput {
  /** Input to hold over the next sample. */
  u: number;
  /** z = H - H*. */
  z: number;
  /** b = g dH/dv. */
  b: number;
  /** True when the saturation or the rate limit changed the command. */
  saturated: boolean;
  /** Integral state after this sample (0 without integral action). */
  w: number;
  /** False when the per-sample 2x2 CARE had no stabilizing solution (then u_fb = 0). */
  riccatiOk: boolean;
}

export interface LevelHold {
  /** One controller sample at state (q, v, t); dt is the sample interval. Writes into out if given. */
  step(state: LevelHoldState, dt: number, out?: LevelHoldOutput): LevelHoldOutput;
  /** u_prev = 0, w = 0. */
  reset(): void;
  /** The internal state, for inspection and export. */
  readonly internal: { uPrev: number; w: number };
  /** H* in use. */
  readonly targetEnergy: number;
}

export function makeLevelHold(design: LevelHoldDesign): LevelHold {
  if (design === null || typeof design !== 'object') throw new TypeError('design: expected a LevelHoldDesign object');
  const { energy } = design;
  if (energy === null || typeof energy !== 'object' || typeof energy.H !== 'function' || typeof energy.grad !== 'function') {
    throw new TypeError('design.energy: expected an EnergyFunction with H(q, v) and grad(q, v, out)');
  }
  const g = finite(design.inputGain, 'design.inputGain');
  if (g === 0) throw new RangeError('design.inputGain: expected a non-zero input gain, got 0');
  const Hstar = typeof design.target === 'number' ? finite(design.target, 'design.target')
    : finite(design.target?.energy, 'design.target.energy');
  const Q = positive(design.Q, 'design.Q');
  const R = positive(design.R, 'design.R');
  const eps = design.eps === undefined ? 0 : finite(design.eps, 'design.eps');
  if (eps < 0) throw new RangeError(`design.eps: expected >= 0, got ${eps}`);
  const lambda = finite(design.lambda ?? energy.lambda, design.lambda === undefined ? 'design.energy.lambda' : 'design.lambda');
  const uMax = design.uMax === undefined ? Infinity : positive(design.uMax, 'design.uMax', true);
  const rateMax = design.rateMax === undefined ? Infinity : positive(design.rateMax, 'design.rateMax', true);
  const meanB2 = design.meanB2 === undefined ? 0 : positive(design.meanB2, 'design.meanB2');
  const integral = design.integral !== undefined;
  const Qw = integral ? positive(design.integral?.Qw, 'design.integral.Qw') : 0;
  const aw = design.integral?.antiWindup ?? 'conditional';
  if (aw !== 'conditional' && aw !== 'none') throw new RangeError(`design.integral.antiWindup: expected 'conditional' or 'none', got ${String(aw)}`);
  const clamp = aw === 'conditional';
  const eps2 = eps * eps;

  const grad = new Float64Array(2);
  const aMat = new Float64Array([lambda, 0, 1, 0]);
  const gMat = new Float64Array(3);
  const qMat = new Float64Array([Q, 0, Qw]);
  const x = new Float64Array(3);
  const work = care2Work();
  const internal = { uPrev: 0, w: 0 };

  function step(state: LevelHoldState, dt: number, out?: LevelHoldOutput): LevelHoldOutput {
    if (!(dt > 0) || dt === Infinity) throw new RangeError(`dt: expected a positive finite sample interval, got ${dt}`);
    const q = state.q, v = state.v;
    energy.grad(q, v, grad);
    const b = g * grad[1];
    const z = energy.H(q, v) - Hstar;
    let ufb = 0, kw = 0, riccatiOk = true;
    if (!integral) {
      ufb = -levelHoldGain(lambda, b, Q, R, eps) * z;
    } else {
      gMat[0] = (b * b + eps2) / R;
      if (care2(aMat, gMat, qMat, x, work) === CARE2_OK) {
        kw = (b * x[1]) / R;
        ufb = -((b * x[0]) / R) * z - kw * internal.w;
      } else {
        riccatiOk = false;
      }
    }
    const uff = meanB2 > 0 ? (-lambda * Hstar * b) / meanB2 : 0;
    const cmd = ufb + uff;
    let u = cmd > uMax ? uMax : cmd < -uMax ? -uMax : cmd;
    const du = rateMax * dt;
    const lo = internal.uPrev - du, hi = internal.uPrev + du;
    if (u > hi) u = hi; else if (u < lo) u = lo;
    const saturated = u !== cmd;
    if (integral) {
      const dw = z * dt;
      // Clamping: skip the update when limited and -kw dw has the sign of (cmd - u).
      if (!clamp || !saturated || -kw * dw * (cmd - u) <= 0) internal.w += dw;
    }
    internal.uPrev = u;
    const o = out ?? { u: 0, z: 0, b: 0, saturated: false, w: 0, riccatiOk: true };
    o.u = u; o.z = z; o.b = b; o.saturated = saturated; o.w = internal.w; o.riccatiOk = riccatiOk;
    return o;
  }

  return {
    step,
    reset() { internal.uPrev = 0; internal.w = 0; },
    internal,
    targetEnergy: Hstar,
  };
}

function finite(v: unknown, name: string): number {
  if (typeof v !== 'number' || !Number.isFinite(v)) throw new RangeError(`${name}: expected a finite number, got ${String(v)}`);
  return v;
}

function positive(v: unknown, name: string, allowInfinity = false): number {
  if (typeof v !== 'number' || !(v > 0) || (!allowInfinity && v === Infinity)) {
    throw new RangeError(`${name}: expected a positive${allowInfinity ? '' : ' finite'} number, got ${String(v)}`);
  }
  return v;
}
