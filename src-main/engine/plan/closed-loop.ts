// A lean sampled-data closed loop for the planner's checks: the plant q'' = accel(q, v, u, t)
// integrated by classic RK4 (Hairer, Norsett & Wanner, "Solving ODEs I", §II.1, Table 1.2) with
// `innerSteps` steps per controller period, the controller's output held over the period
// (zero-order hold) after a delay line of whole periods — the same discretisation as the trial
// simulator (engine/trial/simulate.ts), but with the controller seeing the true state, no trace,
// and an observer that may stop the run early (a hop that has failed or settled needs no more time).
import type { Controller } from '../trial/types.ts';

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
      const ti = t + j * h;
      const a1 = f(q, v, u, ti);
      const q2 = q + 0.5 * h * v, v2 = v + 0.5 * h * a1;
      const a2 = f(q2, v2, u, ti + 0.5 * h);
      const q3 = q + 0.5 * h * v2, v3 = v + 0.5 * h * a2;
      const a3 = f(q3, v3, u, ti + 0.5 * h);
      const q4 = q + h * v3, v4 = v + h * a3;
      const a4 = f(q4, v4, u, ti + h);
      q += (h / 6) * (v + 2 * v2 + 2 * v3 + v4);
      v += (h / 6) * (a1 + 2 * a2 + 2 * a3 + a4);
    }
    if (!Number.isFinite(q) || !Number.isFinite(v) || !Number.isFinite(cmd)) return { status: 'diverged', t: t + T, q, v, samples: k + 1 };
  }
  return { status: 'timeout', t: n * T, q, v, samples: n };
}
