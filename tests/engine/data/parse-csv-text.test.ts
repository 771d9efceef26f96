import { describe, expect, it } from 'vitest';
import { DataError, parseCsvText } from '../../../src-main/engine/data/index.ts';
import { csv, dataError, swingRows } from './helpers.ts';

// Expected values come from the text written (Number() of each field) or from how the test data
// was built (sample counts, gap positions, grids); the expected messages are the documented formats.
const map = { time: 't', position: 'theta' };

function numbers(rows: string[][], col: number): number[] {
  return rows.map((r) => Number(r[col]));
}

describe('parseCsvText: format', () => {
  it.each([
    ['comma', ','],
    ['semicolon', ';'],
    ['tab', '\t'],
  ])('reads a %s-separated file', (_name, delim) => {
    const rows = swingRows(100);
    const r = parseCsvText(csv(['t', 'theta'], rows, delim), 'a.csv', map);
    expect(r.recording.runs).toHaveLength(1);
    expect(Array.from(r.recording.runs[0].t)).toEqual(numbers(rows, 0));
    expect(Array.from(r.recording.runs[0].q)).toEqual(numbers(rows, 1));
    expect(r.channels).toEqual({ time: 't', position: 'theta' });
    expect(r.recording.coordinate).toBe('linear');
  });

  it('reads quoted header names, CRLF line ends, a byte-order mark and a column number', () => {
    const rows = swingRows(80).map(([t, q]) => [t, q, '0.5']);
    const text = '\ufeff' + csv(['"Time (s)"', '"angle, rad"', '"drive"'], rows, ',', '\r\n');
    const r = parseCsvText(text, 'b.csv', { time: 'time (s)', position: 'Angle, Rad', input: 3 });
    expect(r.channels).toEqual({ time: 'Time (s)', position: 'angle, rad', input: 'drive' });
    const run = r.recording.runs[0];
    expect(Array.from(run.q)).toEqual(numbers(rows, 1));
    expect(Array.from(run.u!)).toEqual(new Array(80).fill(0.5));
    expect(r.stats[0]).toMatchObject({ samples: 80, firstLine: 2, lastLine: 81 });
  });

  it('reads quoted numbers and blanks around numbers', () => {
    const rows = swingRows(70).map(([t, q], i) => (i % 2 === 0 ? [`"${t}"`, ` ${q} `] : [t, `"${q}"`]));
    const r = parseCsvText(csv(['t', 'theta'], rows, ';'), 'n.csv', map);
    expect(Array.from(r.recording.runs[0].q)).toEqual(swingRows(70).map(([, q]) => Number(q)));
  });

  it('reads a last line without a line end and ignores trailing blank lines', () => {
    const rows = swingRows(70);
    const text = csv(['t', 'theta'], rows).slice(0, -1);
    expect(parseCsvText(text, 'c.csv', map).stats[0].samples).toBe(70);
    const r = parseCsvText(text + '\n\n\n', 'c.csv', map);
    expect(r.stats[0].samples).toBe(70);
    expect(r.fixes).toEqual([]);
  });

  it('skips blank lines inside the data, reports them, and keeps line numbers right', () => {
    const rows = swingRows(70);
    const lines = csv(['t', 'theta'], rows).split('\n');
    lines.splice(11, 0, ''); // a blank line 12 (after the 10th sample, line 11)
    const text = lines.join('\n').replace('\n0.6000,', '\n0.6030,'); // an irregular step, found after the run is read
    const e = dataError(() => parseCsvText(text, 'd.csv', map));
    // sample index 60 sits on line 2 + 60 + 1 blank = 63, the sample before it on line 62
    expect(e.message).toMatch(/^d\.csv line 63, column 1 "t": irregular sampling: the step from t = 0\.59 s \(line 62\) to t = 0\.603 s is 0\.013 s/);
    const r = parseCsvText(lines.join('\n'), 'd.csv', map);
    expect(r.fixes).toEqual([{ code: 'blank-lines-skipped', file: 'd.csv', message: 'skipped 1 blank line in d.csv (line 12)' }]);
    expect(r.stats[0].lastLine).toBe(72);
  });

  it('makes runs from a run column (any label, a new run where the label changes)', () => {
    const a = swingRows(70).map((r) => [...r, 'first swing']);
    const b = swingRows(90, 0.005).map((r) => [...r, '"B, again"']);
    const c = swingRows(64).map((r) => [...r, 'first swing']);
    const r = parseCsvText(csv(['t', 'theta', 'run'], [...a, ...b, ...c]), 'e.csv', { ...map, run: 'run' });
    expect(r.recording.runs.map((x) => [x.name, x.t.length])).toEqual([
      ['e.csv run first swing', 70], ['e.csv run B, again', 90], ['e.csv run first swing #2', 64],
    ]);
    expect(r.stats.map((s) => [s.firstLine, s.lastLine])).toEqual([[2, 71], [72, 161], [162, 225]]);
    expect(r.stats[1].sampleRate).toBeCloseTo(200, 9); // written with step 0.005 s
    expect(r.channels.run).toBe('run');
  });
});

