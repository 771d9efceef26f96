// Trial traces as CSV and back: header `t,q,v,u,H` (plus `stage` when the trace has one), one row
// per sample, numbers in JavaScript's shortest round-trip form (ECMA-262 Number::toString), which
// reads back to the identical double, so nothing is lost; stages as integers; no comment lines.
// -0 is written as -0; NaN and infinities as NaN, Infinity, -Infinity. Lines end with \n.
import type { Trace } from '../engine/trial/types.ts';

const COLUMNS = ['t', 'q', 'v', 'u', 'H'] as const;

/** Shortest round-trip text; -0 keeps its sign (String(-0) is "0"). */
const num = (x: number): string => (Object.is(x, -0) ? '-0' : String(x));

export function traceToCsv(trace: Trace): string {
  if (trace === null || typeof trace !== 'object') throw new TypeError('trace: expected a Trace {t, q, v, u, H[, stage]}');
  const n = trace.t?.length;
  for (const c of COLUMNS) {
    if (!trace[c] || typeof trace[c].length !== 'number') throw new TypeError(`trace.${c}: expected a column of numbers`);
    if (trace[c].length !== n) throw new RangeError(`trace.${c}: expected ${n} values (as trace.t), got ${trace[c].length}`);
  }
  const stage = trace.stage;
  if (stage && stage.length !== n) throw new RangeError(`trace.stage: expected ${n} values (as trace.t), got ${stage.length}`);
  const lines: string[] = [stage ? 't,q,v,u,H,stage' : 't,q,v,u,H'];
  for (let i = 0; i < n; i++) {
    let line = `${num(trace.t[i])},${num(trace.q[i])},${num(trace.v[i])},${num(trace.u[i])},${num(trace.H[i])}`;
    if (stage) line += `,${stage[i]}`;
    lines.push(line);
  }
  return `${lines.join('\n')}\n`;
}

/** Reads a CSV written by traceToCsv; errors name `where`, the line and the column. */
export function traceFromCsv(text: string, where = 'trace.csv'): Trace {
  if (typeof text !== 'string') throw new TypeError(`${where}: expected CSV text`);
  const lines = text.replace(/^\uFEFF/, '').split(/\r?\n/);
  while (lines.length > 0 && lines[lines.length - 1] === '') lines.pop();
  if (lines.length === 0) throw new RangeError(`${where}: empty file (expected the header t,q,v,u,H[,stage])`);
  const header = lines[0].split(',').map((s) => s.trim());
  const hasStage = header.length === 6 && header[5] === 'stage';
  if (!(header.length === 5 || hasStage) || COLUMNS.some((c, i) => header[i] !== c)) {
    throw new RangeError(`${where}: line 1: expected the header t,q,v,u,H or t,q,v,u,H,stage, got ${JSON.stringify(lines[0].slice(0, 80))}`);
  }
  const n = lines.length - 1;
  const cols = COLUMNS.map(() => new Float64Array(n));
  const st = hasStage ? new Float64Array(n) : undefined;
  for (let i = 0; i < n; i++) {
    const cells = lines[i + 1].split(',');
    if (cells.length !== header.length) throw new RangeError(`${where}: line ${i + 2}: expected ${header.length} fields, got ${cells.length}`);
    for (let j = 0; j < header.length; j++) {
      const s = cells[j].trim();
      const x = s === 'NaN' ? NaN : Number(s);
      if (s === '' || (Number.isNaN(x) && s !== 'NaN')) throw new RangeError(`${where}: line ${i + 2}, column ${header[j]}: expected a number, got ${JSON.stringify(s.slice(0, 40))}`);
      if (j < 5) cols[j][i] = x;
      else {
        if (!Number.isInteger(x) || x < 1) throw new RangeError(`${where}: line ${i + 2}, column stage: expected a stage number 1, 2, ..., got ${JSON.stringify(s)}`);
        st![i] = x;
      }
    }
    if (i > 0 && !(cols[0][i] > cols[0][i - 1])) throw new RangeError(`${where}: line ${i + 2}, column t: time must increase, got ${cols[0][i]} after ${cols[0][i - 1]}`);
  }
  const tr: Trace = { t: cols[0], q: cols[1], v: cols[2], u: cols[3], H: cols[4] };
  if (st) tr.stage = st;
  return tr;
}
