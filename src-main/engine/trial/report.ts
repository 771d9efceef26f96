// Text forms of a trial for the CLI and export (docs/trial-format.md): one JSON line with the
// metrics of a trial, and one JSON line that summarises a Monte Carlo batch (the trace as CSV is
// src-main/export/csv.ts). Pure string building; writing files is the caller's job.
import type { TrialMetrics } from './metrics.ts';

/** One JSON line for one trial: {"kind":"trial","status",...,"converged",...metrics}. Non-finite numbers become null. */
export function metricsLine(status: string, message: string, metrics: TrialMetrics | null): string {
  return JSON.stringify({ kind: 'trial', status, message, converged: metrics?.converged ?? false, metrics });
}

export interface MonteCarloSummaryInput {
  status: string;
  message: string;
  runs: number;
  mismatch: number;
  seed: number;
  /** Metrics of the completed runs (null where a run produced none). */
  metrics: (TrialMetrics | null)[];
  converged: boolean[];
}

function quantile(sorted: number[], p: number): number | null {
  if (sorted.length === 0) return null;
  const i = Math.min(sorted.length - 1, Math.max(0, Math.ceil(p * sorted.length) - 1)); // nearest-rank (common practice)
  return sorted[i];
}

/** One JSON line for a Monte Carlo batch: share converged and nearest-rank quantiles of the main metrics. */
export function monteCarloLine(s: MonteCarloSummaryInput): string {
  const ms = s.metrics.filter((m): m is TrialMetrics => m !== null);
  const sorted = (f: (m: TrialMetrics) => number | null) => ms.map(f).filter((x): x is number => x !== null && Number.isFinite(x)).sort((a, b) => a - b);
  const ttb = sorted((m) => m.timeToBand);
  const err = sorted((m) => Math.abs(m.finalRelError));
  const J = sorted((m) => m.J);
  const peak = sorted((m) => m.peakU);
  const completed = s.converged.length;
  const convergedCount = s.converged.filter(Boolean).length;
  return JSON.stringify({
    kind: 'monte-carlo', status: s.status, message: s.message, runs: s.runs, completed, mismatch: s.mismatch, seed: s.seed,
    convergedCount, convergedShare: completed > 0 ? convergedCount / completed : null,
    timeToBand: { median: quantile(ttb, 0.5), p95: quantile(ttb, 0.95), max: ttb.length ? ttb[ttb.length - 1] : null, settled: ttb.length },
    finalAbsRelError: { median: quantile(err, 0.5), p95: quantile(err, 0.95), max: err.length ? err[err.length - 1] : null },
    J: { median: quantile(J, 0.5), p95: quantile(J, 0.95) },
    peakU: { max: peak.length ? peak[peak.length - 1] : null },
  });
}
