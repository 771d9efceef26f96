// The range the recordings covered: H evaluated along the estimated states of every free run,
// reduced per run to robust extremes (the lo-th and hi-th percentiles, linear interpolation
// between order statistics: Hyndman & Fan, Am. Stat. 50 (1996) 361, their definition 7), then the
// lowest and highest over the runs. A single noise spike moves a percentile by at most one order
// statistic, so it cannot widen the range the way a plain min/max would.
// Only the samples where the Savitzky–Golay window is centred are used (the off-centre fits at a
// run's ends differentiate worse); a run too short to have any falls back to all its samples.
import type { Coverage } from './model.ts';

export interface CoverageOptions {
  /** Angles: q is wrapped to [-pi, pi) before its percentiles. */
  periodic: boolean;
  /** Samples skipped at each end of a run (the smoothing half-window). */
  trim: number;
  /** Lower and upper percentiles in [0, 100]. Default 0.5 and 99.5. */
  lo?: number;
  hi?: number;
  /** scale.joulesPerModelUnit of the model H belongs to (stored with the coverage). */
  joulesPerModelUnit: number;
}

/** p-th percentile (0..100) of sorted data, definition 7 of Hyndman & Fan (1996). */
export function percentileSorted(sorted: Float64Array, p: number): number {
  const n = sorted.length;
  if (n === 0) return NaN;
  const h = ((n - 1) * p) / 100;
  const i = Math.floor(h);
  return i + 1 < n ? sorted[i] + (h - i) * (sorted[i + 1] - sorted[i]) : sorted[n - 1];
}

const TWO_PI = 2 * Math.PI;

/** Coverage of H over runs of states (q, v); the inputs are only read. Null when no run has a sample or H is not finite on them. */
export function recordedCoverage(runs: { q: Float64Array; v: Float64Array }[], H: (q: number, v: number) => number, o: CoverageOptions): Coverage | null {
  const lo = o.lo ?? 0.5, hi = o.hi ?? 99.5;
  if (!(lo >= 0 && lo <= hi && hi <= 100)) throw new RangeError(`recordedCoverage: need 0 <= lo <= hi <= 100, got ${lo}, ${hi}`);
  let eMin = Infinity, eMax = -Infinity, qMin = Infinity, qMax = -Infinity, vMax = 0, used = 0;
  for (const { q, v } of runs) {
    const n = q.length;
    const [s, e] = n > 2 * o.trim ? [o.trim, n - o.trim] : [0, n];
    const m = e - s;
    if (m <= 0) continue;
    const hs = new Float64Array(m), qs = new Float64Array(m), vs = new Float64Array(m);
    for (let i = 0; i < m; i++) {
      const x = q[s + i], y = v[s + i];
      hs[i] = H(x, y);
      qs[i] = o.periodic ? x - TWO_PI * Math.floor((x + Math.PI) / TWO_PI) : x;
      vs[i] = Math.abs(y);
    }
    hs.sort(); qs.sort(); vs.sort();
    eMin = Math.min(eMin, percentileSorted(hs, lo)); eMax = Math.max(eMax, percentileSorted(hs, hi));
    qMin = Math.min(qMin, percentileSorted(qs, lo)); qMax = Math.max(qMax, percentileSorted(qs, hi));
    vMax = Math.max(vMax, percentileSorted(vs, hi));
    used++;
  }
  if (used === 0 || ![eMin, eMax, qMin, qMax, vMax].every(Number.isFinite)) return null;
  return { energyMin: eMin, energyMax: eMax, qMin, qMax, vMaxAbs: vMax, joulesPerModelUnit: o.joulesPerModelUnit };
}
