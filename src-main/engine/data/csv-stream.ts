// The streaming CSV reader at the heart of every import: bytes go in chunk by chunk (any split,
// even inside a line or a number), values go straight from the bytes into growable Float64Arrays,
// and each run is checked as soon as it ends (check-run.ts). No text of the whole file is ever
// built. Used by importRecordings (file chunks) and parseCsvText (one in-memory chunk).
//
// Format: one header line (line 1; a UTF-8 byte-order mark is skipped), then one sample per line;
// "\n" or "\r\n" line ends; the delimiter found in the header; blank lines are skipped and reported.
import { checkRun, type RawRun } from './check-run.ts';
import { CR, NL, decodeBytes, fieldEnd, unquoteField } from './csv-bytes.ts';
import { parseHeaderLine, resolveMapping, type CsvHeader, type ResolvedColumns } from './csv-header.ts';
import { DataError, baseName, type ColumnRef } from './data-error.ts';
import { plural } from './format.ts';
import { BlockPool, GrowableF64 } from './growable-f64.ts';
import { checkMapping, resolveOptions, type ResolvedOptions } from './options.ts';
import { NUM_MISSING, NUM_OK, numberScan, scanNumber } from './parse-number.ts';
import type { ColumnMapping, FileImport, ImportOptions, Notice, RunStats } from './types.ts';
import type { Run } from '../types.ts';

const ROLE_SKIP = 0;
const ROLE_T = 1;
const ROLE_Q = 2;
const ROLE_U = 3;
const ROLE_RUN = 4;

/** A byte buffer that grows by doubling (for the partial line carried between chunks). */
class ByteBuf {
  bytes = new Uint8Array(256);
  len = 0;
  append(src: Uint8Array, s: number, e: number): void {
    const need = this.len + (e - s);
    if (need > this.bytes.length) {
      let cap = this.bytes.length * 2;
      while (cap < need) cap *= 2;
      const nb = new Uint8Array(cap);
      nb.set(this.bytes.subarray(0, this.len));
      this.bytes = nb;
    }
    this.bytes.set(src.subarray(s, e), this.len);
    this.len = need;
  }
  clear(): void {
    this.len = 0;
  }
}

const NEWLINE = new Uint8Array([NL]);
const DELIMITER_NAMES: Record<number, string> = { 44: 'comma', 59: 'semicolon', 9: 'tab' };
/** A header line longer than this is taken as a sign that the file is not CSV text. */
const MAX_HEADER = 1 << 20;

export class CsvStreamParser {
  private readonly file: string;
  private readonly display: string;
  private readonly mapping: ColumnMapping;
  private readonly opts: ResolvedOptions;
  private readonly carry = new ByteBuf();
  private readonly scan = numberScan();
  /** The current line's numbers, indexed by role. */
  private readonly vals = new Float64Array(4);
  private line = 0;
  private header: CsvHeader | undefined;
  private cols: ResolvedColumns | undefined;
  private roles = new Uint8Array(0);
  private ncol = 0;
  private delim = 44;
  private hasRun = false;
  private hasInput = false;
  // the run being read
  private readonly pool = new BlockPool();
  private tb = new GrowableF64(this.pool);
  private qb = new GrowableF64(this.pool);
  private ub = new GrowableF64(this.pool);
  private runOpen = false;
  private label: string | undefined;
  private labelBytes = new Uint8Array(64);
  private labelLen = 0;
  private firstLine = 0;
  private blanks: number[] = [];
  private runRows = 0;
  private lastT = 0;
  private lastLine = 0;
  private rows = 0;
  private firstDataLine = 0;
  private readonly labelUses = new Map<string, number>();
  private pendingBlank: number[] = [];
  private skippedBlank: number[] = [];
  // results so far
  private readonly runs: Run[] = [];
  private readonly stats: RunStats[] = [];
  private readonly warnings: Notice[] = [];
  private readonly fixes: Notice[] = [];

  /**
   * @param file the file as the caller names it (a path, or a name for in-memory text)
   * @param display the name used in messages (default: the last path component)
   */
  constructor(file: string, mapping: ColumnMapping, options?: ImportOptions, display?: string) {
    if (typeof file !== 'string' || file === '') throw new TypeError('file: expected a non-empty file name');
    checkMapping(mapping);
    this.file = file;
    this.display = display ?? baseName(file);
    this.mapping = mapping;
    this.opts = resolveOptions(options);
  }

