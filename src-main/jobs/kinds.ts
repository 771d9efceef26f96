// The long engine jobs that run off the UI thread, by name: payload in, result out. Each runs in
// a worker thread of its own (src-main/jobs/run-job.ts) and may post progress.
import type { Recording } from '../engine/types.ts';
import type { EnergyModel } from '../engine/learn/index.ts';
import type { LearnOptions } from '../engine/learn/index.ts';
import type { ControllerDesign } from '../design/types.ts';
import type { LevelHoldOptions } from '../design/level-hold.ts';
import type { WellHopOptions } from '../design/hop.ts';
import type { DesignTrialResult, TrialSettings } from '../design/run-trial.ts';

export interface JobKinds {
  learn: { payload: { recording: Recording; options: LearnOptions }; result: EnergyModel };
  /** A level hold, or a well hop (whose feasibility check simulates a grid of starts). */
  design:
    | { payload: { model: EnergyModel; kind: 'level-hold'; options: LevelHoldOptions }; result: ControllerDesign }
    | { payload: { model: EnergyModel; kind: 'well-hop'; options: WellHopOptions }; result: ControllerDesign };
  /** A closed-loop trial of a design on its own model: nominal run, baselines, Monte Carlo (which starts its own workers). */
  trial: { payload: { design: ControllerDesign; settings: TrialSettings; designLabel: string }; result: DesignTrialResult };
}

export type JobKind = keyof JobKinds;

/** Messages from a job worker to its parent. */
export type JobMessage =
  | { type: 'progress'; fraction: number; message: string }
  | { type: 'done'; result: unknown }
  | { type: 'failed'; message: string };
