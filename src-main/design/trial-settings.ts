// The settings of one closed-loop trial (design/run-trial.ts) and their check. Kept apart from the
// trial runner so that callers checking settings (the operation handlers) do not load the worker
// pool code with them (bundles place shared modules in chunks, where the pool cannot find its worker).
import type { ControllerDesign } from './types.ts';

/** Longest trial accepted (samples), a guard against runaway memory: 10 million controller samples. */
export const MAX_TRIAL_SAMPLES = 10_000_000;

export class TrialSettingsError extends Error {
  override name = 'TrialSettingsError';
}

export interface TrialSettings {
  q0: number;
  v0: number;
  /** Simulated time, s (> 0). */
  duration: number;
  /** Monte Carlo runs (null: none). */
  runs: number | null;
  /** Mismatch p in [0, 1): every plant parameter scaled by a factor uniform in [1 - p, 1 + p]. */
  mismatch: number;
  /** Worker threads for the Monte Carlo of a level hold, 1..64. */
  workers: number;
  /** Sensor resolution in bits over `range` (null: no quantization). */
  bits: number | null;
  /** Span the bits cover (null: 2 pi for angles, the model's valid range for linear rigs). */
  range: number | null;
  /** Position noise standard deviation, unit of q. */
  noise: number;
  estimator: 'difference' | 'observer';
  /** Noise and mismatch seed (non-negative integer). */
  seed: number;
}

/** Throws TrialSettingsError naming the first bad setting. */
export function checkTrialSettings(s: TrialSettings, design: ControllerDesign): void {
  const fin = (name: string, x: unknown) => {
    if (typeof x !== 'number' || !Number.isFinite(x)) throw new TrialSettingsError(`${name}: expected a finite number, got ${String(x)}`);
  };
  fin('q0', s.q0);
  fin('v0', s.v0);
  if (!(s.duration > 0) || !Number.isFinite(s.duration)) throw new TrialSettingsError(`duration: expected a positive number of seconds, got ${s.duration}`);
  if (s.duration * design.sampleRateHz > MAX_TRIAL_SAMPLES) throw new TrialSettingsError(`duration: ${s.duration} s at ${design.sampleRateHz} Hz is more than ${MAX_TRIAL_SAMPLES} controller samples`);
  if (s.runs !== null && (!Number.isInteger(s.runs) || s.runs < 1 || s.runs > 100_000)) throw new TrialSettingsError(`runs: expected a whole number from 1 to 100000, got ${s.runs}`);
  if (!(s.mismatch >= 0 && s.mismatch < 1)) throw new TrialSettingsError(`mismatch: expected a fraction in [0, 1) (0.15 for +-15%), got ${s.mismatch}`);
  if (!Number.isInteger(s.workers) || s.workers < 1 || s.workers > 64) throw new TrialSettingsError(`workers: expected a whole number from 1 to 64, got ${s.workers}`);
  if (s.bits !== null && (!Number.isInteger(s.bits) || s.bits < 1 || s.bits > 32)) throw new TrialSettingsError(`sensor bits: expected a whole number from 1 to 32, got ${s.bits}`);
  if (s.range !== null && !(s.range > 0 && Number.isFinite(s.range))) throw new TrialSettingsError(`sensor range: expected a positive span, got ${s.range}`);
  if (s.range !== null && s.bits === null) throw new TrialSettingsError('sensor range: needs sensor bits');
  if (!(s.noise >= 0) || !Number.isFinite(s.noise)) throw new TrialSettingsError(`noise: expected a standard deviation >= 0, got ${s.noise}`);
  if (s.estimator !== 'difference' && s.estimator !== 'observer') throw new TrialSettingsError(`estimator: expected "difference" or "observer", got "${String(s.estimator)}"`);
  if (!Number.isSafeInteger(s.seed) || s.seed < 0) throw new TrialSettingsError(`seed: expected a whole number >= 0, got ${s.seed}`);
}