describe('parseCsvText: errors name the file, line and column', () => {
  const base = (): string[][] => swingRows(100);
  const text = (rows: string[][]): string => csv(['t', 'theta'], rows);
  const expectAt = (e: DataError, line: number, index: number, name: string): void => {
    expect([e.file, e.line, e.column]).toEqual(['swing-a.csv', line, { index, name }]);
  };

  it('a value that is not a number', () => {
    const rows = base();
    rows[41][1] = '1.2.3';
    const e = dataError(() => parseCsvText(text(rows), 'swing-a.csv', map));
    expect(e.message).toBe('swing-a.csv line 43, column 2 "theta": expected a number, found "1.2.3"');
    expectAt(e, 43, 2, 'theta');
    rows[41][1] = 'NaN';
    expect(dataError(() => parseCsvText(text(rows), 'swing-a.csv', map)).message).toBe('swing-a.csv line 43, column 2 "theta": expected a number, found "NaN"');
  });

  it('a decimal comma gets a hint', () => {
    const rows = base();
    rows[5][1] = '0,25';
    const e = dataError(() => parseCsvText(csv(['t', 'theta'], rows, ';'), 'swing-a.csv', map));
    expect(e.message).toBe('swing-a.csv line 7, column 2 "theta": expected a number, found "0,25" (a decimal comma? use a decimal point)');
  });

  it('an empty field and a short line are missing values', () => {
    const rows = base();
    rows[9][0] = ' ';
    const e = dataError(() => parseCsvText(text(rows), 'swing-a.csv', map));
    expect(e.message).toBe('swing-a.csv line 11, column 1 "t": missing value (empty field)');
    expectAt(e, 11, 1, 't');
    const short = text(base()).replace('\n0.2000,', '\n0.2000\n0.2050,');
    const f = dataError(() => parseCsvText(short, 'swing-a.csv', map));
    expect(f.message).toBe('swing-a.csv line 22, column 2 "theta": missing value: the line has 1 field, the header has 2');
  });

  it('a duplicate time and a time going backwards', () => {
    const rows = base();
    rows[30][0] = rows[29][0];
    const e = dataError(() => parseCsvText(text(rows), 'swing-a.csv', map));
    expect(e.message).toBe('swing-a.csv line 32, column 1 "t": duplicate time 0.29 s: line 31 has the same time stamp');
    expectAt(e, 32, 1, 't');
    rows[30][0] = '0.1';
    expect(dataError(() => parseCsvText(text(rows), 'swing-a.csv', map)).message).toBe(
      'swing-a.csv line 32, column 1 "t": time goes backwards: 0.1 s after 0.29 s on line 31; if the file holds several runs one after another, map a run column');
  });

  it('irregular sampling beyond the tolerance (a step neither regular nor a gap)', () => {
    const rows = base().map(([, q], i) => [(i < 50 ? i * 0.01 : i * 0.01 + 0.003).toFixed(4), q]);
    const e = dataError(() => parseCsvText(text(rows), 'swing-a.csv', map));
    expect(e.message).toBe('swing-a.csv line 52, column 1 "t": irregular sampling: the step from t = 0.49 s (line 51) to t = 0.503 s is 0.013 s, ' +
      '30% off the median step 0.01 s of the recording (tolerance 1%; steps over 1.5x the median are gaps and split the run). If the time column is rounded, export it with more decimals');
    expectAt(e, 52, 1, 't');
    // the same data passes with a looser tolerance
    expect(parseCsvText(text(rows), 'swing-a.csv', map, { irregularTolerance: 0.4, gapFactor: 2 }).recording.runs).toHaveLength(1);
  });

  it('too few samples in a run, with how many were found and needed', () => {
    const rows = [...swingRows(80).map((r) => [...r, 'A']), ...swingRows(12).map((r) => [...r, 'B'])];
    const e = dataError(() => parseCsvText(csv(['t', 'theta', 'run'], rows), 'swing-a.csv', { ...map, run: 'run' }));
    expect(e.message).toBe('swing-a.csv line 82, column 3 "run": run "B" has 12 samples (lines 82–93); at least 64 are needed');
    expectAt(e, 82, 3, 'run');
    const g = dataError(() => parseCsvText(text(swingRows(30)), 'swing-a.csv', map));
    expect(g.message).toBe('swing-a.csv line 2, column 1 "t": the recording has 30 samples (lines 2–31); at least 64 are needed');
    expect(parseCsvText(text(swingRows(30)), 'swing-a.csv', map, { minSamples: 30 }).stats[0].samples).toBe(30);
    const h = dataError(() => parseCsvText('t,theta\n', 'swing-a.csv', map));
    expect(h.message).toBe('swing-a.csv line 2, column 1 "t": no data lines after the header; at least 64 samples are needed');
  });

  it('a constant position channel', () => {
    const rows = base().map(([t]) => [t, '0.25']);
    const e = dataError(() => parseCsvText(text(rows), 'swing-a.csv', map));
    expect(e.message).toBe('swing-a.csv line 2, column 2 "theta": the position is constant (0.25) over all 100 samples of the recording (lines 2–101); a free-swing recording must move');
    expectAt(e, 2, 2, 'theta');
  });

  it('an unknown column name lists the header', () => {
    const e = dataError(() => parseCsvText(text(base()), 'swing-a.csv', { time: 't', position: 'angle' }));
    expect(e.message).toBe('swing-a.csv line 1: no column named "angle" for the position; the header has columns 1 "t", 2 "theta"');
    expect([e.file, e.line, e.column]).toEqual(['swing-a.csv', 1, undefined]);
  });

  it('an empty run label', () => {
    const rows = swingRows(100).map((r) => [...r, 'A']);
    rows[70][2] = '';
    const e = dataError(() => parseCsvText(csv(['t', 'theta', 'run'], rows), 'swing-a.csv', { ...map, run: 'run' }));
    expect(e.message).toBe('swing-a.csv line 72, column 3 "run": missing value (empty run label)');
  });

  it('bare carriage-return line ends', () => {
    const e = dataError(() => parseCsvText(csv(['t', 'theta'], base(), ',', '\r'), 'swing-a.csv', map));
    expect(e.message).toBe('swing-a.csv line 1: the lines end in a bare carriage return (an old Mac text format); save the file with \\n or \\r\\n line ends');
  });

  it('an empty file and a line with too many fields', () => {
    expect(dataError(() => parseCsvText('', 'swing-a.csv', map)).message).toBe('swing-a.csv line 1: the file is empty; expected a header line with the column names');
    const rows = base();
    rows[3].push('7');
    const e = dataError(() => parseCsvText(text(rows), 'swing-a.csv', map));
    expect([e.line, e.column]).toEqual([5, { index: 3, name: '' }]);
    expect(e.message).toBe('swing-a.csv line 5, column 3: the line has more fields than the 2 columns of the header (a stray delimiter, or an unquoted comma inside a value?)');
  });

  it('bad arguments throw at the door, naming the argument', () => {
    expect(() => parseCsvText('t,q\n', 'a.csv', { time: '', position: 'q' })).toThrow(/^mapping\.time: expected a column name/);
    expect(() => parseCsvText('t,q\n', 'a.csv', { time: 't', position: 'q', angle: 1 as unknown as boolean })).toThrow(/^mapping\.angle/);
    expect(() => parseCsvText('t,q\n', 'a.csv', map, { gapFactor: 1.005 })).toThrow(/^options\.gapFactor: must exceed 1 \+ options\.irregularTolerance/);
    expect(() => parseCsvText('t,q\n', 'a.csv', map, { minSamples: 2.5 })).toThrow(/^options\.minSamples/);
  });
});

