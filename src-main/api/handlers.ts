// The handlers behind the operation table, over one Workspace. Used by Electron's main
// process, the browser bridge and the tests alike. Operations whose engine has not landed are
// absent (the gate answers "not available in this build").
import type { Handlers } from './gate.ts';
import type { Operations } from './table.ts';
import { OperationError } from './define.ts';
import { SAFETY_CAUTIONS } from '../safety.ts';
import { APP_VERSION } from '../version.ts';
import { SCHEMA_VERSION } from '../store/index.ts';
import { importRecordings, parseCsvText, type ColumnMapping } from '../recordings/index.ts';
import { Workspace } from './workspace.ts';
import { decimateMinMax } from './decimate.ts';
import { runJob, JobCancelled } from '../jobs/run-job.ts';
import { serializeModel, validateModel } from '../model/index.ts';
import type { EnergyModel } from '../engine/learn/index.ts';
import { demoRecording } from '../demo/rigs.ts';
import { readDesign } from '../design/validate.ts';
import type { ControllerDesign } from '../design/types.ts';
import type { LevelTargetRequest } from '../design/level-hold.ts';
import { energyGrid, potentialCurve, runEnergies } from './energy-views.ts';
import { availableParallelism } from 'node:os';
import { isAbsolute } from 'node:path';
import { TrialSettingsError, checkTrialSettings, type TrialSettings } from '../design/trial-settings.ts';
import type { DesignTrialResult } from '../design/run-trial.ts';
import { readTrialEntry, trialDetail, trialEntry } from './trial-views.ts';
import { writeExport, type ExportTrial } from './export-bundle.ts';
import type { BaselineRow } from '../engine/trial/index.ts';

