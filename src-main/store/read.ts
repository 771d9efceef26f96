// Reads a whole project from a database in the current schema, checking as it goes: row
// counts and text/blob sizes (in SQL, before any value is pulled into memory), value types,
// sample lengths, SHA-256 checksums, run order, and the shape of every JSON document.
// Errors are plain Errors whose message names the row: "recording 'swing-a' run 2: ...".
import type Database from 'better-sqlite3';
import type { Run } from '../engine/types.ts';
import { parseJsonDocument, type JsonObject, type JsonValue } from './json-document.ts';
import type { ProjectLimits } from './limits.ts';
import { blobToFloat64, sha256Hex } from './samples.ts';
import type { ProjectSnapshot } from './snapshot.ts';
import type { DocumentEntry, NoteEntry, RecordingEntry, Trace, TrialEntry } from './types.ts';
import { checkKind, checkName, checkRun } from './validate.ts';

type Row = Record<string, unknown>;

function text(row: Row, col: string, where: string): string {
  const v = row[col];
  if (typeof v !== 'string') throw new Error(`${where}: column ${col} holds ${v === null ? 'NULL' : typeof v}, expected text`);
  return v;
}

function integer(row: Row, col: string, where: string): number {
  const v = row[col];
  if (typeof v !== 'number' || !Number.isSafeInteger(v)) throw new Error(`${where}: column ${col} is not an integer`);
  return v;
}

/** Checks and decodes one sample blob against its stored count and checksum. */
function samples(row: Row, col: string, count: number, where: string): Float64Array {
  const blob = row[col];
  if (!(blob instanceof Uint8Array)) throw new Error(`${where}: ${col} is not a blob`);
  if (blob.length !== count * 8) throw new Error(`${where}: ${col} holds ${blob.length} bytes, expected ${count} samples x 8 bytes`);
  const sum = row[`${col}_sha256`];
  if (typeof sum !== 'string' || sum !== sha256Hex(blob)) throw new Error(`${where}: sample checksum mismatch in ${col}`);
  return blobToFloat64(blob);
}

function countRows(db: Database.Database, table: string, max: number, what: string): void {
  const n = (db.prepare(`SELECT count(*) AS n FROM ${table}`).get() as { n: number }).n;
  if (n > max) throw new Error(`over the size limits: ${n} ${what}, the limit is ${max}`);
}

/** Refuses the first row whose column is longer (in bytes) than `max`, naming it by `label`. */
function checkSizes(db: Database.Database, sql: string, cols: string[], max: number, label: (r: Row) => string, what: string): void {
  const where = cols.map((c) => `octet_length(${c}) > ${max}`).join(' OR ');
  const row = db.prepare(`${sql} WHERE ${where} LIMIT 1`).get() as Row | undefined;
  if (row) throw new Error(`over the size limits: ${label(row)}: a ${what} is over ${max} bytes`);
}

