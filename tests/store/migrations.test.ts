import { readdirSync, readFileSync, unlinkSync } from 'node:fs';
import { join } from 'node:path';
import Database from 'better-sqlite3';
import { afterAll, describe, expect, it } from 'vitest';
import { APPLICATION_ID, openProject, ProjectFileError } from '../../src-main/store/index.ts';
import { AWKWARD, sameBytes, scratchDir } from './helpers.ts';

const { dir, cleanup } = scratchDir('migrate');
afterAll(cleanup);

const le = (xs: ArrayLike<number>): Buffer => {
  const b = Buffer.alloc(xs.length * 8);
  for (let i = 0; i < xs.length; i++) b.writeDoubleLE(xs[i], i * 8);
  return b;
};

/** A schema-1 file written with raw SQL, as the first development builds laid it out (docs/project-file.md). */
function writeSchema1(path: string, qBlob: Buffer = Buffer.from(AWKWARD.buffer)): void {
  const db = new Database(path);
  db.exec(`
    PRAGMA application_id = ${APPLICATION_ID};
    PRAGMA user_version = 1;
    CREATE TABLE meta (key TEXT PRIMARY KEY, value TEXT NOT NULL) STRICT;
    CREATE TABLE recordings (id INTEGER PRIMARY KEY, position INTEGER NOT NULL UNIQUE, name TEXT NOT NULL UNIQUE,
      source_file TEXT NOT NULL, coordinate TEXT NOT NULL CHECK (coordinate IN ('angle', 'linear')),
      channels_json TEXT NOT NULL, import_settings_json TEXT NOT NULL) STRICT;
    CREATE TABLE runs (id INTEGER PRIMARY KEY, recording_id INTEGER NOT NULL REFERENCES recordings (id),
      run_index INTEGER NOT NULL, name TEXT NOT NULL, source TEXT NOT NULL, t BLOB NOT NULL, q BLOB NOT NULL, u BLOB,
      UNIQUE (recording_id, run_index)) STRICT;
    CREATE TABLE models (id INTEGER PRIMARY KEY, position INTEGER NOT NULL UNIQUE, name TEXT NOT NULL UNIQUE,
      kind TEXT NOT NULL, body_json TEXT NOT NULL) STRICT;
    CREATE TABLE designs (id INTEGER PRIMARY KEY, position INTEGER NOT NULL UNIQUE, name TEXT NOT NULL UNIQUE,
      kind TEXT NOT NULL, body_json TEXT NOT NULL) STRICT;
    CREATE TABLE trials (id INTEGER PRIMARY KEY, position INTEGER NOT NULL UNIQUE, name TEXT NOT NULL UNIQUE,
      kind TEXT NOT NULL, settings_json TEXT NOT NULL, metrics_json TEXT NOT NULL) STRICT;
    CREATE TABLE trial_traces (id INTEGER PRIMARY KEY, trial_id INTEGER NOT NULL REFERENCES trials (id),
      trace_index INTEGER NOT NULL, name TEXT NOT NULL, unit TEXT NOT NULL, data BLOB NOT NULL,
      UNIQUE (trial_id, trace_index), UNIQUE (trial_id, name)) STRICT;
    INSERT INTO meta VALUES ('app_version', '0.0.9'), ('created_at', '2026-11-20T08:00:00.000Z');
    INSERT INTO recordings VALUES (1, 0, 'old-swing', 'old.csv', 'angle', '["t","theta"]', '{"delimiter":";"}');
    INSERT INTO models VALUES (1, 0, 'e', 'koopman-energy', '{"xi":[1,2]}');
    INSERT INTO designs VALUES (1, 0, 'd', 'level-hold', '{"Q":1}');
    INSERT INTO trials VALUES (7, 0, 'tr', 'closed-loop', '{"dt":0.01}', '{"J":3}');
  `);
  const t = le(Array.from({ length: AWKWARD.length }, (_, i) => i * 0.5));
  db.prepare('INSERT INTO runs VALUES (1, 1, 0, ?, ?, ?, ?, ?)').run('old.csv run 1', 'old.csv', t, qBlob, null);
  db.prepare('INSERT INTO runs VALUES (2, 1, 1, ?, ?, ?, ?, ?)').run('old.csv run 2', 'old.csv', le([0, 1]), le([5, 6]), le([-1, 1]));
  db.prepare('INSERT INTO trial_traces VALUES (1, 7, 0, ?, ?, ?)').run('H', 'J', le([1, 0.5, 0.25]));
  db.close();
}

