// Adaptive Dormand–Prince 5(4) integrator with FSAL, step-size control, dense output and events.
// Method: Dormand & Prince, J. Comput. Appl. Math. 6 (1980) 19–26. Step-size control, starting step,
// continuous extension: Hairer, Nørsett & Wanner, "Solving ODEs I" (2nd ed.), §II.4–§II.6.
// Events with direction/terminal flags follow the interface of SciPy's solve_ivp.
import type { Rhs } from '../types.ts';
import { brentRoot } from './brent.ts';
import { argError, checkFinite, checkFunction, checkInteger, checkPositive, checkTolerance, checkVector } from './check-args.ts';
import {
  A21, A31, A32, A41, A42, A43, A51, A52, A53, A54, A61, A62, A63, A64, A65, B1, B3, B4, B5, B6,
  C2, C3, C4, C5, D1, D3, D4, D5, D6, D7, E1, E3, E4, E5, E6, E7, dopri5Interp,
} from './dopri5-tableau.ts';
import { checkEvents, crosses, type EventHit, type OdeEvent } from './events.ts';
import { GrowableF64 } from './grow.ts';
import { initialStep } from './initial-step.ts';

export type OdeStatus = 'done' | 'event' | 'max-steps' | 'step-too-small' | 'non-finite' | 'stopped';

export interface Dopri5Options {
  /** Relative tolerance, one or per component (default 1e-6; values below 100 eps are raised to 100 eps with a warning). */
  rtol?: number | ArrayLike<number>;
  /** Absolute tolerance, one or per component (default 1e-9). */
  atol?: number | ArrayLike<number>;
  /** Safety factor on the optimal step (default 0.9). */
  safety?: number;
  /** Smallest step ratio h_new/h (default 0.2). */
  minFactor?: number;
  /** Largest step ratio h_new/h (default 10; 1 right after a rejected step). */
  maxFactor?: number;
  /**
   * Weight of the previous error in the step-size (PI) controller, 0 <= beta <= 0.2 (default 0.04, the
   * value of Hairer's DOPRI5 code; HNW §IV.2, Gustafsson's "PI" control). 0 gives the classic controller
   * h_new = h * safety * err^(-1/5) of HNW §II.4; a small beta damps the oscillating step sizes (and the
   * many rejections) that the classic controller shows at loose tolerances.
   */
  beta?: number;
  /** Largest step magnitude (default |t1 - t0|). */
  hMax?: number;
  /** First step magnitude (default: HNW §II.4 starting-step algorithm). */
  h0?: number;
  /** Largest number of attempted steps, accepted plus rejected (default 1 000 000). */
  maxSteps?: number;
  /** Output times, inside tSpan, strictly monotone in the direction of integration (default: every accepted step). */
  tEval?: ArrayLike<number>;
  /** Without tEval: false keeps only the first and the last point (default true: every accepted step). */
  saveSteps?: boolean;
  /** Keep the interpolant of every step and return it as `sol` (default false). */
  dense?: boolean;
  /** Event functions; see OdeEvent. */
  events?: OdeEvent[];
  /** Absolute time tolerance of event location on the interpolant (default 1e-12). */
  eventTol?: number;
  /**
   * Called after each accepted step with the new time, state and the step taken. y is the solver's
   * buffer: read it during the call, do not keep or modify it. Return false to stop (status 'stopped').
   */
  onStep?: (t: number, y: Float64Array, h: number) => void | boolean;
}

export interface OdeResult {
  status: OdeStatus;
  message: string;
  /** Output times. */
  t: Float64Array;
  /** Output states, row-major: y[k * n + i] is component i at time t[k]. */
  y: Float64Array;
  /** State dimension. */
  n: number;
  /** Where the integration ended and the state there (also when it ended early). */
  tFinal: number;
  yFinal: Float64Array;
  /** Right-hand-side evaluations. */
  nfev: number;
  /** Accepted steps. */
  nSteps: number;
  /** Rejected step attempts (error too large, or non-finite stage values). */
  nRejected: number;
  /** Last step size accepted (signed), 0 if none. */
  hLast: number;
  /** Located events in time order. */
  events: EventHit[];
  warnings: string[];
  /** With options.dense: the interpolant on [t0, tFinal]; throws RangeError outside. */
  sol?: (t: number) => Float64Array;
}

