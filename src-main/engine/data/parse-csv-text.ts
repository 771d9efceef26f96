// Synchronous import of a small in-memory CSV text (tests, the UI's paste box), through the same
// streaming parser and checks as the file import.
import { assembleImport } from './assemble.ts';
import { CsvStreamParser } from './csv-stream.ts';
import type { ColumnMapping, ImportOptions, ImportResult } from './types.ts';

const encoder = new TextEncoder();

/**
 * Parses CSV text named `name` (used in messages and Run.source) into a recording.
 * Throws DataError for bad data, TypeError/RangeError for bad arguments.
 */
export function parseCsvText(text: string, name: string, mapping: ColumnMapping, options?: ImportOptions): ImportResult {
  if (typeof text !== 'string') throw new TypeError('text: expected the CSV text as a string');
  const parser = new CsvStreamParser(name, mapping, options);
  parser.push(encoder.encode(text));
  return assembleImport([parser.finish()], mapping.angle === true);
}