describe('migration from schema 1', () => {
  it('backs up the original beside it, migrates a copy, and loses no sample bit', () => {
    const path = join(dir, 'old.ergostat');
    writeSchema1(path);
    const original = readFileSync(path);
    const p = openProject(path);

    const m = p.origin!.migration!;
    expect(m.from).toBe(1);
    expect(m.to).toBe(2);
    expect(m.backupPath).toBe(join(dir, 'old.schema-1-backup.ergostat'));
    expect(readFileSync(m.backupPath).equals(original)).toBe(true); // the backup is the original, byte for byte
    expect(readFileSync(path).equals(original)).toBe(true); // and the original itself is untouched
    expect(p.origin!.fileSchema).toBe(1);

    expect(p.info).toEqual({ appVersion: '0.0.9', createdAt: '2026-11-20T08:00:00.000Z', modifiedAt: '2026-11-20T08:00:00.000Z' });
    const rec = p.recordings.get('old-swing')!;
    expect(rec.channels).toEqual(['t', 'theta']);
    expect(rec.units).toEqual(['', '']); // schema 1 had no units
    expect(rec.warnings).toEqual([]);
    expect(rec.importSettings).toEqual({ delimiter: ';' });
    expect(sameBytes(rec.recording.runs[0].q, AWKWARD)).toBe(true);
    expect(rec.recording.runs[0].u).toBeUndefined();
    expect(Array.from(rec.recording.runs[1].u!)).toEqual([-1, 1]);
    expect(p.models.get('e')!.body).toEqual({ xi: [1, 2] });
    expect(p.designs.get('d')!.body).toEqual({ Q: 1 });
    const tr = p.trials.get('tr')!;
    expect(tr.settings).toEqual({ dt: 0.01 });
    expect(Array.from(tr.traces[0].data)).toEqual([1, 0.5, 0.25]);
    expect(p.notes.size).toBe(0);

    // Saving writes schema 2; reopening needs no migration and gives the same samples.
    p.save(path);
    const again = openProject(path);
    expect(again.origin!.fileSchema).toBe(2);
    expect(again.origin!.migration).toBeUndefined();
    expect(sameBytes(again.recordings.get('old-swing')!.recording.runs[0].q, AWKWARD)).toBe(true);
    expect(readdirSync(dir).sort()).toEqual(['old.ergostat', 'old.schema-1-backup.ergostat']);
  });

  it('reuses an identical backup and never overwrites a different one', () => {
    const path = join(dir, 'twice.ergostat');
    writeSchema1(path);
    expect(openProject(path).origin!.migration!.backupPath).toBe(join(dir, 'twice.schema-1-backup.ergostat'));
    expect(openProject(path).origin!.migration!.backupPath).toBe(join(dir, 'twice.schema-1-backup.ergostat'));
    // A different schema-1 file under the same name: its backup takes the next name, the first stays.
    unlinkSync(path);
    writeSchema1(path, le([1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12]));
    expect(openProject(path).origin!.migration!.backupPath).toBe(join(dir, 'twice.schema-1-backup-2.ergostat'));
  });

  it('fails cleanly when the old data cannot be migrated, keeping the original and its backup', () => {
    const path = join(dir, 'broken.ergostat');
    writeSchema1(path, Buffer.alloc(13)); // 13 bytes: not a whole number of Float64 samples
    const original = readFileSync(path);
    let err: unknown;
    try {
      openProject(path);
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(ProjectFileError);
    expect((err as ProjectFileError).reason).toMatch(/^migration from schema 1 failed: runs row 1: q is not a whole number of Float64 samples \(the original is unchanged; a copy is at .*broken\.schema-1-backup\.ergostat\)$/);
    expect(readFileSync(path).equals(original)).toBe(true);
  });

  it('refuses schema 0 (our application id without a schema)', () => {
    const path = join(dir, 'zero.ergostat');
    const db = new Database(path);
    db.exec(`PRAGMA application_id = ${APPLICATION_ID}; CREATE TABLE x (y)`);
    db.close();
    expect(() => openProject(path)).toThrow(/damaged or not an Ergostat project: schema version 0 \(this build reads 1 to 2\)/);
  });

  it('checks a schema-1 file against the schema-1 layout before migrating (a trigger is refused)', () => {
    const path = join(dir, 'hostile-old.ergostat');
    writeSchema1(path);
    const db = new Database(path);
    db.exec('CREATE TRIGGER t AFTER UPDATE ON meta BEGIN DELETE FROM runs; END');
    db.close();
    expect(() => openProject(path)).toThrow(/unexpected trigger 't' \(schema 1 has no such object/);
    expect(readdirSync(dir)).not.toContain('hostile-old.schema-1-backup.ergostat');
  });
});
