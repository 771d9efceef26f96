// The one table of operations the UI may ask for. Main (IPC), the preload, the renderer, the
// browser bridge, the CLI and the tests all use this declaration; ./gate.ts validates every call
// against it before a handler runs. Results are plain JSON-able data (typed arrays allowed over IPC).
import { operation } from './define.ts';
import * as v from './validate.ts';
import type * as R from './results.ts';

const path = v.string({ min: 1, max: 4096 });
const entryName = v.string({ min: 1, max: 200 });
const columnMapping = v.object({
  time: v.string({ min: 1, max: 200 }),
  position: v.string({ min: 1, max: 200 }),
  run: v.optional(v.string({ min: 1, max: 200 })),
  input: v.optional(v.string({ min: 1, max: 200 })),
  angle: v.optional(v.boolean()),
});

export interface DesignArgs {
  model: string;
  mode: 'level-hold' | 'well-hop';
  target: { kind: 'energy' | 'amplitude' | 'at-rest'; value?: number };
  well?: number;
  toWell?: number;
  margin?: number;
  uMax?: number;
  rateHz?: number;
  integral?: boolean;
  mass?: number;
  inputGain?: number;
  weights?: { Q: number; R: number };
}

export interface TrialRunArgs {
  design: string;
  q0: number;
  v0: number;
  duration: number;
  sensorBits?: number;
  sensorRange?: number;
  noise?: number;
  estimator?: 'difference' | 'observer';
  runs?: number;
  mismatch?: number;
  seed?: number;
  maxPoints?: number;
}

export interface ExportArgs {
  design: string;
  folder: string;
  outputs: { c?: { name: string }; report?: boolean; plots?: boolean; json?: boolean; csv?: boolean };
  trials?: string[];
  cautionsAcknowledged: boolean;
}

const maxPoints = v.optional(v.number({ integer: true, min: 100, max: 200_000 }));

