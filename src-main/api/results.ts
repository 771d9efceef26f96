import type { TrialMetrics } from '../engine/trial/metrics.ts';
import type { TrialSettings } from '../design/trial-settings.ts';
import type { EnergyModel } from '../engine/learn/index.ts';
import type { ControllerDesign } from '../design/types.ts';
// Result shapes of the operations in ./table.ts (types only: the renderer imports these).

export interface AppInfo {
  name: string;
  version: string;
  projectSchema: number;
  /** The safety cautions shown wherever a controller is armed or exported. */
  cautions: string[];
}

export interface RecordingSummary {
  /** Unique within the project. */
  name: string;
  sourceFile: string;
  coordinate: 'angle' | 'linear';
  runs: { name: string; samples: number; sampleRate: number; duration: number; min: number; max: number }[];
  warnings: string[];
  fixes: string[];
}

export interface ProjectSummary {
  path: string | null;
  dirty: boolean;
  recordings: RecordingSummary[];
  models: { name: string; kind: string }[];
  designs: { name: string; kind: string }[];
  trials: { name: string; kind: string }[];
}

export interface ImportSummary {
  recording: RecordingSummary;
  project: ProjectSummary;
}

export interface Trace {
  t: number[];
  q: number[];
  /** Whether the points were decimated (extremes kept per bucket). */
  decimated: boolean;
  /** The whole run's time span (for zooming back out). */
  tStart: number;
  tEnd: number;
}

export interface DialogOpen {
  paths: string[];
}

export interface DialogSave {
  path: string | null;
}

/** The headline of a learned model (the full model is in ModelDetail). */
export interface ModelSummary {
  name: string;
  recording: string;
  status: EnergyModel['status'];
  verdict: EnergyModel['verdict'];
  formula: string;
  units: EnergyModel['units'];
  lambda: number;
  project: ProjectSummary;
}

export interface RunEnergy {
  run: string;
  t: number[];
  q: number[];
  v: number[];
  H: number[];
  /** (max H - min H) / mean H over the run, for the conservation table. */
  relativeSpread: number;
}

export interface ModelDetail {
  name: string;
  recording: string;
  /** The model document as stored (NaN written as null). */
  model: EnergyModel;
  runs: RunEnergy[];
  /** V(q) = H(q, 0) on the data's range. */
  potential: { q: number[]; V: number[] };
}

export interface EnergyGrid {
  q: number[];
  v: number[];
  /** Row-major over v then q: H[j * nq + i] = H(q[i], v[j]). */
  H: number[];
}

export interface DesignSummary {
  name: string;
  model: string;
  design: ControllerDesign;
  project: ProjectSummary;
}

export interface DesignDetail {
  name: string;
  model: string;
  design: ControllerDesign;
}

/** The trial's trace for drawing: decimated keeping each column's extremes per bucket. */
export interface TrialTrace {
  t: number[];
  q: number[];
  v: number[];
  u: number[];
  H: number[];
  /** Supervisor stage per row (staged designs). */
  stage?: number[];
  decimated: boolean;
  /** Rows of the full trace (kept in the project). */
  samples: number;
}

/**
 * Trial metrics as JSON: engine/trial TrialMetrics, where every number that may be non-finite
 * (JSON writes NaN and infinities as null) arrives as number | null; target, band and the cycle
 * count are always finite.
 */
export type TrialMetricsJson = {
  [K in keyof TrialMetrics]: K extends 'target' | 'band' | 'cycles' ? TrialMetrics[K] : TrialMetrics[K] extends number ? number | null : TrialMetrics[K];
};

export interface TrialRow {
  name: string;
  status: string;
  message: string;
  converged: boolean;
  finalWell: number | null;
  metrics: TrialMetricsJson | null;
}

export interface MonteCarloSummary {
  kind: 'monte-carlo';
  status: string;
  message: string;
  runs: number;
  completed: number;
  mismatch: number;
  seed: number;
  convergedCount: number;
  convergedShare: number | null;
  timeToBand: { median: number | null; p95: number | null; max: number | null; settled: number };
  finalAbsRelError: { median: number | null; p95: number | null; max: number | null };
  J: { median: number | null; p95: number | null };
  peakU: { max: number | null };
  workers: number;
  wallMs: number;
}

/** The outcome line of a trial, as `ergostat trial` prints it (design/run-trial.ts). */
export interface TrialOutcomeJson {
  kind: 'trial';
  design: string;
  plant: string;
  status: string;
  message: string;
  target: { kind: string; energy: number; well?: number };
  converged: boolean;
  finalWell: number | null;
  metrics: TrialMetricsJson | null;
  switches?: { t: number; from: number; to: number }[];
  /** Baselines on the same setup and metrics (the design itself is `metrics`). */
  baselines: TrialRow[];
  monteCarlo: MonteCarloSummary | null;
}

/** The settings of a trial as stored (the trial engine's own shape). */
export type TrialSettingsJson = TrialSettings;

export interface TrialDetail {
  name: string;
  design: string;
  settings: TrialSettingsJson;
  outcome: TrialOutcomeJson;
  /** Per-run Monte Carlo figures, for the spread plots. */
  monteCarloRuns: { index: number; converged: boolean; timeToBand: number | null; finalRelError: number | null; peakU: number | null }[];
  warnings: string[];
  stages: { index: number; name: string; energy: number }[];
  /** H* of the stage the design ends in (the metrics' target). */
  finalTarget: number;
  uMax: number | null;
  units: { q: 'rad' | 'm'; energy: string; input: string };
  wells: { index: number; q: number }[];
  barriers: { q: number; energy: number }[];
  trace: TrialTrace;
  /** H of the design's model on a grid around the trajectory (level sets of the phase portrait). */
  grid: EnergyGrid;
}

export interface TrialRunResult extends TrialDetail {
  project: ProjectSummary;
}

export interface ExportResult {
  folder: string;
  files: { path: string; kind: 'c' | 'json' | 'csv' | 'svg' | 'png' | 'html'; bytes: number }[];
  /** What the caller should know (C test-vector coverage, values written as null, ...). */
  notes: string[];
}

export interface DialogFolder {
  path: string | null;
}
