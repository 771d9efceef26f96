// openProject: reads a project file that may come from anyone, checking before trusting.
// Order: size limit (stat) -> no journal/WAL beside it -> SQLite header (magic, WAL mode,
// application_id, schema version, length vs page count) -> read-only open with
// trusted_schema OFF -> layout (sqlite_master holds exactly our tables and indices) ->
// PRAGMA quick_check and integrity_check, foreign_key_check -> row counts and sizes -> every
// value, checksum and JSON document (read.ts). Older schemas: backup copy first, then the
// migration table runs on an in-memory copy; the original file is not modified.
import Database from 'better-sqlite3';
import { createHash } from 'node:crypto';
import { closeSync, constants, copyFileSync, existsSync, fsyncSync, openSync, readFileSync, statSync } from 'node:fs';
import { basename, dirname, join } from 'node:path';
import { messageOf, ProjectFileError } from './errors.ts';
import { readSqliteHeader } from './header.ts';
import { checkLayout } from './layout.ts';
import { resolveLimits, type ProjectLimits } from './limits.ts';
import { migrate } from './migrations.ts';
import { ProjectStore, type OpenReport } from './project.ts';
import { readSnapshot } from './read.ts';
import { OLDEST_READABLE_SCHEMA, SCHEMA_VERSION } from './schema.ts';
import { PROJECT_EXTENSION } from './save.ts';
import type { ProjectSnapshot } from './snapshot.ts';

export interface OpenOptions {
  limits?: Partial<ProjectLimits>;
}

/** SQLite's own errors mean the file is damaged; ours already carry a reason. */
function reasonOf(e: unknown): string {
  if (e instanceof Error && e.name === 'SqliteError') return `damaged: ${e.message}`;
  return messageOf(e);
}

/** Makes a database handle as safe as SQLite allows for reading untrusted content. */
function harden(db: Database.Database): void {
  db.pragma('trusted_schema = OFF'); // no SQL functions with side effects from schema objects
  db.pragma('cell_size_check = ON'); // stricter b-tree cell checks while reading
  db.pragma('mmap_size = 0');
}

/** Layout, quick_check, integrity_check and foreign keys; throws Error with the reason. */
function checkDatabase(db: Database.Database, version: number): void {
  checkLayout(db, version);
  const quick = db.pragma('quick_check(5)', { simple: false }) as { quick_check: string }[];
  if (quick.length !== 1 || quick[0].quick_check !== 'ok') {
    throw new Error(`damaged: quick check failed: ${quick.map((r) => r.quick_check).join('; ')}`);
  }
  const full = db.pragma('integrity_check(5)', { simple: false }) as { integrity_check: string }[];
  if (full.length !== 1 || full[0].integrity_check !== 'ok') {
    throw new Error(`damaged: integrity check failed: ${full.map((r) => r.integrity_check).join('; ')}`);
  }
  const fk = db.pragma('foreign_key_check') as { table: string; rowid: number }[];
  if (fk.length > 0) throw new Error(`damaged: ${fk.length} rows of ${fk[0].table} point at rows that do not exist`);
}

/** `rig.ergostat` -> `rig.schema-1-backup.ergostat` (then -2, -3 ... if taken by a different file). */
function backupPathFor(path: string, version: number, content: Buffer): string {
  const dir = dirname(path);
  const base = basename(path);
  const stem = base.endsWith(PROJECT_EXTENSION) ? base.slice(0, -PROJECT_EXTENSION.length) : base;
  const digest = createHash('sha256').update(content).digest('hex');
  for (let k = 1; k < 1000; k++) {
    const candidate = join(dir, `${stem}.schema-${version}-backup${k === 1 ? '' : `-${k}`}${PROJECT_EXTENSION}`);
    if (!existsSync(candidate)) return candidate;
    try {
      if (createHash('sha256').update(readFileSync(candidate)).digest('hex') === digest) return candidate; // same bytes already kept
    } catch {
      // unreadable: try the next name
    }
  }
  throw new Error('no free backup file name');
}

