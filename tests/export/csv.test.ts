// Trial CSV: the round trip is bit for bit (ECMA-262 Number::toString is the shortest string that
// reads back to the same double), the header is exactly t,q,v,u,H[,stage], and bad files are refused
// with the file, line and column named.
import { describe, expect, it } from 'vitest';
import { traceFromCsv, traceToCsv } from '../../src-main/export/csv.ts';

describe('trial CSV', () => {
  it('round-trips every double exactly, including awkward ones', () => {
    const vals = [0.1 + 0.2, 1 / 3, -Math.PI, 5e-324, 1.7976931348623157e308, -0, 123456789.12345678, 2 ** -1074 * 3];
    const n = vals.length;
    const tr = {
      t: Float64Array.from({ length: n }, (_, i) => i * 0.001), q: Float64Array.from(vals), v: Float64Array.from(vals.map((x) => -x)),
      u: Float64Array.from(vals.map((x) => x / 7)), H: Float64Array.from(vals.map((x) => x * 3)), stage: Float64Array.from({ length: n }, (_, i) => (i < 4 ? 1 : 2)),
    };
    const text = traceToCsv(tr);
    expect(text.split('\n')[0]).toBe('t,q,v,u,H,stage');
    expect(text.endsWith('\n')).toBe(true);
    const back = traceFromCsv(text, 'x.csv');
    for (const k of ['t', 'q', 'v', 'u', 'H', 'stage'] as const) {
      for (let i = 0; i < n; i++) expect(Object.is(back[k]![i], tr[k][i])).toBe(true); // -0 included
    }
    expect(traceToCsv({ t: new Float64Array([0, 1]), q: new Float64Array(2), v: new Float64Array(2), u: new Float64Array(2), H: new Float64Array(2) }).split('\n')[0]).toBe('t,q,v,u,H');
  });

  it('refuses bad files, naming the file, line and column', () => {
    expect(() => traceFromCsv('', 'a.csv')).toThrow(/^a\.csv: empty file/);
    expect(() => traceFromCsv('time,q,v,u,H\n0,0,0,0,0\n', 'a.csv')).toThrow(/a\.csv: line 1: expected the header/);
    expect(() => traceFromCsv('t,q,v,u,H\n0,0,0,0,0\n0.1,0,x,0,0\n', 'a.csv')).toThrow(/a\.csv: line 3, column v: expected a number, got "x"/);
    expect(() => traceFromCsv('t,q,v,u,H\n0,0,0,0\n', 'a.csv')).toThrow(/line 2: expected 5 fields, got 4/);
    expect(() => traceFromCsv('t,q,v,u,H,stage\n0,0,0,0,0,1.5\n', 'a.csv')).toThrow(/column stage: expected a stage number/);
    expect(() => traceFromCsv('t,q,v,u,H\n0,0,0,0,0\n0,0,0,0,0\n', 'a.csv')).toThrow(/line 3, column t: time must increase/);
  });
});
