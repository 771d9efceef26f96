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
