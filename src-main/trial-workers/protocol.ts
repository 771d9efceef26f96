// Messages between the Monte Carlo pool (main side) and its worker threads. Plain data only.
import type { TrialSpec, TrialOutcome } from '../engine/trial/trial-spec.ts';

/** Given to every worker at start (workerData). */
export interface WorkerSetup {
  trial: TrialSpec;
  mismatch: number;
  seed: number;
}

/** Main -> worker: run trial number `index`. */
export interface RunRequest { type: 'run'; index: number }

/** Worker -> main. */
export type WorkerReply =
  | { type: 'done'; index: number; factors: Record<string, number>; outcome: TrialOutcome }
  | { type: 'error'; index: number; message: string };
