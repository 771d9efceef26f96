import { mkdir, mkdtemp, rm, stat, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { importRecordings, parseCsvText } from '../../src-main/recordings/index.ts';
import { csv, dataErrorAsync, swingRows } from '../engine/data/helpers.ts';

// References: the text written to disk (Number() of each field, bit for bit), the in-memory
// parser on the same text, and the construction of the files (run counts, gaps).
let dir = '';
beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'ergostat-import-test-'));
});
afterAll(async () => {
  if (dir) await rm(dir, { recursive: true, force: true });
});

describe('importRecordings', () => {
  it('imports a moderately large file (200 000 rows) bit-exactly', async () => {
    const n = 200_000;
    const fields: string[][] = [];
    for (let k = 0; k < n; k++) {
      const q = 1.7 * Math.sin(k * 0.0123) + 1e-9 * k; // full precision: mostly 16-17 significant digits
      const u = Math.cos(k * 0.0071) / 3;
      fields.push([String(k / 1000), String(q), k % 8 === 0 ? u.toExponential(16) : u.toFixed(7), 'spare']);
    }
    const file = join(dir, 'big.csv');
    await writeFile(file, csv(['t', 'theta', 'drive', 'spare'], fields));
    // an odd chunk size, so chunks end at arbitrary places (inside numbers and lines)
    const r = await importRecordings([file], { time: 't', position: 'theta', input: 'drive' }, { chunkBytes: 65_537 });
    expect(r.recording.runs).toHaveLength(1);
    const run = r.recording.runs[0];
    expect(run.t.length).toBe(n);
    let mismatches = 0;
    for (let k = 0; k < n; k++) {
      if (!Object.is(run.t[k], Number(fields[k][0]))) mismatches++;
      if (!Object.is(run.q[k], Number(fields[k][1]))) mismatches++;
      if (!Object.is(run.u![k], Number(fields[k][2]))) mismatches++;
    }
    expect(mismatches).toBe(0);
    expect(r.stats[0]).toMatchObject({ samples: n, firstLine: 2, lastLine: n + 1 });
    expect(r.stats[0].sampleRate).toBeCloseTo(1000, 6);
  });

  it('puts several files together (runs by file and by run column), columns in any order', async () => {
    const a = join(dir, 'swing-a.csv');
    const b = join(dir, 'swing-b.csv');
    await writeFile(a, csv(['t', 'theta', 'run'], [...swingRows(80).map((r) => [...r, '1']), ...swingRows(70).map((r) => [...r, '2'])]));
    // second file: other column order, tab-separated, CRLF, one gap
    const rowsB = swingRows(150).map(([, q], i) => [q, (i < 75 ? i * 0.01 : i * 0.01 + 0.5).toFixed(2), 'x']);
    await writeFile(b, csv(['Theta', 'T', 'Run'], rowsB, '\t', '\r\n'));
    const r = await importRecordings([a, b], { time: 't', position: 'theta', run: 'run' });
    expect(r.recording.runs.map((x) => [x.name, x.source, x.t.length])).toEqual([
      ['swing-a.csv run 1', a, 80], ['swing-a.csv run 2', a, 70],
      ['swing-b.csv run x [0..0.74 s]', b, 75], ['swing-b.csv run x [1.25..1.99 s]', b, 75],
    ]);
    expect(r.fixes).toEqual([{ code: 'gap-split', file: b, run: 'swing-b.csv run x', message: 'split run "x" of swing-b.csv at t = 1.25 s (line 77): gap of 0.51 s after t = 0.74 s, about 50 missing samples' }]);
    expect(r.channels).toEqual({ time: 't', position: 'theta', run: 'run' });
    // the file import and the in-memory parser agree on the same text
    const mem = parseCsvText(csv(['Theta', 'T', 'Run'], rowsB, '\t', '\r\n'), b, { time: 't', position: 'theta', run: 'run' });
    expect(mem.stats).toEqual(r.stats.slice(2));
    expect(mem.recording.runs[1].q).toEqual(r.recording.runs[3].q);
  });

  it('names files by their full path when two share a name', async () => {
    await mkdir(join(dir, 'day1'), { recursive: true });
    await mkdir(join(dir, 'day2'), { recursive: true });
    const f1 = join(dir, 'day1', 'swing.csv');
    const f2 = join(dir, 'day2', 'swing.csv');
    await writeFile(f1, csv(['t', 'theta'], swingRows(70)));
    await writeFile(f2, csv(['t', 'theta'], swingRows(70)));
    const r = await importRecordings([f1, f2], { time: 't', position: 'theta' });
    expect(r.recording.runs.map((x) => x.name)).toEqual([f1, f2]);
  });

  it('reports a missing file, naming it and where it was looked for', async () => {
    const e = await dataErrorAsync(() => importRecordings([join(dir, 'nope.csv')], { time: 't', position: 'theta' }));
    expect(e.message).toBe(`nope.csv: file not found (looked for ${resolve(dir, 'nope.csv')})`);
    expect([e.file, e.line, e.column]).toEqual([join(dir, 'nope.csv'), undefined, undefined]);
    const f = await dataErrorAsync(() => importRecordings([dir], { time: 't', position: 'theta' }));
    expect(f.message).toMatch(/: is a folder, not a CSV file/);
  });

  it('reports a bad value deep in a file with its line and column', async () => {
    const rows = swingRows(5000);
    rows[4321][1] = '1.2.3';
    const file = join(dir, 'swing-c.csv');
    await writeFile(file, csv(['t', 'theta'], rows, ',', '\r\n'));
    const e = await dataErrorAsync(() => importRecordings([file], { time: 't', position: 'theta' }, { chunkBytes: 4096 }));
    expect(e.message).toBe('swing-c.csv line 4323, column 2 "theta": expected a number, found "1.2.3"');
  });

  it('reports progress and can be cancelled', async () => {
    const file = join(dir, 'swing-d.csv');
    await writeFile(file, csv(['t', 'theta'], swingRows(3000)));
    const size = (await stat(file)).size;
    const seen: number[] = [];
    await importRecordings([file], { time: 't', position: 'theta' }, { chunkBytes: 8192, onProgress: (p) => seen.push(p.bytesRead) });
    expect(seen.at(-1)).toBe(size);
    expect(seen.length).toBe(Math.ceil(size / 8192));
    const ac = new AbortController();
    ac.abort();
    await expect(importRecordings([file], { time: 't', position: 'theta' }, { signal: ac.signal })).rejects.toThrow(/abort/i);
  });

  it('rejects bad arguments at the door', async () => {
    await expect(importRecordings([], { time: 't', position: 'q' })).rejects.toThrow(/^files: expected a non-empty array/);
    await expect(importRecordings(['a.csv'], { time: 't', position: 'q' }, { chunkBytes: 0 })).rejects.toThrow(/^options\.chunkBytes/);
  });
});
