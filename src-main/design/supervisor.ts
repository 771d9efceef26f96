// The supervisor: runs a ControllerDesign (src-main/design/types.ts) as one sampled-data
// Controller (engine/trial/types.ts). Each stage is a level-hold law (engine/control
// makeLevelHold: SDRE on the energy coordinate, design.md §2) toward the stage's own target
// energy, with the design's law parameters and the stage's <b^2>; the energy is compiled from
// design.model.energy (energy.ts). The stages are switched by an explicit finite-state machine
// (a Moore-type supervisor; hybrid switching as in Liberzon, "Switching in Systems and Control",
// 2003, ch. 1, from memory). Semantics, per controller sample at (q, v, t):
//   1. the transitions leaving the current stage are tried in the order they appear in
//      design.transitions; the first whose condition holds (all its clauses: strict
//      inequalities, see conditionHolds) fires: the stage changes and {t, from, to} is recorded.
//      At most one transition fires per sample (no chaining within a sample);
//   2. the (possibly new) stage's law computes u for this sample.
// So the sample at which a condition first holds is already controlled by the new stage.
// On a switch the new stage's law starts with its integral state w = 0 and the previous sample's
// u as its rate-limit memory, so the rate limit also holds across the switch.
// reset() returns to design.initialStage, clears the switch log and every law's state.
import type { ControllerDesign, SwitchCondition } from './types.ts';
import type { Controller } from '../engine/trial/types.ts';
import type { EnergyFunction } from '../engine/types.ts';
import { makeLevelHold, type LevelHold, type LevelHoldOutput } from '../engine/control/index.ts';
import { compileDesignEnergy } from './energy.ts';

export interface StageSwitch { t: number; from: number; to: number }

export interface SupervisorOptions {
  /** Use this energy instead of compiling design.model.energy (e.g. a learned model's own evaluator). */
  energy?: EnergyFunction;
}

export interface Supervisor extends Controller {
  /** Current stage (1-based). */
  stage(): number;
  /** Stage switches since the last reset, in time order. */
  switches(): StageSwitch[];
  /** The level-hold law of each stage, by stage index - 1. */
  readonly laws: readonly LevelHold[];
  /** The last law output (u, z, b, saturated, w, riccatiOk). */
  readonly last: LevelHoldOutput;
  readonly energy: EnergyFunction;
}

const TWO_PI = 2 * Math.PI;

/** q wrapped to [-pi, pi). */
export function wrapAngle(q: number): number {
  return q - TWO_PI * Math.floor((q + Math.PI) / TWO_PI);
}

/** True when every clause present in `c` holds at (q, v) with energy h (strict inequalities). */
export function conditionHolds(c: SwitchCondition, q: number, v: number, h: number, angle: boolean): boolean {
  const qq = angle && c.wrapped === true ? wrapAngle(q) : q;
  if (c.qAbove !== undefined && !(qq > c.qAbove)) return false;
  if (c.qBelow !== undefined && !(qq < c.qBelow)) return false;
  if (c.vSign !== undefined && !(c.vSign > 0 ? v > 0 : v < 0)) return false;
  if (c.energyAbove !== undefined && !(h > c.energyAbove)) return false;
  if (c.energyBelow !== undefined && !(h < c.energyBelow)) return false;
  return true;
}

export function controllerFromDesign(design: ControllerDesign, opts: SupervisorOptions = {}): Supervisor {
  if (design === null || typeof design !== 'object') throw new TypeError('design: expected a ControllerDesign object');
  const stages = design.stages;
  if (!Array.isArray(stages) || stages.length === 0) throw new RangeError('design.stages: expected at least one stage');
  stages.forEach((s, i) => {
    if (s.index !== i + 1) throw new RangeError(`design.stages[${i}].index: expected ${i + 1} (stages are numbered 1, 2, ... in order), got ${s.index}`);
  });
  const n = stages.length;
  const transitions = design.transitions ?? [];
  transitions.forEach((tr, i) => {
    for (const k of ['from', 'to'] as const) {
      if (!Number.isInteger(tr[k]) || tr[k] < 1 || tr[k] > n) throw new RangeError(`design.transitions[${i}].${k}: expected a stage index 1..${n}, got ${tr[k]}`);
    }
  });
  const initial = design.initialStage;
  if (!Number.isInteger(initial) || initial < 1 || initial > n) throw new RangeError(`design.initialStage: expected a stage index 1..${n}, got ${initial}`);

  const energy = opts.energy ?? compileDesignEnergy(design.model.energy, design.model.coordinate, design.model.lambda);
  const law = design.law;
  const laws = stages.map((s) => makeLevelHold({
    energy,
    inputGain: design.input.gain,
    target: s.target.energy,
    Q: law.Q,
    R: law.R,
    eps: law.eps,
    lambda: law.lambda,
    uMax: law.uMax ?? undefined,
    rateMax: law.rateMax ?? undefined,
    meanB2: law.lossCompensation && s.meanB2 !== null ? s.meanB2 : undefined,
    integral: law.integral ? { Qw: law.integral.Qw, antiWindup: law.integral.antiWindup } : undefined,
  }));
  // Transitions grouped by their source stage, keeping the document's order.
  const leaving: { to: number; when: SwitchCondition }[][] = Array.from({ length: n }, () => []);
  for (const tr of transitions) leaving[tr.from - 1].push({ to: tr.to, when: tr.when });
  const angle = design.model.coordinate === 'angle';
  const staged = transitions.length > 0;

  let current = initial;
  let uLast = 0;
  const log: StageSwitch[] = [];
  const state = { q: 0, v: 0, t: 0 };
  const last: LevelHoldOutput = { u: 0, z: 0, b: 0, saturated: false, w: 0, riccatiOk: true };

  function reset(): void {
    current = initial;
    uLast = 0;
    log.length = 0;
    for (const l of laws) l.reset();
  }

  function step(q: number, v: number, t: number, dt: number): number {
    if (staged) {
      const out = leaving[current - 1];
      if (out.length > 0) {
        const h = energy.H(q, v);
        for (let i = 0; i < out.length; i++) {
          if (conditionHolds(out[i].when, q, v, h, angle)) {
            const to = out[i].to;
            log.push({ t, from: current, to });
            const next = laws[to - 1];
            next.reset();
            next.internal.uPrev = uLast;
            current = to;
            break;
          }
        }
      }
    }
    state.q = q; state.v = v; state.t = t;
    uLast = laws[current - 1].step(state, dt, last).u;
    return uLast;
  }

  return {
    reset,
    step,
    stage: () => current,
    switches: () => log.slice(),
    laws,
    last,
    energy,
  };
}
