// Writes a whole project into an empty database in the current schema, in one transaction.
// Entries were checked when they entered the store, so this only lays them out as rows.
import type Database from 'better-sqlite3';
import { float64ToBlob, sha256Hex } from './samples.ts';
import { APPLICATION_ID, SCHEMA_2, SCHEMA_VERSION } from './schema.ts';
import type { ProjectSnapshot } from './snapshot.ts';

export function writeSnapshot(db: Database.Database, snap: ProjectSnapshot): void {
  db.pragma(`application_id = ${APPLICATION_ID}`);
  db.pragma(`user_version = ${SCHEMA_VERSION}`);
  const write = db.transaction(() => {
    for (const stmt of SCHEMA_2) db.exec(stmt);
    db.prepare('INSERT INTO app (id, app_version, created_at, modified_at) VALUES (1, ?, ?, ?)')
      .run(snap.info.appVersion, snap.info.createdAt, snap.info.modifiedAt);

    const addRecording = db.prepare(`INSERT INTO recordings
      (id, position, name, source_file, coordinate, channels_json, units_json, import_settings_json, warnings_json)
      VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?)`);
    const addRun = db.prepare(`INSERT INTO runs
      (recording_id, run_index, name, source, samples, t, t_sha256, q, q_sha256, u, u_sha256)
      VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`);
    snap.recordings.forEach((r, i) => {
      const id = i + 1;
      addRecording.run(id, i, r.name, r.sourceFile, r.recording.coordinate, JSON.stringify(r.channels),
        JSON.stringify(r.units), JSON.stringify(r.importSettings), JSON.stringify(r.warnings));
      r.recording.runs.forEach((run, k) => {
        const t = float64ToBlob(run.t);
        const q = float64ToBlob(run.q);
        const u = run.u ? float64ToBlob(run.u) : null;
        addRun.run(id, k, run.name, run.source, run.t.length, t, sha256Hex(t), q, sha256Hex(q), u, u ? sha256Hex(u) : null);
      });
    });

    for (const table of ['models', 'designs'] as const) {
      const add = db.prepare(`INSERT INTO ${table} (position, name, kind, body_json) VALUES (?, ?, ?, ?)`);
      snap[table].forEach((d, i) => add.run(i, d.name, d.kind, JSON.stringify(d.body)));
    }

    const addTrial = db.prepare('INSERT INTO trials (id, position, name, kind, settings_json, metrics_json) VALUES (?, ?, ?, ?, ?, ?)');
    const addTrace = db.prepare(`INSERT INTO trial_traces (trial_id, trace_index, name, unit, samples, data, data_sha256)
      VALUES (?, ?, ?, ?, ?, ?, ?)`);
    snap.trials.forEach((tr, i) => {
      const id = i + 1;
      addTrial.run(id, i, tr.name, tr.kind, JSON.stringify(tr.settings), JSON.stringify(tr.metrics));
      tr.traces.forEach((trace, k) => {
        const blob = float64ToBlob(trace.data);
        addTrace.run(id, k, trace.name, trace.unit, trace.data.length, blob, sha256Hex(blob));
      });
    });

    const addNote = db.prepare('INSERT INTO notes (position, name, text) VALUES (?, ?, ?)');
    snap.notes.forEach((n, i) => addNote.run(i, n.name, n.text));
  });
  write();
}
