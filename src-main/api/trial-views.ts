// What the Trials screen draws, and how a trial is kept in the project: the trace decimated for
// drawing with every column's extremes kept (min/max decimation per bucket, common practice for
// long traces), H on a phase-plane grid around the trajectory, and the trial entry (settings JSON,
// outcome JSON, traces as Float64) written and read back.
import type { ControllerDesign } from '../design/types.ts';
import { compileDesignEnergy } from '../design/energy.ts';
import { finalStage } from '../design/final-stage.ts';
import type { DesignTrialResult } from '../design/run-trial.ts';
import type { TrialSettings } from '../design/trial-settings.ts';
import type { Trace } from '../engine/trial/index.ts';
import type { TrialEntry, JsonObject } from '../store/index.ts';
import type { EnergyGrid, TrialDetail, TrialTrace, TrialOutcomeJson } from './results.ts';

const COLUMNS = ['t', 'q', 'v', 'u', 'H'] as const;

/**
 * At most about maxPoints rows: split the rows into buckets and keep, per bucket, its first and
 * last row and the rows holding the minimum and maximum of q, v, u and H, in time order. The
 * bucket count is chosen so that the worst case (10 distinct rows per bucket) fits maxPoints.
 */
export function decimateTrace(trace: Trace, maxPoints: number): TrialTrace {
  const n = trace.t.length;
  const cols = COLUMNS.map((c) => trace[c]);
  const pick = (idx: ArrayLike<number>): TrialTrace => {
    const take = (a: Float64Array) => Array.from(idx, (i) => a[i]);
    const out: TrialTrace = { t: take(trace.t), q: take(trace.q), v: take(trace.v), u: take(trace.u), H: take(trace.H), decimated: idx.length < n, samples: n };
    if (trace.stage) out.stage = take(trace.stage);
    return out;
  };
  if (n <= maxPoints) return pick(Array.from({ length: n }, (_, i) => i));
  const buckets = Math.max(1, Math.floor(maxPoints / 10));
  const keep: number[] = [];
  for (let b = 0; b < buckets; b++) {
    const s = Math.floor((b * n) / buckets);
    const e = Math.floor(((b + 1) * n) / buckets);
    if (e <= s) continue;
    const picks = [s, e - 1];
    for (const a of cols.slice(1)) {
      let lo = s, hi = s;
      for (let i = s + 1; i < e; i++) {
        if (a[i] < a[lo]) lo = i;
        if (a[i] > a[hi]) hi = i;
      }
      picks.push(lo, hi);
    }
    picks.sort((x, y) => x - y);
    for (let k = 0; k < picks.length; k++) if (k === 0 || picks[k] !== picks[k - 1]) keep.push(picks[k]);
  }
  return pick(keep);
}

/** H of the design's model on an nq x nv grid covering the trace (angles: at most two turns each way). */
export function trialGrid(design: ControllerDesign, trace: { q: ArrayLike<number>; v: ArrayLike<number> }, nq = 110, nv = 80): EnergyGrid {
  const en = compileDesignEnergy(design.model.energy, design.model.coordinate, design.model.lambda);
  let qMin = Infinity, qMax = -Infinity, vMax = 0;
  for (let i = 0; i < trace.q.length; i++) {
    const q = trace.q[i], v = trace.v[i];
    if (!Number.isFinite(q) || !Number.isFinite(v)) continue;
    if (q < qMin) qMin = q;
    if (q > qMax) qMax = q;
    if (Math.abs(v) > vMax) vMax = Math.abs(v);
  }
  if (!Number.isFinite(qMin)) { qMin = design.model.validRange.qMin; qMax = design.model.validRange.qMax; }
  if (design.model.coordinate === 'angle') { qMin = Math.max(qMin, -4 * Math.PI); qMax = Math.min(qMax, 4 * Math.PI); }
  const padQ = 0.08 * (qMax - qMin || 1);
  qMin -= padQ;
  qMax += padQ;
  const vl = 1.15 * (vMax || 1);
  const q = Array.from({ length: nq }, (_, i) => qMin + ((qMax - qMin) * i) / (nq - 1));
  const v = Array.from({ length: nv }, (_, j) => -vl + (2 * vl * j) / (nv - 1));
  const H: number[] = new Array(nq * nv);
  for (let j = 0; j < nv; j++) for (let i = 0; i < nq; i++) {
    const h = en.H(q[i], v[j]);
    H[j * nq + i] = Number.isFinite(h) ? h : NaN;
  }
  return { q, v, H };
}

