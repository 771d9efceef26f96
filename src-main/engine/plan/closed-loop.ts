// A lean sampled-data closed loop for the planner's checks: the plant q'' = accel(q, v, u, t)
// integrated by classic RK4 (Hairer, Norsett & Wanner, "Solving ODEs I", §II.1, Table 1.2) with
// `innerSteps` steps per controller period, the controller's output held over the period
// (zero-order hold) after a delay line of whole periods — the same discretisation as the trial
// simulator (engine/trial/simulate.ts), but with the controller seeing the true state, no trace,
// and an observer that may stop the run early (a hop that has failed or settled needs no more time).
import type { Controller } from '../trial/types.ts';
import { rk4HeldStep } from '../ode/rk4-held.ts';

export interface LoopProblem {
  accel: (q: number, v: number, u: number, t: number) => number;
  controller: Controller;
  q0: number;
  v0: number;
  rateHz: number;
  delaySamples?: number;
  innerSteps?: number;
  maxDuration: number;
  /** Called each sample with the true state and the controller's stage after its step; false stops the run. */
  observe: (t: number, q: number, v: number, stage: number) => boolean;
}

export interface LoopResult {
  status: 'stopped' | 'timeout' | 'diverged';
  t: number;
  q: number;
  v: number;
  samples: number;
}

export function runClosedLoop(p: LoopProblem): LoopResult {
  const T = 1 / p.rateHz;
  const inner = p.innerSteps ?? 2;
  const delay = p.delaySamples ?? 0;
  const h = T / inner;
  const n = Math.round(p.maxDuration * p.rateHz);
  const line = new Float64Array(delay + 1);
  const qv = new Float64Array(2);
  let head = 0;
  const f = p.accel;
  const ctl = p.controller;
  const hasStage = typeof ctl.stage === 'function';
  let q = p.q0, v = p.v0;
  ctl.reset();
  for (let k = 0; k < n; k++) {
    const t = k * T;
    const cmd = ctl.step(q, v, t, T);
    if (!p.observe(t, q, v, hasStage ? ctl.stage!() : 1)) return { status: 'stopped', t, q, v, samples: k + 1 };
    line[head] = cmd;
    head = head === delay ? 0 : head + 1;
    const u = delay === 0 ? cmd : line[head];
    for (let j = 0; j < inner; j++) {
      rk4HeldStep(f, q, v, u, t + j * h, h, qv);
      q = qv[0];
      v = qv[1];
    }
    if (!Number.isFinite(q) || !Number.isFinite(v) || !Number.isFinite(cmd)) return { status: 'diverged', t: t + T, q, v, samples: k + 1 };
  }
  return { status: 'timeout', t: n * T, q, v, samples: n };
}