const FN = 'solveDopri5';
const KNOWN = new Set(['rtol', 'atol', 'safety', 'minFactor', 'maxFactor', 'beta', 'hMax', 'h0', 'maxSteps', 'tEval', 'saveSteps', 'dense', 'events', 'eventTol', 'onStep']);
/** Error-estimator order of the embedded pair: err = O(h^5), so the step ratio uses the exponent 1/5. */
const ERR_EXP = 1 / 5;
/** Consecutive non-finite stage values tolerated (each shrinks h by minFactor) before giving up. */
const MAX_NONFINITE_RETRIES = 20;

/**
 * Integrates dy/dt = rhs(t, y) from tSpan[0] to tSpan[1] (backwards when tSpan[1] < tSpan[0]).
 * y0 is copied, never modified. Bad arguments throw a RangeError naming the argument; numerical
 * trouble ends the run with a status ('max-steps', 'step-too-small', 'non-finite') and a message.
 * Limitation: an event function that changes sign twice within one step is not seen; bound the
 * step with hMax if events can come that close together.
 */
export function solveDopri5(rhs: Rhs, tSpan: readonly [number, number], y0: ArrayLike<number>, options: Dopri5Options = {}): OdeResult {
  // ---- validation at the door ----
  checkFunction(FN, 'rhs', rhs);
  if (!Array.isArray(tSpan) || tSpan.length !== 2) throw argError(FN, 'tSpan', 'an array [t0, t1]', tSpan);
  const t0 = checkFinite(FN, 'tSpan[0]', tSpan[0]);
  const t1 = checkFinite(FN, 'tSpan[1]', tSpan[1]);
  if (t0 === t1) throw argError(FN, 'tSpan[1]', `different from tSpan[0] = ${t0}`, t1);
  const yStart = checkVector(FN, 'y0', y0);
  const n = yStart.length;
  if (options === null || typeof options !== 'object') throw argError(FN, 'options', 'an object', options);
  for (const key of Object.keys(options)) {
    if (!KNOWN.has(key)) throw new RangeError(`${FN}: options.${key} is not an option (known: ${[...KNOWN].join(', ')})`);
  }
  const warnings: string[] = [];
  const rtol = checkTolerance(FN, 'options.rtol', options.rtol ?? 1e-6, n, false);
  const atol = checkTolerance(FN, 'options.atol', options.atol ?? 1e-9, n, true);
  const rtolFloor = 100 * Number.EPSILON;
  for (let i = 0; i < n; i++) {
    if (rtol[i] < rtolFloor) {
      warnings.push(`rtol[${i}] = ${rtol[i]} is below 100 eps; raised to ${rtolFloor}`);
      rtol[i] = rtolFloor;
    }
  }
  const safety = options.safety ?? 0.9;
  if (!(safety > 0 && safety < 1)) throw argError(FN, 'options.safety', 'a number in (0, 1)', safety);
  const minFactor = options.minFactor ?? 0.2;
  if (!(minFactor > 0 && minFactor < 1)) throw argError(FN, 'options.minFactor', 'a number in (0, 1)', minFactor);
  const maxFactor = options.maxFactor ?? 10;
  if (!(maxFactor > 1 && Number.isFinite(maxFactor))) throw argError(FN, 'options.maxFactor', 'a finite number > 1', maxFactor);
  const beta = options.beta ?? 0.04;
  if (!(beta >= 0 && beta <= 0.2)) throw argError(FN, 'options.beta', 'a number in [0, 0.2]', beta);
  // Exponents of the PI controller: h_new = h * safety * err^-(1/5 - 0.75 beta) * errOld^beta (HNW §IV.2).
  const expErr = ERR_EXP - 0.75 * beta;
  const span = Math.abs(t1 - t0);
  const hMax = options.hMax === undefined ? span : checkPositive(FN, 'options.hMax', options.hMax);
  const h0 = options.h0 === undefined ? undefined : checkPositive(FN, 'options.h0', options.h0);
  const maxSteps = options.maxSteps === undefined ? 1_000_000 : checkInteger(FN, 'options.maxSteps', options.maxSteps, 1);
  const eventTol = options.eventTol === undefined ? 1e-12 : checkPositive(FN, 'options.eventTol', options.eventTol);
  const saveSteps = options.saveSteps ?? true;
  if (typeof saveSteps !== 'boolean') throw argError(FN, 'options.saveSteps', 'a boolean', saveSteps);
  const wantDense = options.dense ?? false;
  if (typeof wantDense !== 'boolean') throw argError(FN, 'options.dense', 'a boolean', wantDense);
  const onStep = options.onStep;
  if (onStep !== undefined) checkFunction(FN, 'options.onStep', onStep);
  const ev = checkEvents(FN, options.events);
  const nEv = ev.g.length;
  const dir = t1 > t0 ? 1 : -1;
  let tEval: Float64Array | undefined;
  if (options.tEval !== undefined) {
    tEval = checkVector(FN, 'options.tEval', options.tEval);
    const lo = Math.min(t0, t1), hi = Math.max(t0, t1);
    for (let j = 0; j < tEval.length; j++) {
      if (tEval[j] < lo || tEval[j] > hi) throw new RangeError(`${FN}: options.tEval[${j}] must lie in tSpan [${t0}, ${t1}], got ${tEval[j]}`);
      if (j > 0 && (tEval[j] - tEval[j - 1]) * dir <= 0) {
        throw new RangeError(`${FN}: options.tEval must be strictly ${dir > 0 ? 'increasing' : 'decreasing'} (direction of integration); tEval[${j}] = ${tEval[j]} follows ${tEval[j - 1]}`);
      }
    }
  }
  const needInterp = nEv > 0 || tEval !== undefined || wantDense;

  // ---- work arrays ----
  let y = Float64Array.from(yStart);
  let yNew = new Float64Array(n);
  let k1 = new Float64Array(n);
  const k2 = new Float64Array(n), k3 = new Float64Array(n), k4 = new Float64Array(n), k5 = new Float64Array(n), k6 = new Float64Array(n);
  let k7 = new Float64Array(n);
  const yTmp = new Float64Array(n);
  const rc = new Float64Array(5 * n);
  const yInterp = new Float64Array(n);
  const gOld = new Float64Array(nEv), gNew = new Float64Array(nEv);
  const evCount = new Int32Array(nEv);

  const outT = new GrowableF64(), outY = new GrowableF64();
  const segT = new GrowableF64(), segH = new GrowableF64(), segR = new GrowableF64();
  const hits: EventHit[] = [];
  const found: EventHit[] = []; // this step's events, reused
  let nfev = 0, nSteps = 0, nRejected = 0, hLast = 0;
  let evalIdx = 0;
  let t = t0;
  let status: OdeStatus = 'done';
  let message = '';

  const emitEvalUpTo = (tEnd: number, yEnd: Float64Array, tOld: number, h: number): void => {
    if (!tEval) return;
    while (evalIdx < tEval.length && (tEval[evalIdx] - tEnd) * dir <= 0) {
      const te = tEval[evalIdx++];
      outT.push(te);
      if (te === tEnd) outY.pushAll(yEnd);
      else {
        dopri5Interp(rc, 0, n, (te - tOld) / h, yInterp);
        outY.pushAll(yInterp);
      }
    }
  };
  // ---- start ----
  if (tEval) emitEvalUpTo(t0, y, t0, 1);
  else { outT.push(t0); outY.pushAll(y); }
  rhs(t0, y, k1);
  nfev++;
  // (A labeled block rather than a closure for the ending: V8 boxes doubles such as t that a closure
  // captures, which would cost an allocation per step.)
  run: {
    if (!allFinite(k1)) {
      status = 'non-finite';
      message = `rhs returned a non-finite derivative at the initial point t = ${t0}`;
      break run;
    }
    for (let k = 0; k < nEv; k++) gOld[k] = ev.g[k](t0, y);
    let h: number;
    if (h0 !== undefined) h = dir * Math.min(h0, hMax);
    else {
      h = initialStep(rhs, t0, y, k1, dir, 4, rtol, atol, hMax, new Float64Array(2 * n));
      nfev++;
    }
    let lastRejected = false;
    let nonFiniteRun = 0;
    let errOld = 1e-4;

    // ---- main loop ----
    for (;;) {
      if (nSteps + nRejected >= maxSteps) {
        status = 'max-steps';
        message = `stopped after ${maxSteps} attempted steps at t = ${t} (options.maxSteps)`;
        break;
      }
      let last = false;
      if ((t + 1.01 * h - t1) * dir >= 0) { h = t1 - t; last = true; }
      if (Math.abs(h) <= 10 * Number.EPSILON * Math.abs(t) || t + h === t) {
        if (nonFiniteRun > 0) {
          status = 'non-finite';
          message = `rhs returned non-finite values just after t = ${t}, even for the smallest step`;
        } else {
          status = 'step-too-small';
          message = `step size ${h} too small at t = ${t}: the solution may be singular or the problem stiff`;
        }
        break;
      }
      // Stages (HNW Table 5.2); k1 holds f(t, y) from the previous step's last stage (FSAL).
      for (let i = 0; i < n; i++) yTmp[i] = y[i] + h * A21 * k1[i];
      rhs(t + C2 * h, yTmp, k2);
      for (let i = 0; i < n; i++) yTmp[i] = y[i] + h * (A31 * k1[i] + A32 * k2[i]);
      rhs(t + C3 * h, yTmp, k3);
      for (let i = 0; i < n; i++) yTmp[i] = y[i] + h * (A41 * k1[i] + A42 * k2[i] + A43 * k3[i]);
      rhs(t + C4 * h, yTmp, k4);
      for (let i = 0; i < n; i++) yTmp[i] = y[i] + h * (A51 * k1[i] + A52 * k2[i] + A53 * k3[i] + A54 * k4[i]);
      rhs(t + C5 * h, yTmp, k5);
      for (let i = 0; i < n; i++) yTmp[i] = y[i] + h * (A61 * k1[i] + A62 * k2[i] + A63 * k3[i] + A64 * k4[i] + A65 * k5[i]);
      const tNew = last ? t1 : t + h;
      rhs(t + h, yTmp, k6);
      for (let i = 0; i < n; i++) yNew[i] = y[i] + h * (B1 * k1[i] + B3 * k3[i] + B4 * k4[i] + B5 * k5[i] + B6 * k6[i]);
      rhs(tNew, yNew, k7);
      nfev += 6;
      // Local error estimate h Σ e_i k_i in the RMS norm with weights atol + rtol max(|y|, |yNew|) (HNW (4.10)-(4.11)).
      let err = 0;
      for (let i = 0; i < n; i++) {
        const e = h * (E1 * k1[i] + E3 * k3[i] + E4 * k4[i] + E5 * k5[i] + E6 * k6[i] + E7 * k7[i]);
        const sc = atol[i] + rtol[i] * Math.max(Math.abs(y[i]), Math.abs(yNew[i]));
        err += (e / sc) ** 2;
      }
      err = Math.sqrt(err / n);
      if (!Number.isFinite(err)) {
        // A stage overflowed or rhs returned NaN/Inf: retry with a much smaller step, a few times.
        nRejected++;
        lastRejected = true;
        if (++nonFiniteRun > MAX_NONFINITE_RETRIES) {
          status = 'non-finite';
          message = `rhs returned non-finite values near t = ${t} even with step ${h}`;
          break;
        }
        h *= minFactor;
        continue;
      }
      nonFiniteRun = 0;
      if (err > 1) {
        nRejected++;
        h *= Math.max(minFactor, safety * err ** -expErr);
        lastRejected = true;
        continue;
      }

      // ---- accepted step t -> tNew ----
      nSteps++;
      hLast = h;
      const tOld = t;
      if (needInterp) {
        for (let i = 0; i < n; i++) {
          const dy = yNew[i] - y[i];
          const bspl = h * k1[i] - dy;
          rc[i] = y[i];
          rc[n + i] = dy;
          rc[2 * n + i] = bspl;
          rc[3 * n + i] = dy - h * k7[i] - bspl;
          rc[4 * n + i] = h * (D1 * k1[i] + D3 * k3[i] + D4 * k4[i] + D5 * k5[i] + D6 * k6[i] + D7 * k7[i]);
        }
        if (wantDense) { segT.push(tOld); segH.push(h); segR.pushAll(rc); }
      }
      // Events on this step, located on the interpolant and taken in time order.
      let stopT = NaN;
      let stopY: Float64Array | undefined;
      if (nEv > 0) {
        found.length = 0;
        for (let k = 0; k < nEv; k++) {
          gNew[k] = ev.g[k](tNew, yNew);
          if (!crosses(gOld[k], gNew[k], ev.direction[k])) continue;
          const tr = locateOnStep(ev.g[k], rc, n, tOld, tNew, h, gOld[k], gNew[k], eventTol, yInterp);
          let yr: Float64Array;
          if (tr === tNew) yr = Float64Array.from(yNew);
          else { yr = new Float64Array(n); dopri5Interp(rc, 0, n, (tr - tOld) / h, yr); }
          found.push({ index: k, t: tr, y: yr });
        }
        if (found.length > 1) found.sort((a, b) => (a.t - b.t) * dir);
        for (const hit of found) {
          if (stopY && hit.t !== stopT) break;
          hits.push(hit);
          const k = hit.index;
          evCount[k]++;
          if (ev.stopAfter[k] > 0 && evCount[k] >= ev.stopAfter[k] && !stopY) {
            stopT = hit.t;
            stopY = hit.y;
            status = 'event';
            message = `terminal event ${k} (occurrence ${evCount[k]}) at t = ${hit.t}`;
          }
        }
        gOld.set(gNew);
      }
      const tEnd = stopY ? stopT : tNew;
      const yEnd = stopY ?? yNew;
      emitEvalUpTo(tEnd, yEnd, tOld, h);
      if (!tEval && saveSteps) { outT.push(tEnd); outY.pushAll(yEnd); }
      // FSAL: the last stage is f(tNew, yNew), the first stage of the next step.
      const ySwap = y; y = yNew; yNew = ySwap;
      const kSwap = k1; k1 = k7; k7 = kSwap;
      t = tNew;
      if (stopY) { t = stopT; y.set(stopY); }
      if (onStep && onStep(t, y, t - tOld) === false) {
        if (status !== 'event' && !last) { status = 'stopped'; message = `stopped by options.onStep at t = ${t}`; }
        break;
      }
      if (stopY || last) break;
      const errC = Math.max(err, 1e-10);
      let fac = Math.min(maxFactor, Math.max(minFactor, safety * errC ** -expErr * errOld ** beta));
      if (lastRejected) fac = Math.min(fac, 1);
      errOld = Math.max(err, 1e-4);
      h *= fac;
      if (Math.abs(h) > hMax) h = dir * hMax;
      lastRejected = false;
    }
  } // run

  // ---- result ----
  if (!tEval && !saveSteps && (outT.length === 0 || outT.view()[outT.length - 1] !== t)) {
    outT.push(t);
    outY.pushAll(y);
  }
  const result: OdeResult = {
    status, message: message || statusMessage(status, t), t: outT.toArray(), y: outY.toArray(), n,
    tFinal: t, yFinal: Float64Array.from(y), nfev, nSteps, nRejected, hLast, events: hits, warnings,
  };
  if (wantDense) result.sol = makeSol(t0, t, dir, n, segT.toArray(), segH.toArray(), segR.toArray(), yStart);
  return result;
}