/** A JSON copy with non-finite numbers as null (what the project file and IPC can carry). */
export function jsonClean<T>(x: T): T {
  return JSON.parse(JSON.stringify(x)) as T;
}

/** The trial as a project entry: the settings, the outcome and per-run Monte Carlo figures, the full trace. */
export function trialEntry(name: string, designName: string, settings: TrialSettings, r: DesignTrialResult): TrialEntry {
  const traces: TrialEntry['traces'] = COLUMNS.map((c) => ({ name: c, unit: '', data: r.trace[c] }));
  if (r.trace.stage) traces.push({ name: 'stage', unit: '', data: r.trace.stage });
  return {
    name,
    kind: 'closed-loop',
    settings: jsonClean({ design: designName, ...settings }) as unknown as JsonObject,
    metrics: jsonClean({ outcome: r.outcome, monteCarloRuns: r.monteCarloRuns, switches: r.switches, warnings: r.warnings }) as unknown as JsonObject,
    traces,
  };
}

/** Reads a stored trial back (project files are untrusted: the shapes are checked, naming the field). */
export function readTrialEntry(e: Readonly<TrialEntry>): { design: string; settings: TrialSettings; outcome: TrialOutcomeJson; monteCarloRuns: TrialDetail['monteCarloRuns']; warnings: string[]; trace: Trace } {
  const where = `trial "${e.name}"`;
  const s = e.settings as Record<string, unknown>;
  if (typeof s.design !== 'string') throw new Error(`${where}: settings.design: expected the design's name`);
  const m = e.metrics as Record<string, unknown>;
  const outcome = m.outcome as Record<string, unknown> | undefined;
  if (!outcome || typeof outcome !== 'object' || !Array.isArray(outcome.baselines)) throw new Error(`${where}: metrics.outcome: expected the trial's outcome with its baselines`);
  const col = (name: string) => e.traces.find((t) => t.name === name)?.data;
  const cols = COLUMNS.map((c) => col(c));
  const n = cols[0]?.length ?? 0;
  cols.forEach((a, i) => {
    if (!a || a.length !== n) throw new Error(`${where}: traces: expected a column ${COLUMNS[i]} of ${n} samples`);
  });
  const trace: Trace = { t: cols[0]!, q: cols[1]!, v: cols[2]!, u: cols[3]!, H: cols[4]! };
  const st = col('stage');
  if (st && st.length === n) trace.stage = st;
  const num = (k: string, d: number | null) => (typeof s[k] === 'number' ? (s[k] as number) : d);
  const settings: TrialSettings = {
    q0: num('q0', 0)!, v0: num('v0', 0)!, duration: num('duration', 0)!, runs: num('runs', null), mismatch: num('mismatch', 0)!,
    workers: num('workers', 1)!, bits: num('bits', null), range: num('range', null), noise: num('noise', 0)!,
    estimator: s.estimator === 'observer' ? 'observer' : 'difference', seed: num('seed', 0)!,
  };
  return {
    design: s.design,
    settings,
    outcome: outcome as unknown as TrialOutcomeJson,
    monteCarloRuns: Array.isArray(m.monteCarloRuns) ? (m.monteCarloRuns as TrialDetail['monteCarloRuns']) : [],
    warnings: Array.isArray(m.warnings) ? m.warnings.filter((w): w is string => typeof w === 'string') : [],
    trace,
  };
}

/** The detail the Trials screen shows, from a trial's parts and its design. */
export function trialDetail(
  name: string, designName: string, design: ControllerDesign, settings: TrialSettings, outcome: TrialOutcomeJson,
  monteCarloRuns: TrialDetail['monteCarloRuns'], warnings: string[], trace: Trace, maxPoints: number,
): TrialDetail {
  const d = decimateTrace(trace, maxPoints);
  return {
    name,
    design: designName,
    settings,
    outcome: jsonClean(outcome),
    monteCarloRuns: jsonClean(monteCarloRuns),
    warnings,
    stages: design.stages.map((s) => ({ index: s.index, name: s.name, energy: s.target.energy })),
    finalTarget: finalStage(design).target.energy,
    uMax: design.law.uMax,
    units: { q: design.model.coordinate === 'angle' ? 'rad' : 'm', energy: design.model.units, input: design.input.unit },
    wells: design.model.wells.map((w) => ({ index: w.index, q: w.q })),
    barriers: design.model.barriers.map((b) => ({ q: b.q, energy: b.energy })),
    trace: jsonClean(d),
    grid: jsonClean(trialGrid(design, d)),
  };
}
