// Dominant oscillation period from velocity turning points: v changes sign twice per swing.
// Crossings are counted with hysteresis (a Schmitt trigger at +-h, h a fraction of the RMS
// velocity; common practice) so that noise near v = 0 does not add crossings.

export interface PeriodEstimate {
  /** Seconds; NaN when no run has two or more turning points. */
  period: number;
  /** Turning points counted over all runs. */
  turningPoints: number;
  /** Period of each run with at least four turning points (NaN otherwise). */
  perRun: number[];
}

/**
 * Segments are velocity arrays (one per run) at step dt; the mean half-period is averaged over runs
 * with turning points. The threshold is the larger of `hysteresis` times the run's RMS velocity
 * and `floor` (e.g. three times the velocity noise).
 */
export function dominantPeriod(velocities: Float64Array[], dt: number, hysteresis = 0.1, floor = 0): PeriodEstimate {
  let span = 0, halves = 0, total = 0;
  const perRun: number[] = [];
  for (const v of velocities) {
    let ss = 0;
    for (let i = 0; i < v.length; i++) ss += v[i] * v[i];
    const h = Math.max(floor, hysteresis * Math.sqrt(ss / Math.max(1, v.length)));
    let state = 0, first = -1, last = -1, count = 0;
    for (let i = 0; i < v.length; i++) {
      const s = v[i] > h ? 1 : v[i] < -h ? -1 : 0;
      if (s === 0 || s === state) continue;
      if (state !== 0) { if (first < 0) first = i; last = i; count++; }
      state = s;
    }
    total += count;
    if (count >= 2) { span += (last - first) * dt; halves += count - 1; }
    perRun.push(count >= 4 ? (2 * (last - first) * dt) / (count - 1) : NaN);
  }
  return { period: halves > 0 ? (2 * span) / halves : NaN, turningPoints: total, perRun };
}