export const operations = {
  'app.info': operation<{}, R.AppInfo>('Version, file format version and the safety cautions.', v.object({})),
  'project.state': operation<{}, R.ProjectSummary>('What the open project holds.', v.object({})),
  'project.new': operation<{}, R.ProjectSummary>('Start an empty project (the caller confirms unsaved changes first).', v.object({})),
  'project.open': operation<{ path: string }, R.ProjectSummary>('Open a .ergostat project file (checked, never trusted).', v.object({ path })),
  'project.save': operation<{ path?: string }, R.ProjectSummary>('Save the project (atomically) to its path or a new one.', v.object({ path: v.optional(path) })),
  'recordings.importFiles': operation<{ files: string[]; mapping: v.Infer<typeof columnMapping> }, R.ImportSummary>(
    'Import CSV recordings from files.', v.object({ files: v.array(path, { min: 1, max: 200 }), mapping: columnMapping }), { long: true }),
  'recordings.importText': operation<{ name: string; text: string; mapping: v.Infer<typeof columnMapping> }, R.ImportSummary>(
    'Import one CSV recording given as text (drag-and-drop in browser mode).',
    v.object({ name: v.string({ min: 1, max: 255 }), text: v.string({ max: 64 * 1024 * 1024 }), mapping: columnMapping })),
  'recordings.demo': operation<{ rig: 'pendulum' | 'strip' }, R.ImportSummary>('Add the demo recordings of an invented rig.', v.object({ rig: v.literal('pendulum', 'strip') })),
  'recordings.trace': operation<{ recording: string; run: number; maxPoints: number; tMin?: number; tMax?: number }, R.Trace>(
    "One run's samples in [tMin, tMax] (default: all), decimated to at most maxPoints keeping each bucket's extremes.",
    v.object({
      recording: entryName, run: v.number({ integer: true, min: 0 }), maxPoints: v.number({ integer: true, min: 10, max: 200_000 }),
      tMin: v.optional(v.number()), tMax: v.optional(v.number()),
    })),
  'energy.learn': operation<{ recording: string; mass?: number; maxDegree?: number; userTerms?: string[] }, R.ModelSummary>(
    'Learn the conserved energy of a recording (runs in a worker thread).',
    v.object({
      recording: entryName,
      mass: v.optional(v.number({ min: 1e-9, max: 1e9 })),
      maxDegree: v.optional(v.number({ integer: true, min: 1, max: 10 })),
      userTerms: v.optional(v.array(v.string({ min: 1, max: 500 }), { max: 20 })),
    }), { long: true }),
  'energy.get': operation<{ model: string }, R.ModelDetail>('A learned model in full, with its energy along each run of its recording.', v.object({ model: entryName })),
  'energy.grid': operation<{ model: string; qMin: number; qMax: number; vMin: number; vMax: number; nq: number; nv: number }, R.EnergyGrid>(
    'H on a grid of (q, v), for level sets in phase portraits.',
    v.object({ model: entryName, qMin: v.number(), qMax: v.number(), vMin: v.number(), vMax: v.number(), nq: v.number({ integer: true, min: 2, max: 400 }), nv: v.number({ integer: true, min: 2, max: 400 }) })),
  'controller.design': operation<DesignArgs, R.DesignSummary>(
    'Design a level hold or a well hop from a learned model (runs in a worker thread).',
    v.object({
      model: entryName,
      mode: v.literal('level-hold', 'well-hop'),
      target: v.object({ kind: v.literal('energy', 'amplitude', 'at-rest'), value: v.optional(v.number()) }),
      well: v.optional(v.number({ integer: true, min: 1, max: 100 })),
      toWell: v.optional(v.number({ integer: true, min: 1, max: 100 })),
      margin: v.optional(v.number({ min: 0, max: 10 })),
      uMax: v.optional(v.number({ min: 0 })),
      rateHz: v.optional(v.number({ min: 1, max: 1e6 })),
      integral: v.optional(v.boolean()),
      mass: v.optional(v.number({ min: 1e-12 })),
      inputGain: v.optional(v.number({ min: 1e-12 })),
      weights: v.optional(v.object({ Q: v.number({ min: 0 }), R: v.number({ min: 0 }) })),
    }), { long: true }),
  'controller.get': operation<{ design: string }, R.DesignDetail>('A stored controller design in full.', v.object({ design: entryName })),
  'trial.run': operation<TrialRunArgs, R.TrialRunResult>(
    'Run a closed-loop trial of a design on its own model, with the baselines and an optional Monte Carlo (worker threads); stored in the project.',
    v.object({
      design: entryName,
      q0: v.number({ min: -1e6, max: 1e6 }),
      v0: v.number({ min: -1e6, max: 1e6 }),
      duration: v.number({ min: 1e-3, max: 1e5 }),
      sensorBits: v.optional(v.number({ integer: true, min: 1, max: 32 })),
      sensorRange: v.optional(v.number({ min: 1e-12, max: 1e6 })),
      noise: v.optional(v.number({ min: 0, max: 1e3 })),
      estimator: v.optional(v.literal('difference', 'observer')),
      runs: v.optional(v.number({ integer: true, min: 1, max: 10_000 })),
      mismatch: v.optional(v.number({ min: 0, max: 0.95 })),
      seed: v.optional(v.number({ integer: true, min: 0, max: Number.MAX_SAFE_INTEGER })),
      maxPoints,
    }), { long: true }),
  'trial.get': operation<{ trial: string; maxPoints?: number }, R.TrialDetail>('A stored trial: its settings, metrics, baselines, Monte Carlo and decimated trace.',
    v.object({ trial: entryName, maxPoints })),
  'export.write': operation<ExportArgs, R.ExportResult>(
    'Write a design\'s C99 controller and check program, JSON, trial CSVs, plots and report into a folder (only once the safety cautions are acknowledged).',
    v.object({
      design: entryName,
      folder: path,
      outputs: v.object({
        c: v.optional(v.object({ name: v.string({ min: 1, max: 64, pattern: /^[A-Za-z_][A-Za-z0-9_]*$/ }) })),
        report: v.optional(v.boolean()),
        plots: v.optional(v.boolean()),
        json: v.optional(v.boolean()),
        csv: v.optional(v.boolean()),
      }),
      trials: v.optional(v.array(entryName, { max: 50 })),
      cautionsAcknowledged: v.boolean(),
    })),
  'dialog.folder': operation<{}, R.DialogFolder>('Ask for a folder with the system dialog (desktop only).', v.object({})),
  'dialog.open': operation<{ kind: 'project' | 'recordings' }, R.DialogOpen>('Ask for files with the system dialog (desktop only).', v.object({ kind: v.literal('project', 'recordings') })),
  'dialog.save': operation<{ kind: 'project' | 'json' | 'csv' | 'html' | 'svg' | 'png'; suggestedName: string }, R.DialogSave>(
    'Ask where to save with the system dialog (desktop only).',
    v.object({ kind: v.literal('project', 'json', 'csv', 'html', 'svg', 'png'), suggestedName: v.string({ max: 255 }) })),
} as const;

export type Operations = typeof operations;
export type OperationName = keyof Operations;
export const operationNames = Object.keys(operations) as OperationName[];
