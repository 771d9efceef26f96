// Metrics of one closed-loop trial, computed from its trace (design.md §2 "Baselines, on the same
// cost"). Integrals use the left rectangle rule over the rows, matching the zero-order hold: row k
// stands for [t_k, t_k + dt) with dt the (uniform) row spacing, so a constant u over a time D
// gives exactly R u^2 D. The band is judged on the cycle-averaged energy (cycle-average.ts).
import type { EnergyFunction } from '../types.ts';
import type { Trace } from './types.ts';
import { cycleAverages, DEFAULT_MAX_WINDOW } from './cycle-average.ts';
import { timeToBand } from './band-entry.ts';
import { energyResolution, type SensorSigmas } from './energy-resolution.ts';

export interface MetricsOptions {
  /** Target energy H*. */
  target: number;
  /** Weights of J = integral of Q z^2 + R u^2 dt, z = H - H*. Default Q = R = 1. */
  Q?: number;
  R?: number;
  /** Relative half-width of the band around H*. Default 0.02 (+-2%). */
  bandRelative?: number;
  /**
   * Smallest half-width of the band (absolute, unit of H). For a target at a well bottom H* is ~0
   * and 2 % of it is no band at all; the caller gives a floor from the well (see run-trial.ts).
   */
  bandFloor?: number;
  /** Sensor position/velocity errors: the energy resolution is computed from them and used as the band when wider. */
  sensor?: SensorSigmas;
  /** The model energy (needed with `sensor`, for its gradient). */
  energy?: EnergyFunction;
  /** Windows used for the spread and the amplitude at the end of the trial. Default 3. */
  tailCycles?: number;
  /** Minimum number of windows inside the band at the end for `converged`. Default 3. */
  minCyclesInBand?: number;
  /** Longest cycle window, s (see cycle-average.ts). Default 10. */
  maxWindow?: number;
  /** The actuator limit, to report how often the input sat at it (saturatedShare). */
  uMax?: number;
}

export interface TrialMetrics {
  target: number;
  /** Half-width of the band actually used (absolute, unit of H). */
  band: number;
  /** The energy resolution the sensor allows at the target level (null without sensor data). */
  resolution: number | null;
  /** 'relative' = +-bandRelative * |H*|; 'floor' = options.bandFloor (it was wider); 'resolution' = the sensor's energy resolution (it was wider still). */
  bandBasis: 'relative' | 'floor' | 'resolution';
  /** Time (from the trace start) after which every cycle average stays in the band; null if never. */
  timeToBand: number | null;
  /** The last minCyclesInBand cycle averages are all in the band. */
  converged: boolean;
  cycles: number;
  /** Last cycle-averaged energy, its error and relative error. */
  finalEnergy: number;
  finalError: number;
  finalRelError: number;
  /** Instantaneous H over the last tailCycles windows: max - min, and standard deviation about the mean. */
  spread: number;
  spreadStd: number;
  /** Swing amplitude (max q - min q) / 2 over the last tailCycles windows, and the extremes. */
  amplitude: number;
  qMin: number;
  qMax: number;
  /** J = integral of Q z^2 + R u^2 dt. */
  J: number;
  peakU: number;
  /** Actuator work: integral of |u v| dt, and the net integral of u v dt (unit of u times unit of v times s). */
  workAbs: number;
  workNet: number;
  /** Total variation of u: sum of |u_k - u_{k-1}|. */
  totalVariation: number;
  /** Share of the last tailCycles windows with |u| at uMax (null without uMax): near 1 with no convergence means uMax is too small. */
  saturatedShare: number | null;
}

