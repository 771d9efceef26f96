// The migration table: one step per schema version, each turning a database of version
// `from` into version `to` in place. Steps run on a private in-memory copy of the file (the
// original is backed up first and never written by a migration), inside one transaction.
import type Database from 'better-sqlite3';
import { sha256Hex } from './samples.ts';
import { SCHEMA_2, SCHEMA_VERSION } from './schema.ts';

export interface Migration {
  from: number;
  to: number;
  summary: string;
  apply(db: Database.Database): void;
}

type Row = Record<string, unknown>;

const notesDdl = SCHEMA_2.find((s) => s.startsWith('CREATE TABLE notes'));
const appDdl = SCHEMA_2.find((s) => s.startsWith('CREATE TABLE app'));

/** Adds the count and checksum columns for a blob column of schema 1. */
function addChecksums(db: Database.Database, table: string, cols: string[], optional: Set<string>): void {
  db.exec(`ALTER TABLE ${table} ADD COLUMN samples INTEGER NOT NULL DEFAULT 0`);
  for (const c of cols) db.exec(`ALTER TABLE ${table} ADD COLUMN ${c}_sha256 TEXT`);
  const update = db.prepare(`UPDATE ${table} SET samples = ?, ${cols.map((c) => `${c}_sha256 = ?`).join(', ')} WHERE id = ?`);
  const ids = db.prepare(`SELECT id FROM ${table}`).pluck().all() as number[];
  const read = db.prepare(`SELECT ${cols.join(', ')} FROM ${table} WHERE id = ?`);
  for (const id of ids) {
    const row = read.get(id) as Row;
    let n = -1;
    const sums = cols.map((c) => {
      const blob = row[c];
      if (blob === null && optional.has(c)) return null;
      if (!(blob instanceof Uint8Array) || blob.length % 8 !== 0) throw new Error(`${table} row ${id}: ${c} is not a whole number of Float64 samples`);
      if (n >= 0 && blob.length / 8 !== n) throw new Error(`${table} row ${id}: ${c} has ${blob.length / 8} samples, expected ${n}`);
      n = blob.length / 8;
      return sha256Hex(blob);
    });
    update.run(Math.max(n, 0), ...sums, id);
  }
}

export const MIGRATIONS: readonly Migration[] = [
  {
    from: 1,
    to: 2,
    summary: 'meta -> app table; units and warnings per recording; sample counts and SHA-256 checksums; notes table',
    apply(db) {
      const meta = new Map((db.prepare('SELECT key, value FROM meta').all() as { key: string; value: string }[]).map((r) => [r.key, r.value]));
      db.exec(appDdl!);
      const created = meta.get('created_at') || 'unknown';
      db.prepare('INSERT INTO app (id, app_version, created_at, modified_at) VALUES (1, ?, ?, ?)')
        .run(meta.get('app_version') || 'unknown', created, meta.get('modified_at') || created);
      db.exec('DROP TABLE meta');

      db.exec(`ALTER TABLE recordings ADD COLUMN units_json TEXT NOT NULL DEFAULT '[]'`);
      db.exec(`ALTER TABLE recordings ADD COLUMN warnings_json TEXT NOT NULL DEFAULT '[]'`);
      const setUnits = db.prepare('UPDATE recordings SET units_json = ? WHERE id = ?');
      for (const r of db.prepare('SELECT id, name, channels_json FROM recordings').all() as Row[]) {
        let channels: unknown;
        try {
          channels = JSON.parse(String(r.channels_json));
        } catch {
          throw new Error(`recording '${String(r.name)}': channel names are not valid JSON`);
        }
        if (!Array.isArray(channels)) throw new Error(`recording '${String(r.name)}': channel names are not a JSON array`);
        setUnits.run(JSON.stringify(channels.map(() => '')), r.id);
      }
      addChecksums(db, 'runs', ['t', 'q', 'u'], new Set(['u']));
      addChecksums(db, 'trial_traces', ['data'], new Set());
      db.exec(notesDdl!);
    },
  },
];

/** Runs the steps from `version` up to SCHEMA_VERSION in one transaction; returns the steps run. */
export function migrate(db: Database.Database, version: number): Migration[] {
  const steps: Migration[] = [];
  let v = version;
  while (v < SCHEMA_VERSION) {
    const step = MIGRATIONS.find((m) => m.from === v);
    if (!step) throw new Error(`no migration from schema ${v}`);
    steps.push(step);
    v = step.to;
  }
  db.transaction(() => {
    for (const s of steps) s.apply(db);
  })();
  db.pragma(`user_version = ${SCHEMA_VERSION}`);
  return steps;
}
