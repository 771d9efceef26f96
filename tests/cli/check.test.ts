// The `check` verb end to end: main([...]) with a captured Io on small CSV files in a temp dir.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { main, type Io } from '../../src-main/cli.ts';
import { Pcg32 } from '../../src-main/engine/signal/random.ts';

let dir = '';

async function runCli(argv: string[]): Promise<{ code: number; out: string; err: string }> {
  const out: string[] = [], err: string[] = [];
  const io: Io = { out: (l) => out.push(l), err: (l) => err.push(l) };
  const code = await main(argv, io);
  return { code, out: out.join('\n'), err: err.join('\n') };
}

// Free decay x = A e^{-zeta w t} cos(wd t), wd = w sqrt(1 - zeta^2) (elementary), plus noise.
const ZETA = 0.015, F = 1.25, DT = 0.004;
function decay(t: number, A: number): number {
  const w = 2 * Math.PI * F;
  return A * Math.exp(-ZETA * w * t) * Math.cos(w * Math.sqrt(1 - ZETA * ZETA) * t);
}

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'ergostat-check-'));
  const rng = new Pcg32(31);
  const lines = ['time,x,trial'];
  for (const [trial, A] of [[1, 0.05], [2, 0.03]]) {
    for (let i = 0; i < 2500; i++) lines.push(`${(i * DT).toFixed(3)},${(decay(i * DT, A) + 2e-4 * rng.normal()).toFixed(6)},${trial}`);
  }
  writeFileSync(join(dir, 'beam.csv'), lines.join('\n') + '\n');
  // An angle about pi, so the wrapped readings jump between +pi and -pi, with 4 samples missing.
  const ang = ['t,theta'];
  for (let i = 0; i < 1500; i++) {
    if (i >= 700 && i < 704) continue;
    const th = Math.PI + decay(i * DT, 0.6) + 1e-3 * rng.normal();
    ang.push(`${(i * DT).toFixed(3)},${(th - 2 * Math.PI * Math.round(th / (2 * Math.PI))).toFixed(5)}`);
  }
  writeFileSync(join(dir, 'pendulum.csv'), ang.join('\n') + '\n');
  writeFileSync(join(dir, 'short.csv'), ['t,x', ...Array.from({ length: 150 }, (_, i) => `${i * 0.01},${Math.sin(i * 0.2).toFixed(4)}`)].join('\n') + '\n');
  writeFileSync(join(dir, 'bad.csv'), 't,x\n0,1\n0.01,2\n0.02,1.2.3\n');
});

afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('ergostat check', () => {
  it('summarises each run and exits 0', async () => {
    const r = await runCli(['check', join(dir, 'beam.csv'), '--time', 'time', '--position', 'x', '--run', 'trial']);
    expect(r.err).toBe('');
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/^2 run\(s\) from 1 file\(s\); time "time", position "x" \(displacement, m\)/);
    expect(r.out).toMatch(/samples {6}2500 at 250 Hz, duration 9\.996 s \(lines 2-2501\)/); // 1 / 0.004 s
    expect(r.out).toMatch(/lines 2502-5001/);
    expect(r.out).toMatch(/noise {8}sigma 0\.000\d+ m/);
    expect(r.out).toMatch(/Savitzky-Golay window \d+ samples \(half window \d+\), order \d; estimated velocity error/);
    expect(r.out).toMatch(/fixes: none/);
    // Damping of both runs against the zeta written into the file (references.md §2 formula), 3 %.
    const ratios = [...r.out.matchAll(/damping {6}ratio ([\d.e-]+)/g)].map((m) => Number(m[1]));
    expect(ratios).toHaveLength(2);
    for (const z of ratios) expect(Math.abs(z / ZETA - 1)).toBeLessThan(0.03);
    // Noise: the 2e-4 put in, within 10 % (first run).
    const sigma = Number(/sigma ([\d.e-]+) m/.exec(r.out)![1]);
    expect(Math.abs(sigma / 2e-4 - 1)).toBeLessThan(0.1);
  });

  it('reports the import fixes, and uses a window given on the command line', async () => {
    const r = await runCli(['check', join(dir, 'pendulum.csv'), '--time', '1', '--position', 'theta', '--angle', '--window', '21', '--order', '3']);
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/2 run\(s\) from 1 file\(s\).*\(angle, rad\)/);
    expect(r.out).toMatch(/fixes:\n {2}\[gap-split\] .*\n {2}\[unwrapped\] /);
    expect(r.out).toMatch(/Savitzky-Golay window 21 samples \(half window 10\), order 3/);
    expect(r.out).toMatch(/given by the caller/);
    expect(r.out).toMatch(/about 3\.14\d* rad/); // equilibrium of the unwrapped angle near pi
  });

  it('skips the analysis of a run shorter than the window given, still exiting 0', async () => {
    const r = await runCli(['check', join(dir, 'short.csv'), '--time', 't', '--position', 'x', '--window', '201']);
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/samples {6}150 at 100 Hz/);
    expect(r.out).toMatch(/analysis skipped: .*override\.halfWindow must be an integer in \[1, 74\], got 100/);
  });

  it('exits 1 with the file, line and column on stderr for a data error', async () => {
    const bad = await runCli(['check', join(dir, 'bad.csv'), '--time', 't', '--position', 'x']);
    expect(bad.code).toBe(1);
    expect(bad.out).toBe('');
    expect(bad.err).toMatch(/^ergostat check: bad\.csv line 4, column 2 "x": .*1\.2\.3/);
    const missing = await runCli(['check', join(dir, 'nope.csv'), '--time', 't', '--position', 'x']);
    expect(missing.code).toBe(1);
    expect(missing.err).toMatch(/nope\.csv: file not found/);
    const column = await runCli(['check', join(dir, 'beam.csv'), '--time', 'time', '--position', 'y']);
    expect(column.code).toBe(1);
    expect(column.err).toMatch(/no column named "y"/);
  });

  it('exits 2 on usage errors', async () => {
    const cases: [string[], RegExp][] = [
      [[join(dir, 'beam.csv'), '--time', 'time'], /missing required option --position/],
      [['--time', 'time', '--position', 'x'], /no recording given/],
      [[join(dir, 'beam.csv'), '--time', 'time', '--position', 'x', '--window', '20'], /--window expects an odd number of samples >= 3, got 20/],
      [[join(dir, 'beam.csv'), '--time', 'time', '--position', 'x', '--window', '5', '--order', '6'], /--window \(5\) must exceed --order \(6\)/],
      [[join(dir, 'beam.csv'), '--time', 'time', '--position', 'x', '--order', 'two'], /--order expects a number, got "two"/],
      [[join(dir, 'beam.csv'), '--time', 'time', '--position', 'x', '--colour', 'red'], /unknown option --colour/],
    ];
    for (const [args, message] of cases) {
      const r = await runCli(['check', ...args]);
      expect(r.code, args.join(' ')).toBe(2);
      expect(r.err).toMatch(/^ergostat check: /);
      expect(r.err).toMatch(message);
    }
    const help = await runCli(['check', '--help']);
    expect(help.code).toBe(0);
    expect(help.out).toMatch(/^usage: ergostat check REC\.csv \[\.\.\.\] --time COL --position COL/);
  });
});
