// The long engine jobs that run off the UI thread, by name: payload in, result out. Each runs in
// a worker thread of its own (src-main/jobs/run-job.ts) and may post progress.
import type { Recording } from '../engine/types.ts';
import type { EnergyModel } from '../engine/learn/index.ts';
import type { LearnOptions } from '../engine/learn/index.ts';

export interface JobKinds {
  learn: { payload: { recording: Recording; options: LearnOptions }; result: EnergyModel };
}

export type JobKind = keyof JobKinds;

/** Messages from a job worker to its parent. */
export type JobMessage =
  | { type: 'progress'; fraction: number; message: string }
  | { type: 'done'; result: unknown }
  | { type: 'failed'; message: string };