export function createHandlers(ws: Workspace = new Workspace()): Partial<Handlers<Operations>> {
  const mappingOf = (m: { time: string; position: string; run?: string; input?: string; angle?: boolean }): ColumnMapping => ({ ...m });
  return {
    'app.info': () => ({ name: 'Ergostat', version: APP_VERSION, projectSchema: SCHEMA_VERSION, cautions: [...SAFETY_CAUTIONS] }),
    'project.state': () => ws.summary(),
    'project.new': () => {
      ws.reset();
      return ws.summary();
    },
    'project.open': ({ path }) => {
      ws.open(path);
      return ws.summary();
    },
    'project.save': ({ path }) => {
      ws.save(path);
      return ws.summary();
    },
    'recordings.importFiles': async ({ files, mapping }, ctx) => {
      ctx.progress({ fraction: NaN, message: `importing ${files.length} file(s)` });
      const result = await importRecordings(files, mappingOf(mapping));
      if (ctx.signal.aborted) throw new OperationError('cancelled', 'import cancelled');
      const recording = ws.addImport(result, files, mappingOf(mapping));
      return { recording, project: ws.summary() };
    },
    'recordings.importText': ({ name, text, mapping }) => {
      const result = parseCsvText(text, name, mappingOf(mapping));
      const recording = ws.addImport(result, [name], mappingOf(mapping));
      return { recording, project: ws.summary() };
    },
    'recordings.demo': ({ rig }) => {
      const d = demoRecording(rig);
      const result = parseCsvText(d.file.text, d.file.name, d.mapping);
      const recording = ws.addImport(result, [d.file.name], d.mapping);
      return { recording, project: ws.summary() };
    },
    'recordings.trace': ({ recording, run, maxPoints, tMin, tMax }) => {
      const e = ws.store.recordings.peek(recording);
      if (!e) throw new OperationError('failed', `no recording named "${recording}"`);
      const r = e.recording.runs[run];
      if (!r) throw new OperationError('failed', `recording "${recording}" has ${e.recording.runs.length} run(s); run ${run} does not exist`);
      // The window [tMin, tMax] by binary search on the sorted times, one sample of context each side.
      const lower = (x: number) => { let lo = 0, hi = r.t.length; while (lo < hi) { const mid = (lo + hi) >> 1; if (r.t[mid] < x) lo = mid + 1; else hi = mid; } return lo; };
      const i0 = tMin === undefined ? 0 : Math.max(0, lower(tMin) - 1);
      const i1 = tMax === undefined ? r.t.length : Math.min(r.t.length, lower(tMax) + 1);
      const d = decimateMinMax(r.t.subarray(i0, Math.max(i0 + 1, i1)), r.q.subarray(i0, Math.max(i0 + 1, i1)), maxPoints);
      return { t: d.t, q: d.y, decimated: d.decimated, tStart: r.t[0], tEnd: r.t[r.t.length - 1] };
    },
    'energy.learn': async ({ recording, mass, maxDegree, userTerms }, ctx) => {
      const e = ws.store.recordings.peek(recording);
      if (!e) throw new OperationError('failed', `no recording named "${recording}"`);
      let model: EnergyModel;
      try {
        model = await runJob('learn', { recording: e.recording, options: { mass, maxDegree, userTerms } }, {
          signal: ctx.signal,
          onProgress: (fraction, message) => ctx.progress({ fraction, message }),
        });
      } catch (err) {
        if (err instanceof JobCancelled) throw new OperationError('cancelled', 'learning cancelled');
        throw err;
      }
      const name = ws.uniqueName((n) => ws.store.models.has(n), `${recording} energy`);
      ws.store.models.put({ name, kind: 'energy-model', body: { recording, model: JSON.parse(serializeModel(model)) } });
      ws.dirty = true;
      return { name, recording, status: model.status, verdict: model.verdict, formula: model.formula, units: model.units, lambda: model.lambda, project: ws.summary() };
    },
    'energy.get': ({ model: name }) => {
      const { model, recording } = storedModel(ws, name);
      const rec = ws.store.recordings.peek(recording);
      return { name, recording, model, runs: rec ? runEnergies(model, rec.recording) : [], potential: potentialCurve(model) };
    },
    'energy.grid': ({ model: name, qMin, qMax, vMin, vMax, nq, nv }) => {
      const { model } = storedModel(ws, name);
      if (model.status !== 'ok') throw new OperationError('failed', `model "${name}" has no conserved energy`);
      return energyGrid(model, qMin, qMax, vMin, vMax, nq, nv);
    },
    'controller.design': async (a, ctx) => {
      const { model } = storedModel(ws, a.model);
      if (model.status !== 'ok') throw new OperationError('failed', `model "${a.model}" has no conserved energy to control`);
      const need = (x: number | undefined, what: string) => {
        if (x === undefined) throw new OperationError('bad-arguments', `controller.design: ${what} is required for this target`);
        return x;
      };
      let design: ControllerDesign;
      try {
        if (a.mode === 'level-hold') {
          const target: LevelTargetRequest =
            a.target.kind === 'energy' ? { kind: 'energy', energy: need(a.target.value, 'the target energy'), well: a.well }
            : a.target.kind === 'amplitude' ? { kind: 'amplitude', amplitude: need(a.target.value, 'the target amplitude'), well: a.well }
            : { kind: 'at-rest', well: a.well };
          design = await runJob('design', { model, kind: 'level-hold', options: {
            target, uMax: a.uMax, rateHz: a.rateHz, integral: a.integral, mass: a.mass, inputGain: a.inputGain, weights: a.weights, source: `model "${a.model}"`,
          } }, { signal: ctx.signal, onProgress: (fraction, message) => ctx.progress({ fraction, message }) });
        } else {
          const level = a.target.kind === 'energy' ? { kind: 'energy' as const, energy: need(a.target.value, 'the level') }
            : a.target.kind === 'amplitude' ? { kind: 'amplitude' as const, amplitude: need(a.target.value, 'the amplitude') }
            : { kind: 'at-rest' as const };
          design = await runJob('design', { model, kind: 'well-hop', options: {
            toWell: need(a.toWell, 'the target well'), level, fromWell: a.well, uMax: need(a.uMax, 'u_max'), margin: a.margin, sampleRateHz: a.rateHz, source: `model "${a.model}"`,
          } }, { signal: ctx.signal, onProgress: (fraction, message) => ctx.progress({ fraction, message }) });
        }
      } catch (err) {
        if (err instanceof JobCancelled) throw new OperationError('cancelled', 'design cancelled');
        throw err;
      }
      const name = ws.uniqueName((n) => ws.store.designs.has(n), a.mode === 'well-hop' ? `${a.model} hop to well ${a.toWell}` : `${a.model} level hold`);
      ws.store.designs.put({ name, kind: design.kind, body: { model: a.model, design: JSON.parse(JSON.stringify(design)) } });
      ws.dirty = true;
      return { name, model: a.model, design, project: ws.summary() };
    },
    'controller.get': ({ design: name }) => {
      const d = storedDesign(ws, name);
      return { name, model: d.model, design: d.design };
    },
    'trial.run': async (a, ctx) => {
      const { design } = storedDesign(ws, a.design);
      if (a.sensorRange !== undefined && a.sensorBits === undefined) throw new OperationError('bad-arguments', 'trial.run: arguments.sensorRange needs arguments.sensorBits');
      if (a.mismatch !== undefined && a.runs === undefined) throw new OperationError('bad-arguments', 'trial.run: arguments.mismatch needs arguments.runs (the Monte Carlo)');
      const settings: TrialSettings = {
        q0: a.q0, v0: a.v0, duration: a.duration, runs: a.runs ?? null, mismatch: a.mismatch ?? 0,
        // Leave one core to the window; at most 4 workers (Monte Carlo runs are short).
        workers: Math.max(1, Math.min(4, availableParallelism() - 1)),
        bits: a.sensorBits ?? null, range: a.sensorRange ?? null, noise: a.noise ?? 0, estimator: a.estimator ?? 'difference', seed: a.seed ?? 0,
      };
      try {
        checkTrialSettings(settings, design);
      } catch (err) {
        if (err instanceof TrialSettingsError) throw new OperationError('bad-arguments', `trial.run: ${err.message}`);
        throw err;
      }
      let r: DesignTrialResult;
      try {
        r = await runJob('trial', { design, settings, designLabel: a.design }, { signal: ctx.signal, onProgress: (fraction, message) => ctx.progress({ fraction, message }) });
      } catch (err) {
        if (err instanceof JobCancelled) throw new OperationError('cancelled', 'trial cancelled');
        throw new OperationError('failed', `trial.run: ${(err as Error).message}`);
      }
      const name = ws.uniqueName((n) => ws.store.trials.has(n), `${a.design} trial`);
      ws.store.trials.put(trialEntry(name, a.design, settings, r));
      ws.dirty = true;
      const back = readTrialEntry(ws.store.trials.peek(name)!);
      return { ...trialDetail(name, a.design, design, settings, back.outcome, back.monteCarloRuns, back.warnings, r.trace, a.maxPoints ?? 4000), project: ws.summary() };
    },
    'trial.get': ({ trial: name, maxPoints }) => {
      const e = ws.store.trials.peek(name);
      if (!e) throw new OperationError('failed', `no trial named "${name}"`);
      let t;
      try {
        t = readTrialEntry(e);
      } catch (err) {
        throw new OperationError('failed', (err as Error).message);
      }
      const { design } = storedDesign(ws, t.design);
      return trialDetail(name, t.design, design, t.settings, t.outcome, t.monteCarloRuns, t.warnings, t.trace, maxPoints ?? 4000);
    },
    'export.write': (a) => {
      if (a.cautionsAcknowledged !== true) {
        throw new OperationError('forbidden', 'export.write: refused — the safety cautions must be shown and acknowledged first (arguments.cautionsAcknowledged: true)');
      }
      if (!isAbsolute(a.folder)) throw new OperationError('bad-arguments', `export.write: arguments.folder: expected an absolute path, got "${a.folder.slice(0, 200)}"`);
      const o = a.outputs;
      if (!o.c && !o.report && !o.plots && !o.json && !o.csv) throw new OperationError('bad-arguments', 'export.write: arguments.outputs: choose at least one of c, report, plots, json, csv');
      const { design, model: modelName } = storedDesign(ws, a.design);
      let model: EnergyModel | undefined;
      if (ws.store.models.has(modelName)) model = storedModel(ws, modelName).model;
      const trials: ExportTrial[] = (a.trials ?? []).map((tn, i) => {
        const e = ws.store.trials.peek(tn);
        if (!e) throw new OperationError('bad-arguments', `export.write: arguments.trials[${i}]: no trial named "${tn}"`);
        let t;
        try {
          t = readTrialEntry(e);
        } catch (err) {
          throw new OperationError('failed', (err as Error).message);
        }
        if (t.design !== a.design) throw new OperationError('bad-arguments', `export.write: arguments.trials[${i}]: trial "${tn}" is of design "${t.design}", not "${a.design}"`);
        return { name: tn, trace: t.trace, baselines: t.outcome.baselines as unknown as BaselineRow[] };
      });
      try {
        return writeExport(a.folder, `Ergostat report: ${a.design}`, design, model, trials, o);
      } catch (err) {
        const code = (err as NodeJS.ErrnoException).code;
        throw new OperationError('failed', `export.write: ${code ? `cannot write into ${a.folder} (${code})` : (err as Error).message}`);
      }
    },
  };
}

/** A stored design, validated again on the way out (project files are untrusted). */
function storedDesign(ws: Workspace, name: string): { design: ControllerDesign; model: string } {
  const d = ws.store.designs.peek(name);
  if (!d) throw new OperationError('failed', `no design named "${name}"`);
  const body = d.body as { model?: unknown; design?: unknown };
  return { design: readDesign(body.design, `design "${name}"`), model: typeof body.model === 'string' ? body.model : '' };
}

/** A stored model, validated again on the way out (project files are untrusted). */
function storedModel(ws: Workspace, name: string): { model: EnergyModel; recording: string } {
  const d = ws.store.models.peek(name);
  if (!d) throw new OperationError('failed', `no model named "${name}"`);
  const body = d.body as { recording?: unknown; model?: unknown };
  return { model: validateModel(body.model, `model "${name}"`), recording: typeof body.recording === 'string' ? body.recording : '' };
}
