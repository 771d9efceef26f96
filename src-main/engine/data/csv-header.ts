// The CSV header line: the delimiter (comma, semicolon or tab, whichever occurs most often outside
// double quotes; ties go tab > semicolon > comma), the column names (quotes removed, trimmed), and
// the resolution of the caller's column mapping against them.
import { DataError, type ColumnRef } from './data-error.ts';
import type { ColumnMapping } from './types.ts';

export interface CsvHeader {
  /** The delimiter byte: 44 ',', 59 ';' or 9 tab. */
  delimiter: number;
  names: string[];
}

const CANDIDATES = [9, 59, 44]; // tie-break order

function splitOutsideQuotes(line: string, delim: string): string[] {
  const out: string[] = [];
  let cur = '';
  let quoted = false;
  for (let i = 0; i < line.length; i++) {
    const ch = line[i];
    if (ch === '"') {
      if (quoted && line[i + 1] === '"') { cur += '"'; i++; continue; }
      quoted = !quoted;
      continue;
    }
    if (ch === delim && !quoted) { out.push(cur.trim()); cur = ''; continue; }
    cur += ch;
  }
  out.push(cur.trim());
  return out;
}

/** Reads the header line (without its line end). `display` names the file in messages. */
export function parseHeaderLine(line: string, file: string, display: string): CsvHeader {
  if (line.trim() === '') throw new DataError(file, 'the header line is empty; expected column names such as "t,theta"', 1, undefined, display);
  if (line.includes('\r')) {
    throw new DataError(file, 'the lines end in a bare carriage return (an old Mac text format); save the file with \\n or \\r\\n line ends', 1, undefined, display);
  }
  const counts = new Map<number, number>(CANDIDATES.map((c) => [c, 0]));
  let quoted = false;
  let quotes = 0;
  for (let i = 0; i < line.length; i++) {
    const c = line.charCodeAt(i);
    if (c === 34) { quoted = !quoted; quotes++; continue; }
    if (!quoted && counts.has(c)) counts.set(c, counts.get(c)! + 1);
  }
  if (quotes % 2 !== 0) throw new DataError(file, 'the header line has an unterminated double quote', 1, undefined, display);
  let delimiter = 0;
  let best = 0;
  for (const c of CANDIDATES) {
    const k = counts.get(c)!;
    if (k > best) { best = k; delimiter = c; }
  }
  if (best === 0) {
    throw new DataError(file, `the header line has a single column ${JSON.stringify(line.trim())}; expected at least a time and a position column separated by commas, semicolons or tabs`, 1, undefined, display);
  }
  return { delimiter, names: splitOutsideQuotes(line, String.fromCharCode(delimiter)) };
}

/** "1 "t", 2 "theta", 3 "run"": the header's columns for messages. */
export function listColumns(names: string[]): string {
  const clip = (n: string): string => (n.length > 40 ? `${n.slice(0, 37)}...` : n);
  const shown = names.slice(0, 20).map((n, i) => `${i + 1} "${clip(n)}"`).join(', ');
  return names.length > 20 ? `${shown}, ... (${names.length} in all)` : shown;
}

/** The 0-based index of the column a mapping entry names. */
export function resolveColumn(header: CsvHeader, spec: string | number, role: string, file: string, display: string): number {
  const names = header.names;
  if (typeof spec === 'string') {
    const want = spec.trim().toLowerCase();
    const hits: number[] = [];
    names.forEach((n, i) => { if (n.toLowerCase() === want) hits.push(i); });
    if (hits.length > 1) {
      throw new DataError(file, `the ${role} column name "${spec.trim()}" is ambiguous: columns ${hits.map((i) => i + 1).join(' and ')} have it`, 1, undefined, display);
    }
    if (hits.length === 1) return hits[0];
    if (!/^\d+$/.test(want)) {
      throw new DataError(file, `no column named "${spec.trim()}" for the ${role}; the header has columns ${listColumns(names)}`, 1, undefined, display);
    }
    spec = Number(want);
  }
  if (spec < 1 || spec > names.length) {
    throw new DataError(file, `no column number ${spec} for the ${role}; the header has ${names.length} columns: ${listColumns(names)}`, 1, undefined, display);
  }
  return spec - 1;
}

export interface ResolvedColumns {
  time: ColumnRef;
  position: ColumnRef;
  input?: ColumnRef;
  run?: ColumnRef;
}

/** Resolves every mapped column; two roles may not share a column. */
export function resolveMapping(header: CsvHeader, mapping: ColumnMapping, file: string, display: string): ResolvedColumns {
  const ref = (i: number): ColumnRef => ({ index: i + 1, name: header.names[i] });
  const roles: [keyof ResolvedColumns, string | number | undefined][] = [
    ['time', mapping.time], ['position', mapping.position], ['input', mapping.input], ['run', mapping.run],
  ];
  const out: Partial<ResolvedColumns> = {};
  const taken = new Map<number, string>();
  for (const [role, spec] of roles) {
    if (spec === undefined) continue;
    const i = resolveColumn(header, spec, role, file, display);
    const other = taken.get(i);
    if (other !== undefined) throw new DataError(file, `column ${i + 1} "${header.names[i]}" is mapped as both the ${other} and the ${role}`, 1, undefined, display);
    taken.set(i, role);
    out[role] = ref(i);
  }
  return out as ResolvedColumns;
}
