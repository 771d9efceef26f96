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