export function readSnapshot(db: Database.Database, limits: ProjectLimits): ProjectSnapshot {
  // Row counts first.
  countRows(db, 'recordings', limits.maxRecordings, 'recordings');
  for (const t of ['models', 'designs', 'trials', 'notes']) countRows(db, t, limits.maxDocuments, t);
  const manyRuns = db.prepare('SELECT recording_id, count(*) AS n FROM runs GROUP BY recording_id HAVING n > ? LIMIT 1')
    .get(limits.maxRunsPerRecording) as Row | undefined;
  if (manyRuns) throw new Error(`over the size limits: ${String(manyRuns.n)} runs in one recording, the limit is ${limits.maxRunsPerRecording}`);
  const manyTraces = db.prepare('SELECT trial_id, count(*) AS n FROM trial_traces GROUP BY trial_id HAVING n > ? LIMIT 1')
    .get(limits.maxTracesPerTrial) as Row | undefined;
  if (manyTraces) throw new Error(`over the size limits: ${String(manyTraces.n)} traces in one trial, the limit is ${limits.maxTracesPerTrial}`);

  // Sizes of every text and blob, before reading any of them.
  const named = (kind: string) => (r: Row) => `${kind} '${String(r.name)}'`;
  const textMax = limits.maxNameLength * 4; // UTF-16 units -> UTF-8 bytes, at most 4:1 (checked exactly below)
  checkSizes(db, 'SELECT substr(name, 1, 80) AS name FROM recordings', ['name', 'source_file', 'coordinate'], textMax, named('recording'), 'name');
  checkSizes(db, 'SELECT substr(name, 1, 80) AS name FROM recordings',
    ['channels_json', 'units_json', 'import_settings_json', 'warnings_json'], limits.maxJsonBytes, named('recording'), 'JSON document');
  const runLabel = (r: Row) => `recording '${String(r.rec)}' run ${Number(r.run_index) + 1}`;
  const runSql = 'SELECT substr(r.name, 1, 80) AS rec, runs.run_index FROM runs LEFT JOIN recordings r ON r.id = runs.recording_id';
  checkSizes(db, runSql, ['runs.name', 'runs.source', 'runs.t_sha256', 'runs.q_sha256', 'runs.u_sha256'], textMax, runLabel, 'name');
  checkSizes(db, runSql, ['runs.t', 'runs.q', 'runs.u'], limits.maxBlobBytes, runLabel, 'sample blob');
  for (const table of ['models', 'designs']) {
    const kind = table.slice(0, -1);
    checkSizes(db, `SELECT substr(name, 1, 80) AS name FROM ${table}`, ['name', 'kind'], textMax, named(kind), 'name');
    checkSizes(db, `SELECT substr(name, 1, 80) AS name FROM ${table}`, ['body_json'], limits.maxJsonBytes, named(kind), 'JSON document');
  }
  checkSizes(db, 'SELECT substr(name, 1, 80) AS name FROM trials', ['name', 'kind'], textMax, named('trial'), 'name');
  checkSizes(db, 'SELECT substr(name, 1, 80) AS name FROM trials', ['settings_json', 'metrics_json'], limits.maxJsonBytes, named('trial'), 'JSON document');
  const traceSql = 'SELECT substr(t.name, 1, 80) AS name FROM trial_traces x LEFT JOIN trials t ON t.id = x.trial_id';
  checkSizes(db, traceSql, ['x.name', 'x.unit', 'x.data_sha256'], textMax, named('trial'), 'trace name');
  checkSizes(db, traceSql, ['x.data'], limits.maxBlobBytes, named('trial'), 'trace blob');
  checkSizes(db, 'SELECT substr(name, 1, 80) AS name FROM notes', ['name'], textMax, named('note'), 'name');
  checkSizes(db, 'SELECT substr(name, 1, 80) AS name FROM notes', ['text'], limits.maxNoteBytes, named('note'), 'text');
  checkSizes(db, 'SELECT \'app\' AS name FROM app', ['app_version', 'created_at', 'modified_at'], textMax, () => 'the app table', 'value');

  // The app row.
  const apps = db.prepare('SELECT app_version, created_at, modified_at FROM app').all() as Row[];
  if (apps.length !== 1) throw new Error(`damaged: the app table holds ${apps.length} rows, expected 1`);
  const info = {
    appVersion: checkName(text(apps[0], 'app_version', 'app table'), 'app table: app_version', limits),
    createdAt: checkName(text(apps[0], 'created_at', 'app table'), 'app table: created_at', limits),
    modifiedAt: checkName(text(apps[0], 'modified_at', 'app table'), 'app table: modified_at', limits),
  };

  // Recordings and their runs.
  const recordings: RecordingEntry[] = [];
  const runsOf = db.prepare('SELECT * FROM runs WHERE recording_id = ? ORDER BY run_index');
  let runsRead = 0;
  for (const row of db.prepare('SELECT * FROM recordings ORDER BY position').all() as Row[]) {
    const name = checkName(text(row, 'name', 'a recording'), 'a recording: name', limits);
    const where = `recording '${name}'`;
    const coordinate = text(row, 'coordinate', where);
    if (coordinate !== 'angle' && coordinate !== 'linear') throw new Error(`${where}: coordinate is "${coordinate}", expected angle or linear`);
    const channels = jsonStrings(text(row, 'channels_json', where), `${where} channels`, limits);
    const units = jsonStrings(text(row, 'units_json', where), `${where} units`, limits);
    if (units.length !== channels.length) throw new Error(`${where}: ${units.length} units for ${channels.length} channels`);
    const runs: Run[] = [];
    for (const r of runsOf.iterate(row.id) as IterableIterator<Row>) {
      const k = runs.length;
      const runWhere = `${where} run ${k + 1}`;
      if (integer(r, 'run_index', runWhere) !== k) throw new Error(`${runWhere}: run index ${String(r.run_index)} out of sequence`);
      const count = integer(r, 'samples', runWhere);
      const run: Record<string, unknown> = {
        name: text(r, 'name', runWhere),
        source: text(r, 'source', runWhere),
        t: samples(r, 't', count, runWhere),
        q: samples(r, 'q', count, runWhere),
      };
      if (r.u !== null || r.u_sha256 !== null) run.u = samples(r, 'u', count, runWhere);
      runs.push(checkRun(run, runWhere, limits, false));
    }
    if (runs.length === 0) throw new Error(`${where}: no runs`);
    runsRead += runs.length;
    recordings.push({
      name,
      sourceFile: checkName(text(row, 'source_file', where), `${where}: source_file`, limits, true),
      channels,
      units,
      importSettings: parseJsonDocument(text(row, 'import_settings_json', where), 'object', limits.maxJsonDepth, `${where} import settings`) as JsonObject,
      warnings: parseJsonDocument(text(row, 'warnings_json', where), 'array', limits.maxJsonDepth, `${where} warnings`) as JsonValue[],
      recording: { coordinate, runs },
    });
  }
  const allRuns = (db.prepare('SELECT count(*) AS n FROM runs').get() as { n: number }).n;
  if (allRuns !== runsRead) throw new Error(`damaged: ${allRuns - runsRead} runs belong to no recording`);

  // Models and designs.
  const documents = (table: 'models' | 'designs'): DocumentEntry[] => {
    const kind = table.slice(0, -1);
    return (db.prepare(`SELECT * FROM ${table} ORDER BY position`).all() as Row[]).map((row) => {
      const name = checkName(text(row, 'name', `a ${kind}`), `a ${kind}: name`, limits);
      const where = `${kind} '${name}'`;
      return {
        name,
        kind: checkKind(text(row, 'kind', where), `${where}: kind`, limits),
        body: parseJsonDocument(text(row, 'body_json', where), 'object', limits.maxJsonDepth, `${where} body`) as JsonObject,
      };
    });
  };
  const models = documents('models');
  const designs = documents('designs');

  // Trials and their traces.
  const tracesOf = db.prepare('SELECT * FROM trial_traces WHERE trial_id = ? ORDER BY trace_index');
  let tracesRead = 0;
  const trials: TrialEntry[] = (db.prepare('SELECT * FROM trials ORDER BY position').all() as Row[]).map((row) => {
    const name = checkName(text(row, 'name', 'a trial'), 'a trial: name', limits);
    const where = `trial '${name}'`;
    const traces: Trace[] = [];
    for (const r of tracesOf.iterate(row.id) as IterableIterator<Row>) {
      const k = traces.length;
      const traceWhere = `${where} trace ${k + 1}`;
      if (integer(r, 'trace_index', traceWhere) !== k) throw new Error(`${traceWhere}: trace index ${String(r.trace_index)} out of sequence`);
      traces.push({
        name: checkName(text(r, 'name', traceWhere), `${traceWhere}: name`, limits),
        unit: checkName(text(r, 'unit', traceWhere), `${traceWhere}: unit`, limits, true),
        data: samples(r, 'data', integer(r, 'samples', traceWhere), `${traceWhere} '${String(r.name)}'`),
      });
    }
    tracesRead += traces.length;
    return {
      name,
      kind: checkKind(text(row, 'kind', where), `${where}: kind`, limits),
      settings: parseJsonDocument(text(row, 'settings_json', where), 'object', limits.maxJsonDepth, `${where} settings`) as JsonObject,
      metrics: parseJsonDocument(text(row, 'metrics_json', where), 'object', limits.maxJsonDepth, `${where} metrics`) as JsonObject,
      traces,
    };
  });
  const allTraces = (db.prepare('SELECT count(*) AS n FROM trial_traces').get() as { n: number }).n;
  if (allTraces !== tracesRead) throw new Error(`damaged: ${allTraces - tracesRead} traces belong to no trial`);

  // Notes.
  const notes: NoteEntry[] = (db.prepare('SELECT * FROM notes ORDER BY position').all() as Row[]).map((row) => {
    const name = checkName(text(row, 'name', 'a note'), 'a note: name', limits);
    return { name, text: text(row, 'text', `note '${name}'`) };
  });

  return { info, recordings, models, designs, trials, notes };
}

function jsonStrings(raw: string, where: string, limits: ProjectLimits): string[] {
  const v = parseJsonDocument(raw, 'array', 1, where) as JsonValue[];
  if (v.length > limits.maxChannels) throw new Error(`${where}: ${v.length} entries, over the limit of ${limits.maxChannels}`);
  return v.map((s, i) => checkName(s, `${where}[${i}]`, limits, true));
}