export function trialMetrics(trace: Trace, options: MetricsOptions): TrialMetrics {
  const { t, q, v, u, H } = trace;
  const n = t.length;
  if (n < 2) throw new RangeError(`trialMetrics: the trace needs at least 2 rows, got ${n}`);
  const target = options.target;
  if (!Number.isFinite(target)) throw new RangeError(`trialMetrics: target must be a finite number, got ${target}`);
  const Q = options.Q ?? 1, R = options.R ?? 1;
  if (!(Q >= 0) || !(R >= 0)) throw new RangeError(`trialMetrics: weights Q, R must be >= 0, got ${Q}, ${R}`);
  const rel = options.bandRelative ?? 0.02;
  if (!(rel >= 0)) throw new RangeError(`trialMetrics: bandRelative must be >= 0, got ${rel}`);
  const tail = options.tailCycles ?? 3;
  const minIn = options.minCyclesInBand ?? 3;
  const dt = (t[n - 1] - t[0]) / (n - 1);

  let J = 0, peakU = 0, workAbs = 0, workNet = 0, tv = 0;
  for (let i = 0; i < n; i++) {
    const z = H[i] - target;
    J += (Q * z * z + R * u[i] * u[i]) * dt;
    const au = Math.abs(u[i]);
    if (au > peakU) peakU = au;
    const p = u[i] * v[i];
    workAbs += Math.abs(p) * dt;
    workNet += p * dt;
    if (i > 0) tv += Math.abs(u[i] - u[i - 1]);
  }

  const cyc = cycleAverages(t, v, H, options.maxWindow ?? DEFAULT_MAX_WINDOW);
  const m = cyc.mean.length;
  // Tail: the last `tail` windows (or the last tenth of the trace when there are none).
  const i0 = m > 0 ? cyc.first[Math.max(0, m - tail)] : Math.floor(0.9 * (n - 1));
  const i1 = m > 0 ? cyc.last[m - 1] : n;
  const uMax = options.uMax;
  if (uMax !== undefined && !(uMax > 0)) throw new RangeError(`trialMetrics: uMax must be > 0, got ${uMax}`);
  let hMin = Infinity, hMax = -Infinity, qMin = Infinity, qMax = -Infinity, hs = 0, sat = 0;
  for (let i = i0; i < i1; i++) {
    if (uMax !== undefined && Math.abs(u[i]) >= uMax * (1 - 1e-9)) sat++;
    if (H[i] < hMin) hMin = H[i];
    if (H[i] > hMax) hMax = H[i];
    if (q[i] < qMin) qMin = q[i];
    if (q[i] > qMax) qMax = q[i];
    hs += H[i];
  }
  const hMean = hs / (i1 - i0);
  let hv = 0;
  for (let i = i0; i < i1; i++) hv += (H[i] - hMean) ** 2;

  let resolution: number | null = null;
  if (options.sensor) {
    if (!options.energy) throw new RangeError('trialMetrics: options.energy is required with options.sensor');
    resolution = energyResolution(options.energy, q.subarray(i0, i1), v.subarray(i0, i1), options.sensor);
  }
  const floor = options.bandFloor ?? 0;
  if (!(floor >= 0)) throw new RangeError(`trialMetrics: bandFloor must be >= 0, got ${floor}`);
  const useFloor = floor > rel * Math.abs(target);
  const relBand = useFloor ? floor : rel * Math.abs(target);
  const useRes = resolution !== null && resolution > relBand;
  const band = useRes ? resolution! : relBand;

  const entry = m > 0 ? timeToBand(cyc.end, cyc.mean, target, band) : null;
  let converged = m >= minIn;
  for (let j = m - minIn; converged && j < m; j++) if (!(Math.abs(cyc.mean[j] - target) <= band)) converged = false;
  const finalEnergy = m > 0 ? cyc.mean[m - 1] : hMean;
  return {
    target,
    band,
    resolution,
    bandBasis: useRes ? 'resolution' : useFloor ? 'floor' : 'relative',
    timeToBand: entry === null ? null : entry - t[0],
    converged,
    cycles: m,
    finalEnergy,
    finalError: finalEnergy - target,
    finalRelError: target !== 0 ? (finalEnergy - target) / Math.abs(target) : NaN,
    spread: hMax - hMin,
    spreadStd: Math.sqrt(hv / (i1 - i0)),
    amplitude: (qMax - qMin) / 2,
    qMin,
    qMax,
    J,
    peakU,
    workAbs,
    workNet,
    totalVariation: tv,
    saturatedShare: uMax === undefined ? null : sat / (i1 - i0),
  };
}
