// LQR baseline about an equilibrium (q_e, 0): the plant is linearised by central differences,
// A = [[0, 1], [da/dq, da/dv]], B = [0; da/du], and u = -K (x - x_e) with K from the CARE solver
// of engine/control (Kalman, "Contributions to the theory of optimal control", Bol. Soc. Mat.
// Mexicana 5 (1960) 102–119). State weight: Q times the Hessian of H at the equilibrium (the
// quadratic part of the energy, so Q x'Hx/2 ~ Q z near the well bottom; common practice), input
// weight R; saturated at |u| <= uMax like the other laws. Angles: the error q - q_e is wrapped.
import type { EnergyFunction } from '../types.ts';
import type { Controller, TrialPlant } from './types.ts';
import { solveCare, type CareResult } from '../control/care.ts';
import { wrapAngle } from './sensor.ts';

export interface LqrBaselineOptions {
  /** The model the design linearises (the plant as the designer knows it). */
  model: Pick<TrialPlant, 'accel' | 'coordinate'>;
  energy: EnergyFunction;
  /** Equilibrium position q_e (a well bottom). */
  equilibrium: number;
  Q?: number;
  R?: number;
  uMax?: number;
}

export interface LqrBaselineResult {
  status: 'ok' | 'failed';
  message: string;
  /** The controller (null when the CARE has no stabilizing solution). */
  controller: Controller | null;
  A: number[][];
  B: number[][];
  Qx: number[][];
  K: [number, number] | null;
  care: CareResult;
}

export function lqrBaseline(options: LqrBaselineOptions): LqrBaselineResult {
  const { model, energy } = options;
  const qe = options.equilibrium;
  if (!Number.isFinite(qe)) throw new RangeError(`lqrBaseline: equilibrium must be a finite number, got ${qe}`);
  const Qw = options.Q ?? 1, Rw = options.R ?? 1, uMax = options.uMax ?? Infinity;
  if (!(Qw > 0) || !(Rw > 0)) throw new RangeError(`lqrBaseline: Q and R must be > 0, got ${Qw}, ${Rw}`);
  if (!(uMax > 0)) throw new RangeError(`lqrBaseline: uMax must be > 0, got ${uMax}`);
  const a = (q: number, v: number, u: number) => model.accel(q, v, u, 0);
  const hq = 1e-5 * Math.max(1, Math.abs(qe)), hv = 1e-5, hu = 1e-5;
  const aq = (a(qe + hq, 0, 0) - a(qe - hq, 0, 0)) / (2 * hq);
  const av = (a(qe, hv, 0) - a(qe, -hv, 0)) / (2 * hv);
  const au = (a(qe, 0, hu) - a(qe, 0, -hu)) / (2 * hu);
  const g = new Float64Array(2), gp = new Float64Array(2), gm = new Float64Array(2);
  energy.grad(qe, 0, g);
  energy.grad(qe + hq, 0, gp); energy.grad(qe - hq, 0, gm);
  const Hqq = (gp[0] - gm[0]) / (2 * hq);
  const Hqv1 = (gp[1] - gm[1]) / (2 * hq);
  energy.grad(qe, hv, gp); energy.grad(qe, -hv, gm);
  const Hvv = (gp[1] - gm[1]) / (2 * hv);
  const Hqv = 0.5 * (Hqv1 + (gp[0] - gm[0]) / (2 * hv));
  const A = [[0, 1], [aq, av]];
  const B = [[0], [au]];
  const Qx = [[Qw * Hqq, Qw * Hqv], [Qw * Hqv, Qw * Hvv]];
  const care = solveCare({ A, B, Q: Qx, R: [[Rw]] });
  if (care.status !== 'ok' || !care.K) {
    return { status: 'failed', message: `LQR baseline: ${care.message}`, controller: null, A, B, Qx, K: null, care };
  }
  const k1 = care.K[0][0], k2 = care.K[0][1];
  const angle = model.coordinate === 'angle';
  const controller: Controller = {
    reset() {},
    step(q, v) {
      const e = angle ? wrapAngle(q - qe) : q - qe;
      const u = -(k1 * e + k2 * v);
      return u > uMax ? uMax : u < -uMax ? -uMax : u;
    },
  };
  return { status: 'ok', message: 'stabilizing LQR gain found', controller, A, B, Qx, K: [k1, k2], care };
}
