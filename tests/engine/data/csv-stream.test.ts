import { describe, expect, it } from 'vitest';
import { CsvStreamParser, type FileImport } from '../../../src-main/engine/data/index.ts';
import { csv, swingRows } from './helpers.ts';

// Reference: the same bytes pushed in one piece. Splitting the input anywhere (inside a number,
// between "\r" and "\n", inside a quoted label or the header) must not change any value or line.
function parse(bytes: Uint8Array, chunk: number): FileImport {
  const p = new CsvStreamParser('s.csv', { time: 'T', position: 'x', run: 'Run', input: 'u' });
  for (let o = 0; o < bytes.length; o += chunk) p.push(bytes.subarray(o, Math.min(bytes.length, o + chunk)));
  return p.finish();
}

describe('CsvStreamParser', () => {
  it('gives identical results for every way of cutting the bytes into chunks', () => {
    const a = swingRows(70).map(([t, x], i) => [t, x, '"run; one"', (i * 1e-3).toExponential(3)]);
    const b = swingRows(66, 0.02).map(([t, x], i) => [t, x, 'two', String(-i / 7)]);
    const bytes = new TextEncoder().encode('\ufeff' + csv(['"T"', 'x', 'Run', 'u'], [...a, ...b], ';', '\r\n'));
    const whole = parse(bytes, bytes.length);
    expect(whole.runs.map((r) => [r.name, r.t.length])).toEqual([['s.csv run run; one', 70], ['s.csv run two', 66]]);
    expect(Array.from(whole.runs[1].u!)).toEqual(b.map((r) => Number(r[3])));
    for (const chunk of [1, 2, 3, 5, 7, 13, 64, 257]) {
      const part = parse(bytes, chunk);
      expect(part.stats).toEqual(whole.stats);
      for (let k = 0; k < whole.runs.length; k++) {
        expect(part.runs[k].t).toEqual(whole.runs[k].t);
        expect(part.runs[k].q).toEqual(whole.runs[k].q);
        expect(part.runs[k].u).toEqual(whole.runs[k].u);
      }
    }
  });

  it('does not keep the caller\'s chunk (the buffer may be reused)', () => {
    const bytes = new TextEncoder().encode(csv(['T', 'x', 'Run', 'u'], swingRows(80).map(([t, x]) => [t, x, 'r', '0'])));
    const p = new CsvStreamParser('s.csv', { time: 'T', position: 'x', run: 'Run', input: 'u' });
    const buf = new Uint8Array(10);
    for (let o = 0; o < bytes.length; o += 10) {
      const n = Math.min(10, bytes.length - o);
      buf.set(bytes.subarray(o, o + n));
      p.push(buf.subarray(0, n));
      buf.fill(0x41); // scribble over it
    }
    expect(p.finish().stats).toEqual(parse(bytes, bytes.length).stats);
  });
});
