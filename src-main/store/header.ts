// First look at a file, before SQLite opens it: the 100-byte database header (SQLite file
// format documentation, section 1.3 "The Database Header"). Refuses what is not an SQLite
// database, WAL-mode files, files of other applications, and files whose length disagrees
// with the page count in their header (truncated or padded).
import { closeSync, openSync, readSync } from 'node:fs';
import { APPLICATION_ID } from './schema.ts';

/** Offset 0: "SQLite format 3" and a NUL. */
const MAGIC = Buffer.from('SQLite format 3\u0000', 'latin1');

export interface SqliteHeader {
  pageSize: number;
  /** From offset 28 when valid (offset 92 equals offset 24), else fileBytes / pageSize. */
  pageCount: number;
  userVersion: number;
  applicationId: number;
}

/** Reads and checks the header; throws an Error whose message is the refusal reason. */
export function readSqliteHeader(path: string, fileBytes: number): SqliteHeader {
  if (fileBytes === 0) throw new Error('not an Ergostat project: the file is empty');
  const head = Buffer.alloc(100);
  const fd = openSync(path, 'r');
  let got = 0;
  try {
    got = readSync(fd, head, 0, 100, 0);
  } finally {
    closeSync(fd);
  }
  if (got < MAGIC.length || !head.subarray(0, MAGIC.length).equals(MAGIC)) {
    throw new Error('not an Ergostat project: the file is not an SQLite database');
  }
  if (got < 100) throw new Error(`damaged: the file is truncated (${fileBytes} bytes, shorter than the 100-byte SQLite header)`);
  const raw = head.readUInt16BE(16);
  const pageSize = raw === 1 ? 65536 : raw;
  if (pageSize < 512 || pageSize > 65536 || (pageSize & (pageSize - 1)) !== 0) {
    throw new Error(`damaged: invalid page size ${raw} in the SQLite header`);
  }
  const write = head[18];
  const read = head[19];
  if (write === 2 || read === 2) {
    throw new Error('not a saved Ergostat project: the database is in write-ahead-log (WAL) mode; Ergostat saves projects in rollback-journal mode');
  }
  if (write !== 1 || read !== 1) throw new Error(`damaged: unknown file format version ${write}/${read} in the SQLite header`);
  const applicationId = head.readInt32BE(68);
  const userVersion = head.readInt32BE(60);
  if (applicationId !== APPLICATION_ID) {
    throw new Error(`not an Ergostat project: an SQLite database of another application (application_id 0x${(applicationId >>> 0).toString(16)})`);
  }
  const changeCounter = head.readUInt32BE(24);
  const validFor = head.readUInt32BE(92);
  const headerPages = head.readUInt32BE(28);
  let pageCount: number;
  if (headerPages > 0 && validFor === changeCounter) {
    pageCount = headerPages;
    const expected = headerPages * pageSize;
    if (fileBytes < expected) {
      throw new Error(`damaged: the file is truncated (its header says ${headerPages} pages of ${pageSize} bytes = ${expected} bytes, the file has ${fileBytes})`);
    }
    if (fileBytes > expected) {
      throw new Error(`damaged: ${fileBytes - expected} unexpected bytes after the last page (header says ${expected} bytes, the file has ${fileBytes})`);
    }
  } else {
    if (fileBytes % pageSize !== 0) throw new Error(`damaged: the file length ${fileBytes} is not a whole number of ${pageSize}-byte pages (truncated?)`);
    pageCount = fileBytes / pageSize;
  }
  return { pageSize, pageCount, userVersion, applicationId };
}