  /** Feeds the next bytes of the file. The chunk is not kept: it may be reused by the caller. */
  push(bytes: Uint8Array): void {
    // One plain Uint8Array view (not a Buffer subclass), so the hot loops see a single element kind.
    const chunk = bytes.constructor === Uint8Array ? bytes : new Uint8Array(bytes.buffer, bytes.byteOffset, bytes.length);
    const n = chunk.length;
    let p = 0;
    if (this.carry.len > 0 || this.header === undefined) {
      const nl = chunk.indexOf(NL);
      if (nl < 0) {
        this.carry.append(chunk, 0, n);
        if (this.header === undefined && this.carry.len > MAX_HEADER) {
          throw this.error(`no line end in the first ${MAX_HEADER} bytes: this does not look like a CSV file with a header line`, 1);
        }
        return;
      }
      this.carry.append(chunk, 0, nl + 1);
      if (this.header === undefined) this.readHeader(this.carry.bytes, this.carry.len);
      else this.parseLines(this.carry.bytes, 0, this.carry.len);
      this.carry.clear();
      p = nl + 1;
    }
    const last = chunk.lastIndexOf(NL);
    if (last >= p) {
      this.parseLines(chunk, p, last + 1);
      p = last + 1;
    }
    if (p < n) this.carry.append(chunk, p, n);
  }

  /** Ends the file: parses a last line without line end, checks the last run, returns the file's share. */
  finish(): FileImport {
    if (this.carry.len > 0) {
      this.carry.append(NEWLINE, 0, 1);
      if (this.header === undefined) this.readHeader(this.carry.bytes, this.carry.len);
      else this.parseLines(this.carry.bytes, 0, this.carry.len);
      this.carry.clear();
    }
    if (this.header === undefined || this.cols === undefined) throw this.error('the file is empty; expected a header line with the column names', 1);
    const cols = this.cols;
    if (this.rows === 0) {
      throw this.error(`no data lines after the header; at least ${this.opts.minSamples} samples are needed`, 2, cols.time);
    }
    this.closeRun();
    if (this.skippedBlank.length > 0) {
      const list = this.skippedBlank.slice(0, 10).join(', ') + (this.skippedBlank.length > 10 ? ', ...' : '');
      this.fixes.push({ code: 'blank-lines-skipped', file: this.file, message: `skipped ${plural(this.skippedBlank.length, 'blank line')} in ${this.display} (line${this.skippedBlank.length > 1 ? 's' : ''} ${list})` });
    }
    if (this.runs.length === 0) {
      throw this.error(`no run is left: every stretch between gaps is shorter than the ${this.opts.minSamples} samples a run needs`, this.firstDataLine, cols.time);
    }
    const channels: FileImport['channels'] = { time: cols.time.name, position: cols.position.name };
    if (cols.input) channels.input = cols.input.name;
    if (cols.run) channels.run = cols.run.name;
    return { file: this.file, channels, runs: this.runs, stats: this.stats, warnings: this.warnings, fixes: this.fixes };
  }

  private error(problem: string, line?: number, column?: ColumnRef): DataError {
    return new DataError(this.file, problem, line, column, this.display);
  }

  private columnRef(col: number): ColumnRef {
    return { index: col + 1, name: col < this.ncol ? this.header!.names[col] : '' };
  }

  private readHeader(b: Uint8Array, len: number): void {
    let s = 0;
    if (len >= 3 && b[0] === 0xef && b[1] === 0xbb && b[2] === 0xbf) s = 3; // UTF-8 byte-order mark
    let e = len - 1; // the '\n'
    if (e > s && b[e - 1] === CR) e--;
    const header = parseHeaderLine(decodeBytes(b, s, e), this.file, this.display);
    const cols = resolveMapping(header, this.mapping, this.file, this.display);
    this.header = header;
    this.cols = cols;
    this.delim = header.delimiter;
    this.ncol = header.names.length;
    this.roles = new Uint8Array(this.ncol).fill(ROLE_SKIP);
    this.roles[cols.time.index - 1] = ROLE_T;
    this.roles[cols.position.index - 1] = ROLE_Q;
    if (cols.input) { this.roles[cols.input.index - 1] = ROLE_U; this.hasInput = true; }
    if (cols.run) { this.roles[cols.run.index - 1] = ROLE_RUN; this.hasRun = true; }
    this.line = 1;
  }

