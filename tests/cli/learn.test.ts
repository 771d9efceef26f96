import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { mkdtempSync, readFileSync, rmSync, writeFileSync, existsSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { main } from '../../src-main/cli.ts';
import { readModelFile } from '../../src-main/model/index.ts';
import { simulate } from '../engine/learn/simulate.ts';

function io() {
  const out: string[] = [], err: string[] = [];
  return { io: { out: (l: string) => out.push(l), err: (l: string) => err.push(l) }, out, err };
}

let dir = '';
beforeAll(() => { dir = mkdtempSync(join(tmpdir(), 'ergostat-learn-')); });
afterAll(() => { rmSync(dir, { recursive: true, force: true }); });

function writeCsv(name: string, runs: { t: Float64Array; q: Float64Array; u?: Float64Array }[], withInput = false): string {
  const lines = [withInput ? 'time,theta,run,force' : 'time,theta,run'];
  runs.forEach((r, k) => { for (let i = 0; i < r.t.length; i++) lines.push(`${r.t[i]},${r.q[i]},${k + 1}${withInput ? `,${r.u ? r.u[i] : 0}` : ''}`); });
  const f = join(dir, name);
  writeFileSync(f, lines.join('\n') + '\n');
  return f;
}

describe('ergostat learn and energy', () => {
  it('learns a pendulum from a CSV of wrapped angles, writes the model and evaluates it at points', async () => {
    // H = v^2/2 - (g/l) cos q with g/l = 9.81/0.42 (elementary mechanics; references.md §5).
    const w2 = 9.81 / 0.42;
    const sim = simulate({ accel: (q, v) => -w2 * Math.sin(q) - 0.05 * v, inits: [[0.4, 0], [1.2, 0], [-2.2, 0], [0, 11]], dt: 0.005, seconds: 10, noise: 0.002, bits: 14, seed: 9, angle: true, wrap: true });
    const csv = writeCsv('pendulum.csv', sim.recording.runs);
    const model = join(dir, 'pendulum.json');
    const a = io();
    const code = await main(['learn', csv, '--time', 'time', '--position', 'theta', '--run', 'run', '--angle', '--out', model], a.io);
    expect(a.err.join('\n')).not.toMatch(/ergostat learn:/);
    expect(code).toBe(0);
    expect(a.out.join('\n')).toMatch(/energy {6}H\(q, v\) = .*cos\(q\)/);
    const m = await readModelFile(model);
    expect(m.coordinate).toBe('angle');
    const pts = join(dir, 'pts.csv');
    writeFileSync(pts, 'q,v\n0,0\n3.141592653589793,0\n0,2\n1,1\n');
    const out = join(dir, 'out.csv');
    const b = io();
    expect(await main(['energy', model, '--points', pts, '--out', out], b.io)).toBe(0);
    const rows = readFileSync(out, 'utf8').trim().split('\n').map((l) => l.split(',').map(Number));
    expect(readFileSync(out, 'utf8').split('\n')[0]).toBe('q,v,H');
    // Offset: H = 0 at the well bottom; barrier 2 g/l; kinetic v^2/2 (unit inertia) — elementary mechanics.
    expect(Math.abs(rows[1][2])).toBeLessThan(0.01 * w2);
    expect(Math.abs(rows[2][2] - 2 * w2) / (2 * w2)).toBeLessThan(0.01);
    expect(Math.abs(rows[3][2] - 2) / 2).toBeLessThan(0.02);
    expect(Math.abs(rows[4][2] - (0.5 + w2 * (1 - Math.cos(1)))) / (0.5 + w2 * (1 - Math.cos(1)))).toBeLessThan(0.01);
  });

  it('exits 3 and still writes the model with its verdict when no energy is found', async () => {
    // Heavy damping (zeta = 0.4): refused with the "no lightly damped energy" verdict.
    const sim = simulate({ accel: (q, v) => -25 * q - 4 * v, inits: [[1, 0], [-0.8, 2], [0.5, -3], [0.9, 1], [-1, -1]], dt: 0.005, seconds: 4, noise: 0.002, bits: 14, seed: 3 });
    const csv = writeCsv('damped.csv', sim.recording.runs);
    const model = join(dir, 'damped.json');
    const a = io();
    expect(await main(['learn', csv, '--time', 'time', '--position', 'theta', '--run', 'run', '--out', model], a.io)).toBe(3);
    expect(a.out.join('\n')).toMatch(/NO CONSERVED ENERGY \(heavy-damping\)/);
    expect(existsSync(model)).toBe(true);
    const m = await readModelFile(model);
    expect(m.status).toBe('no-energy');
    const b = io();
    expect(await main(['energy', model, '--points', join(dir, 'pts.csv'), '--out', join(dir, 'o2.csv')], b.io)).toBe(1);
    expect(b.err.join('\n')).toMatch(/holds no conserved energy/);
  });

  it('exits 1 on a data error and 2 on a usage error, naming the problem', async () => {
    const a = io();
    expect(await main(['learn', join(dir, 'missing.csv'), '--time', 't', '--position', 'q', '--out', join(dir, 'x.json')], a.io)).toBe(1);
    expect(a.err.join('\n')).toMatch(/missing\.csv: file not found/);
    const b = io();
    expect(await main(['learn', 'x.csv', '--time', 't', '--position', 'q'], b.io)).toBe(2);
    expect(b.err.join('\n')).toMatch(/missing required option --out/);
    const c = io();
    expect(await main(['learn', 'x.csv', '--time', 't', '--position', 'q', '--out', 'm.json', '--degree', '2.5'], c.io)).toBe(2);
    expect(c.err.join('\n')).toMatch(/--degree expects an integer/);
    const d = io();
    expect(await main(['learn', 'x.csv', '--time', 't', '--position', 'q', '--out', 'm.json', '--term', 'q^^2'], d.io)).toBe(2);
    expect(d.err.join('\n')).toMatch(/--term/);
  });

  it('energy names the line and column of a bad point', async () => {
    const model = join(dir, 'pendulum.json');
    const pts = join(dir, 'bad.csv');
    writeFileSync(pts, 'q,v\n0,0\n0.5,abc\n');
    const a = io();
    expect(await main(['energy', model, '--points', pts, '--out', join(dir, 'o3.csv')], a.io)).toBe(1);
    expect(a.err.join('\n')).toMatch(/bad\.csv: line 3, column "v": expected a finite number, got "abc"/);
  });
});
