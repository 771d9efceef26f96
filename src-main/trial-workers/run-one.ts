// One Monte Carlo run, the same whichever thread executes it: parameters of run i scaled by the
// factors drawn from (seed, i), sensor noise from its own stream of the seed.
import { runTrialSpec, type TrialOutcome } from '../engine/trial/trial-spec.ts';
import { mismatchFactors, noiseStream } from '../engine/trial/mismatch.ts';
import type { WorkerSetup } from './protocol.ts';

export function runMonteCarloTrial(setup: WorkerSetup, index: number): { factors: Record<string, number>; outcome: TrialOutcome } {
  const params = setup.trial.plant.params;
  const factors = mismatchFactors(Object.keys(params), setup.mismatch, setup.seed, index);
  const trial = { ...setup.trial, noiseSeed: setup.seed, noiseStream: noiseStream(index) };
  const { outcome } = runTrialSpec(trial, factors);
  return { factors, outcome };
}