describe('parseCsvText: fixes and warnings', () => {
  it('splits a run at a gap and reports the split as a fix', () => {
    // 100 samples at 0.01 s, then 0.35 s extra: t jumps from 0.99 to 1.35 (a 0.36 s step, 35 samples missing)
    const rows = swingRows(200).map(([, q], i) => [(i < 100 ? i * 0.01 : i * 0.01 + 0.35).toFixed(2), q]);
    const r = parseCsvText(csv(['t', 'theta'], rows), 'g.csv', map);
    expect(r.recording.runs.map((x) => [x.name, x.t.length, x.t[0]])).toEqual([['g.csv [0..0.99 s]', 100, 0], ['g.csv [1.35..2.34 s]', 100, 1.35]]);
    expect(r.fixes).toEqual([{ code: 'gap-split', file: 'g.csv', run: 'g.csv', message: 'split the recording of g.csv at t = 1.35 s (line 102): gap of 0.36 s after t = 0.99 s, about 35 missing samples' }]);
    expect(r.stats.map((s) => [s.firstLine, s.lastLine, s.samples])).toEqual([[2, 101, 100], [102, 201, 100]]);
    expect(r.stats[1].duration).toBeCloseTo(0.99, 12);
  });

  it('drops a stretch too short to be a run and says so', () => {
    const rows = swingRows(110).map(([, q], i) => [(i < 100 ? i * 0.01 : i * 0.01 + 1).toFixed(2), q]);
    const r = parseCsvText(csv(['t', 'theta'], rows), 'h.csv', map);
    expect(r.recording.runs.map((x) => x.t.length)).toEqual([100]);
    expect(r.fixes.map((f) => f.code)).toEqual(['gap-split', 'short-piece-dropped']);
    expect(r.fixes[1].message).toBe('dropped 10 samples of the recording of h.csv (t = 2..2.09 s, lines 102–111): a stretch between gaps shorter than the 64 samples a run needs');
  });

  it('unwraps a wrapped angle (compared with the analytic angle) and reports how many wraps were removed', () => {
    // theta(t) = 3 t + 0.5 sin 2t, written wrapped to [-pi, pi) with full precision
    const n = 1000;
    const theta = (t: number): number => 3 * t + 0.5 * Math.sin(2 * t);
    const wrap = (x: number): number => x - 2 * Math.PI * Math.floor((x + Math.PI) / (2 * Math.PI));
    const rows = Array.from({ length: n }, (_, i) => [String(i / 100), String(wrap(theta(i / 100)))]);
    const r = parseCsvText(csv(['t', 'theta'], rows), 'w.csv', { ...map, angle: true });
    const q = r.recording.runs[0].q;
    let err = 0;
    for (let i = 0; i < n; i++) err = Math.max(err, Math.abs(q[i] - theta(i / 100)));
    expect(err).toBeLessThan(1e-12);
    const wraps = Math.floor((theta(9.99) + Math.PI) / (2 * Math.PI));
    expect(r.fixes).toEqual([{ code: 'unwrapped', file: 'w.csv', run: 'w.csv', message: `unwrapped the angle of the recording of w.csv: removed ${wraps} wraps of 2π (jumps of more than π between samples)` }]);
    expect(r.recording.coordinate).toBe('angle');
    expect(r.stats[0].max).toBe(q[n - 1]);
  });

  it('warns of clipping: a swing flattened at +-0.5 m', () => {
    // 2 Hz sine at 200 Hz, clipped at 0.5: sin > 0.5 for phase in (1/12, 5/12) of a cycle, k = 9..41 of 100: 33 samples
    const rows = Array.from({ length: 400 }, (_, k) => [(k / 200).toFixed(3), Math.max(-0.5, Math.min(0.5, Math.sin((2 * Math.PI * k) / 100))).toFixed(6)]);
    const r = parseCsvText(csv(['t', 'theta'], rows), 'k.csv', map);
    expect(r.warnings.map((w) => w.code)).toEqual(['clipping', 'clipping']);
    expect(r.warnings[1].message).toBe('k.csv: position "theta" sits at its maximum 0.5 m for 33 consecutive samples (lines 11–43); 4 such stretches, 132 samples in all; the sensor may be clipping');
  });

  it('warns of heavy quantization with the step and the equivalent bits', () => {
    // 101 levels of 0.01 rad over [-0.5, 0.5]: log2(101) = 6.66 bits
    const rows = Array.from({ length: 500 }, (_, k) => [(k / 100).toFixed(2), (Math.round(50 * Math.sin(1.3 * k)) / 100).toFixed(2)]);
    const r = parseCsvText(csv(['t', 'theta'], rows), 'q.csv', { ...map, angle: true });
    expect(r.warnings).toEqual([{ code: 'quantization', file: 'q.csv', run: 'q.csv', message: 'q.csv: position "theta" is heavily quantized: step 0.01 rad, 101 levels over its range (6.7 bits, fewer than 256 levels); velocity estimates will need strong smoothing' }]);
    expect(r.stats[0].quantStep).toBeCloseTo(0.01, 14);
  });

  it('raises no warning and no fix on a clean recording', () => {
    const r = parseCsvText(csv(['t', 'theta'], swingRows(500)), 'clean.csv', map);
    expect([r.warnings, r.fixes]).toEqual([[], []]);
    expect(r.stats[0]).toMatchObject({ name: 'clean.csv', samples: 500, quantStep: 1e-6 });
    expect(r.stats[0].sampleRate).toBeCloseTo(100, 9);
  });
});
