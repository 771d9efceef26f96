// Streams CSV recordings from disk into a Recording: each file is read in fixed-size chunks into
// one reused buffer and fed to the engine's streaming parser, so a file of any length is never
// held as text (memory is the Float64Arrays of the samples plus one chunk).
import { open, type FileHandle } from 'node:fs/promises';
import { resolve } from 'node:path';
import {
  CsvStreamParser, DataError, assembleImport, checkMapping, displayNames, resolveOptions,
  type ColumnMapping, type FileImport, type ImportOptions, type ImportResult,
} from '../engine/data/index.ts';

export interface StreamOptions extends ImportOptions {
  /** Bytes read per chunk. Default 1 MiB. */
  chunkBytes?: number;
  /** Called after each chunk with the file and how far it has been read. */
  onProgress?: (progress: { file: string; bytesRead: number; totalBytes: number }) => void;
  /** Cancels the import between chunks (the promise rejects with the signal's reason). */
  signal?: AbortSignal;
}

const DEFAULT_CHUNK = 1 << 20;

function openError(file: string, err: unknown): DataError {
  const code = (err as NodeJS.ErrnoException)?.code;
  const where = resolve(file);
  if (code === 'ENOENT') return new DataError(file, `file not found (looked for ${where})`);
  if (code === 'EISDIR') return new DataError(file, `is a folder, not a CSV file (${where})`);
  if (code === 'EACCES' || code === 'EPERM') return new DataError(file, `cannot be read: permission denied (${where})`);
  return new DataError(file, `cannot be read: ${(err as Error)?.message ?? String(err)}`);
}

async function importFile(file: string, display: string, mapping: ColumnMapping, options: StreamOptions, chunk: Buffer): Promise<FileImport> {
  let fh: FileHandle;
  try {
    fh = await open(file, 'r');
  } catch (e) {
    throw openError(file, e);
  }
  try {
    const parser = new CsvStreamParser(file, mapping, options, display);
    let totalBytes = 0;
    try {
      totalBytes = (await fh.stat()).size;
    } catch { /* size only feeds the progress report */ }
    let bytesRead = 0;
    for (;;) {
      options.signal?.throwIfAborted();
      let n: number;
      try {
        n = (await fh.read(chunk, 0, chunk.length, null)).bytesRead;
      } catch (e) {
        throw openError(file, e);
      }
      if (n === 0) break;
      parser.push(chunk.subarray(0, n));
      bytesRead += n;
      options.onProgress?.({ file, bytesRead, totalBytes });
    }
    return parser.finish();
  } finally {
    await fh.close();
  }
}

/**
 * Imports CSV recordings (one or more runs per file) into one Recording with its fixes, warnings
 * and per-run statistics. Files are read one after another, in chunks.
 * Throws DataError (file, line, column named) for bad data or a missing file, TypeError/RangeError
 * for bad arguments.
 */
export async function importRecordings(files: string[], mapping: ColumnMapping, options: StreamOptions = {}): Promise<ImportResult> {
  if (!Array.isArray(files) || files.length === 0 || files.some((f) => typeof f !== 'string' || f === '')) {
    throw new TypeError('files: expected a non-empty array of file paths');
  }
  checkMapping(mapping);
  resolveOptions(options);
  const chunkBytes = options.chunkBytes ?? DEFAULT_CHUNK;
  if (!Number.isInteger(chunkBytes) || chunkBytes < 1) throw new RangeError(`options.chunkBytes: expected a positive integer, got ${JSON.stringify(options.chunkBytes)}`);
  const chunk = Buffer.allocUnsafe(chunkBytes);
  const names = displayNames(files);
  const parts: FileImport[] = [];
  for (let i = 0; i < files.length; i++) parts.push(await importFile(files[i], names[i], mapping, options, chunk));
  return assembleImport(parts, mapping.angle === true);
}
