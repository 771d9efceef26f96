// DataError: a problem with a recording file, located by file, line (header = line 1) and column.
// The message names the place in the form a test engineer can open in an editor:
//   swing-a.csv line 1043, column 2 "theta": expected a number, found "1.2.3"

/** A column of the CSV: 1-based index and the name from the header line. */
export interface ColumnRef {
  index: number;
  name: string;
}

/** The last path component, split on either slash (the engine does no path handling of its own). */
export function baseName(path: string): string {
  const i = Math.max(path.lastIndexOf('/'), path.lastIndexOf('\\'));
  return i >= 0 ? path.slice(i + 1) : path;
}

/** "swing-a.csv line 12, column 2 "theta"" (line and column optional). */
export function formatPlace(display: string, line?: number, column?: ColumnRef): string {
  let s = display;
  if (line !== undefined) s += ` line ${line}`;
  if (column !== undefined) s += `${line !== undefined ? ',' : ''} column ${column.index}${column.name !== '' ? ` "${column.name}"` : ''}`;
  return s;
}

export class DataError extends Error {
  override name = 'DataError';
  /** The file as the caller named it (path or in-memory name). */
  readonly file: string;
  /** 1-based line number (header = line 1); absent for whole-file problems such as a missing file. */
  readonly line?: number;
  /** The column concerned, when there is one. */
  readonly column?: ColumnRef;
  /** What is wrong, without the place (the full text with the place is `message`). */
  readonly problem: string;

  constructor(file: string, problem: string, line?: number, column?: ColumnRef, display?: string) {
    super(`${formatPlace(display ?? baseName(file), line, column)}: ${problem}`);
    this.file = file;
    this.problem = problem;
    if (line !== undefined) this.line = line;
    if (column !== undefined) this.column = column;
  }
}
