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
    'recordings.trace': ({ recording, run, maxPoints }) => {
      const e = ws.store.recordings.get(recording);
      if (!e) throw new OperationError('failed', `no recording named "${recording}"`);
      const r = e.recording.runs[run];
      if (!r) throw new OperationError('failed', `recording "${recording}" has ${e.recording.runs.length} run(s); run ${run} does not exist`);
      const d = decimateMinMax(r.t, r.q, maxPoints);
      return { t: d.t, q: d.y, decimated: d.decimated };
    },
  };
}