  /** Parses whole lines b[p..end) (b[end - 1] is '\n'). The hot loop of the import. */
  private parseLines(b: Uint8Array, p: number, end: number): void {
    const delim = this.delim;
    const roles = this.roles;
    const ncol = this.ncol;
    const sc = this.scan;
    const vals = this.vals;
    while (p < end) {
      const line = ++this.line;
      let c = b[p];
      if (c === NL || (c === CR && b[p + 1] === NL)) {
        this.blankLine(line);
        p += c === NL ? 1 : 2;
        continue;
      }
      let ls = 0;
      let le = 0;
      let col = 0;
      for (;;) {
        const role = roles[col];
        if (role === ROLE_T || role === ROLE_Q || role === ROLE_U) {
          if (scanNumber(b, p, delim, sc) !== NUM_OK) throw this.valueError(col, line);
          p = sc.end;
          vals[role] = sc.value[0];
        } else if (role === ROLE_RUN) {
          ls = p;
          p = fieldEnd(b, p, delim);
          le = p;
        } else p = fieldEnd(b, p, delim);
        c = b[p];
        if (c === delim) {
          if (++col === ncol) {
            throw this.error(`the line has more fields than the ${ncol} columns of the header (a stray delimiter, or an unquoted ${DELIMITER_NAMES[delim]} inside a value?)`, line, { index: ncol + 1, name: '' });
          }
          p++;
          continue;
        }
        p += c === CR ? 2 : 1; // past "\n" or "\r\n"
        break;
      }
      if (col + 1 < ncol) {
        throw this.error(`missing value: the line has ${plural(col + 1, 'field')}, the header has ${ncol}`, line, this.columnRef(col + 1));
      }
      this.row(b, ls, le, line);
    }
  }

  private valueError(col: number, line: number): DataError {
    const sc = this.scan;
    if (sc.status === NUM_MISSING) return this.error('missing value (empty field)', line, this.columnRef(col));
    const hint = this.delim !== 44 && /^[+-]?\d*,\d+$/.test(sc.text) ? ' (a decimal comma? use a decimal point)' : '';
    return this.error(`expected a number, found ${JSON.stringify(sc.text)}${hint}`, line, this.columnRef(col));
  }

  private blankLine(line: number): void {
    if (this.runOpen) this.blanks.push(this.runRows);
    this.pendingBlank.push(line);
  }

  /** Commits the values of one line (in this.vals; see NumberScan on why not as arguments). */
  private row(b: Uint8Array, ls: number, le: number, line: number): void {
    const vals = this.vals;
    const t = vals[ROLE_T];
    if (this.hasRun) {
      let same = this.runOpen && le - ls === this.labelLen;
      if (same) {
        const lb = this.labelBytes;
        for (let i = 0, j = ls; j < le; i++, j++) if (lb[i] !== b[j]) { same = false; break; }
      }
      if (!same) {
        const text = unquoteField(decodeBytes(b, ls, le));
        if (text === '') throw this.error('missing value (empty run label)', line, this.cols!.run);
        if (!this.runOpen || text !== this.label) {
          this.closeRun();
          this.openRun(text, line);
        }
        if (le - ls > this.labelBytes.length) this.labelBytes = new Uint8Array(2 * (le - ls));
        this.labelBytes.set(b.subarray(ls, le));
        this.labelLen = le - ls;
      }
    } else if (!this.runOpen) this.openRun(undefined, line);
    if (this.runRows > 0 && !(t > this.lastT)) {
      const problem = t === this.lastT
        ? `duplicate time ${t} s: line ${this.lastLine} has the same time stamp`
        : `time goes backwards: ${t} s after ${this.lastT} s on line ${this.lastLine}` +
          (this.hasRun ? '' : '; if the file holds several runs one after another, map a run column');
      throw this.error(problem, line, this.cols!.time);
    }
    this.tb.pushFrom(vals, ROLE_T);
    this.qb.pushFrom(vals, ROLE_Q);
    if (this.hasInput) this.ub.pushFrom(vals, ROLE_U);
    this.runRows++;
    this.lastT = t;
    this.lastLine = line;
    if (this.rows++ === 0) this.firstDataLine = line;
    if (this.pendingBlank.length > 0) {
      for (const l of this.pendingBlank) this.skippedBlank.push(l);
      this.pendingBlank = [];
    }
  }

  private openRun(label: string | undefined, line: number): void {
    this.runOpen = true;
    this.label = label;
    this.firstLine = line;
    this.blanks = [];
    this.runRows = 0;
  }

  private closeRun(): void {
    if (!this.runOpen) return;
    this.runOpen = false;
    let name = this.display;
    if (this.label !== undefined) {
      const uses = (this.labelUses.get(this.label) ?? 0) + 1;
      this.labelUses.set(this.label, uses);
      name = `${this.display} run ${this.label}${uses > 1 ? ` #${uses}` : ''}`;
    }
    const raw: RawRun = {
      file: this.file, display: this.display, name,
      t: this.tb.toArray(), q: this.qb.toArray(), firstLine: this.firstLine, blanks: this.blanks,
    };
    if (this.label !== undefined) raw.label = this.label;
    if (this.hasInput) raw.u = this.ub.toArray();
    const r = checkRun(raw, { columns: this.cols!, angle: this.mapping.angle === true, opts: this.opts });
    for (const x of r.runs) this.runs.push(x);
    for (const x of r.stats) this.stats.push(x);
    for (const x of r.warnings) this.warnings.push(x);
    for (const x of r.fixes) this.fixes.push(x);
  }
}