/** Root of g(s, u(s)) on the step [tOld, tNew] (u: the step's interpolant in rc), bracketed by gOld, gNew. */
function locateOnStep(
  g: (t: number, y: Float64Array) => number, rc: Float64Array, n: number, tOld: number, tNew: number, h: number,
  gOld: number, gNew: number, tol: number, scratch: Float64Array,
): number {
  const phi = (s: number): number => {
    dopri5Interp(rc, 0, n, (s - tOld) / h, scratch);
    return g(s, scratch);
  };
  return brentRoot(phi, tOld, tNew, gOld, gNew, tol);
}

function allFinite(v: Float64Array): boolean {
  for (let i = 0; i < v.length; i++) if (!Number.isFinite(v[i])) return false;
  return true;
}

function statusMessage(status: OdeStatus, t: number): string {
  return status === 'done' ? `reached t = ${t}` : `${status} at t = ${t}`;
}

/** The piecewise interpolant over the stored steps; segment s covers [segT[s], segT[s] + segH[s]]. */
function makeSol(t0: number, tEnd: number, dir: number, n: number, segT: Float64Array, segH: Float64Array, segR: Float64Array, y0: Float64Array): (t: number) => Float64Array {
  const lo = Math.min(t0, tEnd), hi = Math.max(t0, tEnd);
  return (tq: number): Float64Array => {
    if (!(tq >= lo && tq <= hi)) throw new RangeError(`sol: t must lie in [${lo}, ${hi}] (the integrated range), got ${tq}`);
    const out = new Float64Array(n);
    const m = segT.length;
    if (m === 0) { out.set(y0); return out; }
    // Largest s with (tq - segT[s]) * dir >= 0 (segT is monotone in dir).
    let a = 0, b = m - 1;
    while (a < b) {
      const mid = (a + b + 1) >> 1;
      if ((tq - segT[mid]) * dir >= 0) a = mid; else b = mid - 1;
    }
    dopri5Interp(segR, 5 * n * a, n, (tq - segT[a]) / segH[a], out);
    return out;
  };
}
