// One run at a glance: sampling, range, sensor noise, the Savitzky–Golay choice with the
// velocity it gives, and the damping from the log decrement. Combines estimateNoise,
// chooseSavgol, savgolFilter and logDecrement (see those files for the methods and references).
import type { Coordinate, Run } from '../types.ts';
import { estimateNoise, type NoiseEstimate } from './noise.ts';
import { chooseSavgol, type ChooseSavgolOverride, type SavgolChoice } from './choose-window.ts';
import { savgolFilter } from './savgol.ts';
import { logDecrement, type LogDecrementResult } from './logdec.ts';

export interface RunAnalysis {
  name: string;
  /** Unit of q: 'rad' for angles, 'm' for displacements. */
  unit: 'rad' | 'm';
  samples: number;
  /** Samples per second, (samples - 1) / duration. */
  sampleRate: number;
  /** t[last] - t[0] in seconds. */
  duration: number;
  min: number;
  max: number;
  noise: NoiseEstimate;
  savgol: SavgolChoice;
  /** Savitzky–Golay velocity dq/dt with the chosen window (unit/s). */
  velocity: Float64Array;
  /** Smoothed position with the same window. */
  position: Float64Array;
  logDecrement: LogDecrementResult;
}

export interface AnalyseRunOptions {
  /** Fix the Savitzky–Golay half window and/or order instead of choosing them. */
  savgol?: ChooseSavgolOverride;
  /** Known equilibrium position for the log decrement. */
  equilibrium?: number;
}

/** Relative deviation of any sampling interval from the mean one that is still called uniform
 *  (the import's default irregularTolerance, so every imported run passes). */
const UNIFORM_TOLERANCE = 0.01;
const MIN_SAMPLES = 64;

export function analyseRun(run: Run, coordinate: Coordinate, opts: AnalyseRunOptions = {}): RunAnalysis {
  if (run === null || typeof run !== 'object') throw new TypeError('analyseRun: run must be a Run object');
  if (coordinate !== 'angle' && coordinate !== 'linear') throw new RangeError(`analyseRun: coordinate must be 'angle' or 'linear', got ${String(coordinate)}`);
  const { t, q, name } = run;
  if (!(t instanceof Float64Array) || !(q instanceof Float64Array)) throw new TypeError(`analyseRun: run "${name}": t and q must be Float64Arrays`);
  const n = q.length;
  if (t.length !== n) throw new RangeError(`analyseRun: run "${name}": t has ${t.length} samples but q has ${n}`);
  if (n < MIN_SAMPLES) throw new RangeError(`analyseRun: run "${name}" has ${n} samples; at least ${MIN_SAMPLES} are needed`);
  const duration = t[n - 1] - t[0];
  const dt = duration / (n - 1);
  if (!(dt > 0) || !Number.isFinite(dt)) throw new RangeError(`analyseRun: run "${name}": time must increase, got t[0] = ${t[0]}, t[last] = ${t[n - 1]}`);
  for (let i = 1; i < n; i++) {
    const step = t[i] - t[i - 1];
    if (!(Math.abs(step - dt) <= UNIFORM_TOLERANCE * dt)) {
      throw new RangeError(`analyseRun: run "${name}": sampling is not uniform at sample ${i} (step ${step} s, mean ${dt} s)`);
    }
  }
  let min = Infinity, max = -Infinity;
  for (let i = 0; i < n; i++) {
    const v = q[i];
    if (!Number.isFinite(v)) throw new RangeError(`analyseRun: run "${name}": q[${i}] is not finite (${v})`);
    if (v < min) min = v;
    if (v > max) max = v;
  }
  const noise = estimateNoise(q, dt);
  const savgol = chooseSavgol(q, dt, noise, opts.savgol);
  const window = { halfWindow: savgol.halfWindow, order: savgol.order };
  const velocity = savgolFilter(q, dt, { ...window, derivative: 1 });
  const position = savgolFilter(q, dt, { ...window, derivative: 0 });
  const logDec = logDecrement(q, dt, { equilibrium: opts.equilibrium, smoothing: window, noiseSigma: noise.sigma });
  return {
    name, unit: coordinate === 'angle' ? 'rad' : 'm', samples: n, sampleRate: (n - 1) / duration, duration,
    min, max, noise, savgol, velocity, position, logDecrement: logDec,
  };
}