/**
 * Opens a project file. Throws ProjectFileError (with `path` and `reason`) for anything that
 * is not a sound Ergostat project within the limits. Files from older schemas are migrated
 * after a backup copy of the original is written beside it (see `store.origin.migration`).
 */
export function openProject(path: string, options: OpenOptions = {}): ProjectStore {
  if (typeof path !== 'string' || path.length === 0) throw new TypeError('openProject: path must be a non-empty string');
  const limits = resolveLimits(options.limits);
  const fail = (reason: string, cause?: unknown): never => {
    throw new ProjectFileError(path, reason, cause === undefined ? undefined : { cause });
  };

  let bytes = 0;
  try {
    const st = statSync(path);
    if (!st.isFile()) fail('not a file');
    bytes = st.size;
  } catch (e) {
    if (e instanceof ProjectFileError) throw e;
    fail((e as NodeJS.ErrnoException).code === 'ENOENT' ? 'file not found' : `cannot read: ${messageOf(e)}`, e);
  }
  if (bytes > limits.maxFileBytes) fail(`over the size limits: the file is ${bytes} bytes, the limit is ${limits.maxFileBytes}`);
  for (const side of ['-journal', '-wal']) {
    if (existsSync(path + side)) {
      fail(`an SQLite ${side.slice(1)} file lies beside it (${basename(path + side)}); another program may be writing the project, or it crashed while writing. Refusing to read it`);
    }
  }

  let version = 0;
  try {
    version = readSqliteHeader(path, bytes).userVersion;
  } catch (e) {
    fail(reasonOf(e), e);
  }
  if (version > SCHEMA_VERSION) fail(`saved by a newer Ergostat (schema ${version}, this build reads up to ${SCHEMA_VERSION})`);
  if (version < OLDEST_READABLE_SCHEMA) fail(`damaged or not an Ergostat project: schema version ${version} (this build reads ${OLDEST_READABLE_SCHEMA} to ${SCHEMA_VERSION})`);

  let snap: ProjectSnapshot | undefined;
  let db: Database.Database | undefined;
  try {
    db = new Database(path, { readonly: true, fileMustExist: true });
    harden(db);
    const pragmaVersion = db.pragma('user_version', { simple: true });
    if (pragmaVersion !== version) throw new Error(`damaged: schema version ${String(pragmaVersion)} disagrees with the header (${version})`);
    db.exec('BEGIN'); // one read transaction: all checks and reads see the same state of the file
    checkDatabase(db, version);
    if (version === SCHEMA_VERSION) snap = readSnapshot(db, limits);
    db.exec('COMMIT');
  } catch (e) {
    fail(reasonOf(e), e);
  } finally {
    db?.close();
  }

  const origin: OpenReport = { path, bytes, fileSchema: version };
  if (snap === undefined) {
    // Older schema: keep the original, then migrate a private in-memory copy.
    let content: Buffer;
    let backupPath = '';
    try {
      content = readFileSync(path);
      backupPath = backupPathFor(path, version, content);
      if (!existsSync(backupPath)) {
        copyFileSync(path, backupPath, constants.COPYFILE_EXCL);
        const fd = openSync(backupPath, 'r+');
        try {
          fsyncSync(fd);
        } finally {
          closeSync(fd);
        }
      }
    } catch (e) {
      return fail(`cannot migrate from schema ${version}: the backup copy could not be written (${messageOf(e)}); the file is unchanged`, e);
    }
    let mem: Database.Database | undefined;
    try {
      mem = new Database(content);
      harden(mem);
      checkDatabase(mem, version); // the bytes read now, not only the file checked before
      const steps = migrate(mem, version);
      snap = readSnapshot(mem, limits);
      origin.migration = { from: version, to: SCHEMA_VERSION, steps: steps.map((s) => `${s.from} -> ${s.to}: ${s.summary}`), backupPath };
    } catch (e) {
      fail(`migration from schema ${version} failed: ${reasonOf(e)} (the original is unchanged; a copy is at ${backupPath})`, e);
    } finally {
      mem?.close();
    }
  }
  return ProjectStore.fromSnapshot(snap!, limits, origin);
}
