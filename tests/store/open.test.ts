import { createHash, randomBytes } from 'node:crypto';
import { readFileSync, truncateSync, writeFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import Database from 'better-sqlite3';
import { afterAll, describe, expect, it } from 'vitest';
import { openProject, ProjectFileError, SCHEMA_VERSION } from '../../src-main/store/index.ts';
import { sampleProject, scratchDir } from './helpers.ts';

const { dir, cleanup } = scratchDir('open');
afterAll(cleanup);

let counter = 0;
/** A freshly saved sample project under a new name. */
function saved(samples = 64): string {
  const path = join(dir, `p${++counter}.ergostat`);
  sampleProject(samples).save(path);
  return path;
}

/** Changes a saved file with raw SQL, as a hostile or buggy writer could. */
function tamper(path: string, sql: string | ((db: Database.Database) => void)): void {
  const db = new Database(path);
  if (typeof sql === 'string') db.exec(sql);
  else sql(db);
  db.close();
}

/** The ProjectFileError openProject throws, checked to name the file. */
function refusal(path: string, options?: Parameters<typeof openProject>[1]): ProjectFileError {
  try {
    openProject(path, options);
  } catch (e) {
    expect(e).toBeInstanceOf(ProjectFileError);
    expect((e as ProjectFileError).path).toBe(path);
    expect((e as ProjectFileError).message.startsWith(path)).toBe(true);
    return e as ProjectFileError;
  }
  throw new Error(`expected ${path} to be refused`);
}

describe('openProject refuses what is not an Ergostat project', () => {
  it('refuses a missing file and a folder', () => {
    expect(refusal(join(dir, 'nothing-here.ergostat')).reason).toBe('file not found');
    expect(refusal(dir).reason).toBe('not a file');
  });

  it('refuses an empty file, a CSV and random bytes', () => {
    const empty = join(dir, 'empty.ergostat');
    writeFileSync(empty, '');
    expect(refusal(empty).reason).toBe('not an Ergostat project: the file is empty');
    const csv = join(dir, 'swing.ergostat');
    writeFileSync(csv, 'time,theta\n0,0.1\n0.01,0.0999\n'.repeat(200));
    expect(refusal(csv).reason).toBe('not an Ergostat project: the file is not an SQLite database');
    const noise = join(dir, 'noise.ergostat');
    writeFileSync(noise, randomBytes(8192));
    expect(refusal(noise).reason).toBe('not an Ergostat project: the file is not an SQLite database');
  });

  it('refuses an SQLite database of another application', () => {
    const path = join(dir, 'other.ergostat');
    tamper(path, 'CREATE TABLE things (x); INSERT INTO things VALUES (1)');
    expect(refusal(path).reason).toMatch(/^not an Ergostat project: an SQLite database of another application \(application_id 0x0\)$/);
  });

  it('refuses a file saved by a newer Ergostat, naming both schema versions', () => {
    const path = saved();
    tamper(path, 'PRAGMA user_version = 5');
    expect(refusal(path).reason).toBe(`saved by a newer Ergostat (schema 5, this build reads up to ${SCHEMA_VERSION})`);
  });

  it('refuses a database left in WAL mode', () => {
    const path = saved();
    tamper(path, (db) => db.pragma('journal_mode = WAL'));
    expect(refusal(path).reason).toMatch(/write-ahead-log \(WAL\) mode/);
  });

  it('refuses a file with a journal beside it', () => {
    const path = saved();
    writeFileSync(`${path}-journal`, 'x');
    expect(refusal(path).reason).toMatch(/an SQLite journal file lies beside it/);
  });
});

describe('openProject refuses damaged files', () => {
  it('refuses a file truncated at a page boundary and in mid-page', () => {
    const a = saved(4000);
    const size = statSync(a).size;
    truncateSync(a, size - 4096);
    expect(refusal(a).reason).toMatch(/^damaged: the file is truncated \(its header says \d+ pages of 4096 bytes/);
    const b = saved(4000);
    truncateSync(b, Math.floor(size / 2) + 17);
    expect(refusal(b).reason).toMatch(/^damaged: the file is truncated/);
    const c = saved();
    truncateSync(c, 60);
    expect(refusal(c).reason).toMatch(/^damaged: the file is truncated \(60 bytes/);
  });

  it('refuses a file whose index disagrees with its table (integrity_check)', () => {
    const path = saved();
    const db = new Database(path, { readonly: true });
    const root = db.prepare("SELECT rootpage FROM sqlite_master WHERE name = 'sqlite_autoindex_recordings_2'").pluck().get() as number;
    db.close();
    const buf = readFileSync(path);
    const page = buf.subarray((root - 1) * 4096, root * 4096);
    const at = page.indexOf(Buffer.from('swing-a'));
    expect(at).toBeGreaterThan(0);
    page[at] = 0x78; // 'x': the index now names a recording the table does not have
    writeFileSync(path, buf);
    expect(refusal(path).reason).toMatch(/^damaged: integrity check failed: row \d+ missing from index sqlite_autoindex_recordings_2/);
  });

  it('refuses a file with a broken b-tree page (quick_check)', () => {
    const path = saved();
    const db = new Database(path, { readonly: true });
    const root = db.prepare("SELECT rootpage FROM sqlite_master WHERE name = 'recordings'").pluck().get() as number;
    db.close();
    const buf = readFileSync(path);
    // SQLite file format, "B-tree Page Header Format": offset 3 holds the number of cells.
    buf.writeUInt16BE(200, (root - 1) * 4096 + 3);
    writeFileSync(path, buf);
    expect(refusal(path).reason).toMatch(/^damaged: quick check failed: /);
  });

  it('refuses a flipped byte in a run, naming the recording and the run', () => {
    const path = saved();
    tamper(path, (db) => {
      const row = db.prepare(`SELECT runs.id, t FROM runs JOIN recordings r ON r.id = runs.recording_id
        WHERE r.name = 'swing-a' AND run_index = 1`).get() as { id: number; t: Buffer };
      row.t[100] ^= 0x01;
      db.prepare('UPDATE runs SET t = ? WHERE id = ?').run(row.t, row.id);
    });
    expect(refusal(path).reason).toBe("recording 'swing-a' run 2: sample checksum mismatch in t");
  });

  it('refuses a flipped byte in a trial trace, naming the trial and trace', () => {
    const path = saved();
    tamper(path, (db) => {
      const row = db.prepare("SELECT id, data FROM trial_traces WHERE name = 'H'").get() as { id: number; data: Buffer };
      row.data[0] ^= 0x80;
      db.prepare('UPDATE trial_traces SET data = ? WHERE id = ?').run(row.data, row.id);
    });
    expect(refusal(path).reason).toBe("trial 'trial-1' trace 2 'H': sample checksum mismatch in data");
  });

  it('refuses a sample count that disagrees with the blob', () => {
    const path = saved();
    tamper(path, "UPDATE runs SET samples = 3 WHERE run_index = 0 AND recording_id = (SELECT id FROM recordings WHERE name = 'beam-b')");
    expect(refusal(path).reason).toBe("recording 'beam-b' run 1: t holds 40 bytes, expected 3 samples x 8 bytes");
  });

  it('refuses JSON documents of the wrong shape, or not JSON at all, naming the document', () => {
    const a = saved();
    tamper(a, "UPDATE models SET body_json = '[1, 2]' WHERE name = 'energy-1'");
    expect(refusal(a).reason).toBe("model 'energy-1' body: expected a JSON object, got an array");
    const b = saved();
    tamper(b, "UPDATE trials SET metrics_json = 'function(){}' WHERE name = 'trial-1'");
    expect(refusal(b).reason).toMatch(/^trial 'trial-1' metrics: not valid JSON/);
    const c = saved();
    tamper(c, `UPDATE designs SET body_json = '{"a": {"__proto__": {"polluted": true}}}'`);
    expect(refusal(c).reason).toBe("design 'hold-1' body.a: the key \"__proto__\" is not allowed");
    const d = saved();
    tamper(d, `UPDATE recordings SET units_json = '["s"]' WHERE name = 'swing-a'`);
    expect(refusal(d).reason).toBe("recording 'swing-a': 1 units for 3 channels");
    const e = saved();
    tamper(e, `UPDATE models SET body_json = '${'['.repeat(100)}${']'.repeat(100)}' WHERE name = 'energy-1'`);
    expect(refusal(e).reason).toBe("model 'energy-1' body: expected a JSON object, got an array");
    const f = saved();
    tamper(f, `UPDATE models SET body_json = '{"a":${'['.repeat(100)}${']'.repeat(100)}}' WHERE name = 'energy-1'`);
    expect(refusal(f).reason).toMatch(/^model 'energy-1' body\.a(\[0\])+: nested deeper than 64 levels$/);
  });

  it('refuses time stamps that are not strictly increasing, with a correct checksum', () => {
    const path = saved();
    tamper(path, (db) => {
      const t = Buffer.alloc(40);
      [0, 1, 2, 2, 3].forEach((x, i) => t.writeDoubleLE(x, i * 8));
      db.prepare("UPDATE runs SET t = ?, t_sha256 = ? WHERE recording_id = (SELECT id FROM recordings WHERE name = 'beam-b')")
        .run(t, createHash('sha256').update(t).digest('hex'));
    });
    expect(refusal(path).reason).toBe("recording 'beam-b' run 1.t[3]: time must be strictly increasing (2 then 2)");
  });
});

describe('openProject refuses files carrying anything beyond our schema', () => {
  it('refuses a trigger', () => {
    const path = saved();
    tamper(path, 'CREATE TRIGGER wipe AFTER INSERT ON notes BEGIN DELETE FROM recordings; END');
    expect(refusal(path).reason).toBe("unexpected trigger 'wipe' (schema 2 has no such object; refusing a file that carries extra triggers)");
  });

  it('refuses a view, an extra table and an extra index', () => {
    const a = saved();
    tamper(a, 'CREATE VIEW v AS SELECT name FROM recordings');
    expect(refusal(a).reason).toMatch(/^unexpected view 'v'/);
    const b = saved();
    tamper(b, 'CREATE TABLE extra (x)');
    expect(refusal(b).reason).toMatch(/^unexpected table 'extra'/);
    const c = saved();
    tamper(c, 'CREATE INDEX notes_text ON notes (text)');
    expect(refusal(c).reason).toMatch(/^unexpected index 'notes_text'/);
  });

  it('refuses one of our tables with a changed definition, and a missing table', () => {
    const a = saved();
    tamper(a, `DROP TABLE notes; CREATE TABLE notes (id INTEGER PRIMARY KEY, position INTEGER NOT NULL UNIQUE,
      name TEXT NOT NULL UNIQUE, text TEXT NOT NULL CHECK (length(text) >= 0)) STRICT`);
    expect(refusal(a).reason).toBe("unexpected layout: table 'notes' differs from schema 2");
    const b = saved();
    tamper(b, 'DROP TABLE notes');
    expect(refusal(b).reason).toBe("missing table 'notes' of schema 2");
  });
});

describe('openProject size limits', () => {
  it('refuses a file over the byte limit before opening it', () => {
    const path = saved();
    const size = statSync(path).size;
    expect(refusal(path, { limits: { maxFileBytes: size - 1 } }).reason).toBe(`over the size limits: the file is ${size} bytes, the limit is ${size - 1}`);
    expect(() => openProject(path, { limits: { maxFileBytes: size } })).not.toThrow();
  });

  it('refuses a blob, a row count or a JSON document over its limit, naming it', () => {
    const path = saved(64); // runs of 64 samples = 512 bytes
    expect(refusal(path, { limits: { maxBlobBytes: 511 } }).reason).toBe("over the size limits: recording 'swing-a' run 1: a sample blob is over 511 bytes");
    expect(refusal(path, { limits: { maxRecordings: 1 } }).reason).toBe('over the size limits: 2 recordings, the limit is 1');
    expect(refusal(path, { limits: { maxRunsPerRecording: 1 } }).reason).toBe('over the size limits: 2 runs in one recording, the limit is 1');
    expect(refusal(path, { limits: { maxJsonBytes: 40 } }).reason).toMatch(/^over the size limits: recording 'swing-a': a JSON document is over 40 bytes$/);
    expect(refusal(path, { limits: { maxNoteBytes: 10 } }).reason).toBe("over the size limits: note 'readme': a text is over 10 bytes");
  });

  it('refuses unknown or non-positive limits as bad arguments', () => {
    const path = saved();
    expect(() => openProject(path, { limits: { maxFileBytes: 0 } })).toThrow(/limits\.maxFileBytes: expected a positive integer/);
    expect(() => openProject(path, { limits: { maxFileSize: 1 } as never })).toThrow(/limits\.maxFileSize: unknown limit/);
  });
});
