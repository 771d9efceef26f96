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
    'recordings.trace': ({ recording, run, maxPoints }) => {
      const e = ws.store.recordings.peek(recording);
      if (!e) throw new OperationError('failed', `no recording named "${recording}"`);
      const r = e.recording.runs[run];
      if (!r) throw new OperationError('failed', `recording "${recording}" has ${e.recording.runs.length} run(s); run ${run} does not exist`);
      const d = decimateMinMax(r.t, r.q, maxPoints);
      return { t: d.t, q: d.y, decimated: d.decimated };
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
      const d = ws.store.designs.peek(name);
      if (!d) throw new OperationError('failed', `no design named "${name}"`);
      const body = d.body as { model?: unknown; design?: unknown };
      return { name, model: typeof body.model === 'string' ? body.model : '', design: readDesign(body.design, `design "${name}"`) };
    },
  };
}

/** A stored model, validated again on the way out (project files are untrusted). */
function storedModel(ws: Workspace, name: string): { model: EnergyModel; recording: string } {
  const d = ws.store.models.peek(name);
  if (!d) throw new OperationError('failed', `no model named "${name}"`);
  const body = d.body as { recording?: unknown; model?: unknown };
  return { model: validateModel(body.model, `model "${name}"`), recording: typeof body.recording === 'string' ? body.recording : '' };
}
