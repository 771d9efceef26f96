// The save protocol (write-to-temp-then-rename, the usual POSIX way to replace a file
// atomically; rename(2) replaces the target in one step, and libuv's rename on Windows uses
// MoveFileEx with MOVEFILE_REPLACE_EXISTING, from memory): a complete new database is written to a hidden
// temp file in the target's folder, checked (PRAGMA quick_check), fsynced, renamed over the
// target, and the folder is fsynced where the platform allows. A failed save deletes its temp
// file and leaves the old file as it was.
import Database from 'better-sqlite3';
import { randomBytes } from 'node:crypto';
import { chmodSync, closeSync, fsyncSync, lstatSync, openSync, readdirSync, realpathSync, renameSync, statSync, unlinkSync } from 'node:fs';
import { basename, dirname, join } from 'node:path';
import { messageOf, ProjectFileError } from './errors.ts';
import type { ProjectSnapshot } from './snapshot.ts';
import { writeSnapshot } from './write.ts';

export const PROJECT_EXTENSION = '.ergostat';

export interface SaveOptions {
  /** Called with the finished, fsynced temp file just before the rename (tests use it to stop a save there). */
  beforeRename?: (tempPath: string) => void;
}

export interface SaveReport {
  /** The file written (the symlink's target when `path` was a symlink). */
  path: string;
  /** Size of the saved file, bytes. */
  bytes: number;
  /** Whether the folder could be fsynced after the rename (not possible on Windows). */
  folderSynced: boolean;
}

/** The hidden temp name used while saving `target`: `.NAME.ergostat.tmp-<pid>-<random>` in the same folder. */
export function tempPathFor(target: string): string {
  return join(dirname(target), `.${basename(target)}.tmp-${process.pid}-${randomBytes(6).toString('hex')}`);
}

/**
 * Temp files of saves of `target` that were killed before finishing: hidden
 * `.NAME.ergostat.tmp-<pid>-<hex>` files in its folder whose process no longer runs (a save in
 * progress in another live process is not listed). The app may offer to delete them.
 */
export function saveLeftovers(target: string): string[] {
  const prefix = `.${basename(target)}.tmp-`;
  const pattern = /^(\d+)-[0-9a-f]{12}(-journal)?$/;
  let names: string[];
  try {
    names = readdirSync(dirname(target));
  } catch {
    return [];
  }
  return names
    .filter((n) => n.startsWith(prefix))
    .filter((n) => {
      const m = pattern.exec(n.slice(prefix.length));
      if (!m) return false;
      try {
        process.kill(Number(m[1]), 0); // signal 0: only asks whether the process exists
        return false;
      } catch (e) {
        return (e as NodeJS.ErrnoException).code === 'ESRCH';
      }
    })
    .map((n) => join(dirname(target), n));
}

function removeQuietly(path: string): void {
  try {
    unlinkSync(path);
  } catch {
    // already gone, or never created
  }
}

export function saveSnapshot(path: string, snap: ProjectSnapshot, options: SaveOptions = {}): SaveReport {
  if (typeof path !== 'string' || path.length === 0) throw new TypeError('save: path must be a non-empty string');
  if (!path.endsWith(PROJECT_EXTENSION)) throw new ProjectFileError(path, `cannot save: a project file name must end in ${PROJECT_EXTENSION}`);
  let target = path;
  let oldMode: number | undefined;
  try {
    if (lstatSync(path).isSymbolicLink()) target = realpathSync(path);
    const st = statSync(target);
    if (!st.isFile()) throw new ProjectFileError(path, 'cannot save: the path exists and is not a regular file');
    oldMode = st.mode & 0o777;
  } catch (e) {
    if (e instanceof ProjectFileError) throw e;
    if ((e as NodeJS.ErrnoException).code !== 'ENOENT') throw new ProjectFileError(path, `cannot save: ${messageOf(e)}`, { cause: e });
  }

  const temp = tempPathFor(target);
  let db: Database.Database | undefined;
  try {
    closeSync(openSync(temp, 'wx')); // claim the name exclusively; SQLite treats an empty file as an empty database
    db = new Database(temp, { fileMustExist: true });
    db.pragma('journal_mode = OFF'); // the temp file is thrown away on failure, so no journal beside it
    db.pragma('synchronous = OFF'); // one explicit fsync below instead
    writeSnapshot(db, snap);
    const check = db.pragma('quick_check', { simple: true });
    if (check !== 'ok') throw new Error(`the written file failed its quick check: ${String(check)}`);
    db.close();
    db = undefined;

    const fd = openSync(temp, 'r+');
    try {
      fsyncSync(fd);
    } finally {
      closeSync(fd);
    }
    if (oldMode !== undefined) {
      try {
        chmodSync(temp, oldMode); // after writing, so a read-only old file does not block the write
      } catch {
        // keeping the old permissions is a courtesy, not a requirement
      }
    }
    options.beforeRename?.(temp);
    renameSync(temp, target);
  } catch (e) {
    try {
      db?.close();
    } catch {
      // the error below is the one that matters
    }
    removeQuietly(temp);
    removeQuietly(`${temp}-journal`);
    if (e instanceof ProjectFileError) throw e;
    throw new ProjectFileError(path, `save failed, the previous file is unchanged: ${messageOf(e)}`, { cause: e });
  }

  let folderSynced = false;
  try {
    const dfd = openSync(dirname(target), 'r');
    try {
      fsyncSync(dfd);
      folderSynced = true;
    } finally {
      closeSync(dfd);
    }
  } catch {
    // Windows cannot open or fsync a folder; the rename itself is still atomic there.
  }
  return { path: target, bytes: statSync(target).size, folderSynced };
}
