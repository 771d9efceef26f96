import { describe, expect, it } from 'vitest';
import { parseHeaderLine, resolveMapping } from '../../../src-main/engine/data/csv-header.ts';
import { dataError } from './helpers.ts';

describe('parseHeaderLine', () => {
  it('detects comma, semicolon and tab and trims the names', () => {
    expect(parseHeaderLine('t, theta ,run', 'a.csv', 'a.csv')).toEqual({ delimiter: 44, names: ['t', 'theta', 'run'] });
    expect(parseHeaderLine('t;theta', 'a.csv', 'a.csv')).toEqual({ delimiter: 59, names: ['t', 'theta'] });
    expect(parseHeaderLine('t\ttheta\tu', 'a.csv', 'a.csv')).toEqual({ delimiter: 9, names: ['t', 'theta', 'u'] });
  });

  it('reads quoted names, with delimiters and escaped quotes inside', () => {
    expect(parseHeaderLine('"time, s";"angle; rad";"the ""run"""', 'a.csv', 'a.csv')).toEqual({ delimiter: 59, names: ['time, s', 'angle; rad', 'the "run"'] });
  });

  it('rejects a header with one column, naming the file and line 1', () => {
    const e = dataError(() => parseHeaderLine('t theta', 'dir/a.csv', 'a.csv'));
    expect(e.message).toBe('a.csv line 1: the header line has a single column "t theta"; expected at least a time and a position column separated by commas, semicolons or tabs');
    expect([e.file, e.line]).toEqual(['dir/a.csv', 1]);
  });
});

describe('resolveMapping', () => {
  const h = parseHeaderLine('Time,Theta,Run,u', 'a.csv', 'a.csv');
  it('matches names case-insensitively after trimming, and 1-based column numbers', () => {
    const r = resolveMapping(h, { time: ' time ', position: 2, run: 'RUN', input: '4' }, 'a.csv', 'a.csv');
    expect(r).toEqual({ time: { index: 1, name: 'Time' }, position: { index: 2, name: 'Theta' }, run: { index: 3, name: 'Run' }, input: { index: 4, name: 'u' } });
  });

  it('names an unknown column and lists the header', () => {
    const e = dataError(() => resolveMapping(h, { time: 't', position: 'theta' }, 'a.csv', 'a.csv'));
    expect(e.message).toBe('a.csv line 1: no column named "t" for the time; the header has columns 1 "Time", 2 "Theta", 3 "Run", 4 "u"');
    expect(dataError(() => resolveMapping(h, { time: 1, position: 7 }, 'a.csv', 'a.csv')).message).toMatch(/no column number 7 for the position; the header has 4 columns/);
    expect(dataError(() => resolveMapping(h, { time: 1, position: 'time' }, 'a.csv', 'a.csv')).message).toMatch(/column 1 "Time" is mapped as both the time and the position/);
  });
});
