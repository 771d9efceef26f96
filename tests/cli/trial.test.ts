// The `trial` verb end to end: main([...]) with a captured Io, on design files made by the designer
// from small analytic model files written by the test.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { main, type Io } from '../../src-main/cli.ts';
import { designLevelHold } from '../../src-main/design/level-hold.ts';
import { GRAV, LEN, duffingModel, pendulumModel } from '../design/models.ts';

let dir = '';
const p = (name: string) => join(dir, name);
const M = 0.5, I = M * LEN * LEN, MGL = M * GRAV * LEN;

async function runCli(argv: string[]): Promise<{ code: number; out: string[]; err: string }> {
  const out: string[] = [], err: string[] = [];
  const io: Io = { out: (l) => out.push(l), err: (l) => err.push(l) };
  const code = await main(argv, io);
  return { code, out, err: err.join('\n') };
}

function csv(name: string): { header: string[]; rows: number[][] } {
  const lines = readFileSync(p(name), 'utf8').trim().split('\n');
  return { header: lines[0].split(','), rows: lines.slice(1).map((l) => l.split(',').map(Number)) };
}

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'ergostat-trial-'));
  const pend = designLevelHold(pendulumModel(), { target: { kind: 'amplitude', amplitude: 1 }, mass: I, uMax: 0.3, integral: true });
  writeFileSync(p('pend.json'), JSON.stringify(pend));
  const rest = designLevelHold(duffingModel(), { target: { kind: 'at-rest', well: 2 }, uMax: 0.5, rateHz: 200 });
  writeFileSync(p('rest.json'), JSON.stringify(rest));
  // A two-stage design by hand: raise to 0.3 J, then hold 0.15 J once H > 0.25 J.
  const staged = { ...pend, kind: 'well-hop', stages: [
    { index: 1, name: 'raise', target: { kind: 'energy', energy: 0.3 }, meanB2: null },
    { index: 2, name: 'hold', target: { kind: 'energy', energy: 0.15 }, meanB2: null },
  ], transitions: [{ from: 1, to: 2, when: { energyAbove: 0.25 }, reason: 'high enough' }], sampleRateHz: 200 };
  writeFileSync(p('staged.json'), JSON.stringify(staged));
  // The pendulum as the user would write it (docs/plant-format.md), 5% longer than the model's.
  writeFileSync(p('plant.json'), JSON.stringify({ coordinate: 'angle', acceleration: '-(g/l)*sin(q) - c*v + u/(m*l^2)', params: { g: GRAV, l: 1.05 * LEN, m: M, c: 0.05 } }));
  writeFileSync(p('linear-plant.json'), JSON.stringify({ coordinate: 'linear', acceleration: '-q + u', params: {} }));
  writeFileSync(p('bad-plant.json'), JSON.stringify({ coordinate: 'angle', acceleration: '-sin(q) + u', params: { l: 'long' } }));
  const bad = { ...pend, law: { ...pend.law, R: -1 } };
  writeFileSync(p('bad-design.json'), JSON.stringify(bad));
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('ergostat trial', () => {
  it('runs a level-hold design on its own model, writes t,q,v,u,H and prints one JSON line with metrics and baselines', async () => {
    const r = await runCli(['trial', p('pend.json'), '--q0', '0.05', '--v0', '0', '--duration', '12', '--sensor-bits', '12', '--noise', '1e-4', '--out', p('t1.csv')]);
    expect(r.code).toBe(0);
    expect(r.out.length).toBe(1);
    const j = JSON.parse(r.out[0]);
    expect(j.kind).toBe('trial');
    expect(j.status).toBe('ok');
    // Elementary mechanics: H* = m g l (1 - cos A) for A = 1 rad.
    expect(j.target.energy).toBeCloseTo(MGL * (1 - Math.cos(1)), 12);
    expect(j.converged).toBe(true);
    expect(Math.abs(j.metrics.finalRelError)).toBeLessThan(0.02);
    expect(j.metrics.peakU).toBeLessThanOrEqual(0.3);
    expect(j.baselines.map((b: { name: string }) => b.name)).toEqual(['energy-pump', 'open-loop']);
    expect(j.baselines[1].metrics.peakU).toBe(0);
    expect(j.switches).toBeUndefined();
    const t = csv('t1.csv');
    expect(t.header).toEqual(['t', 'q', 'v', 'u', 'H']);
    expect(t.rows.length).toBe(12000);
    // The H column against the pendulum energy written by hand (elementary mechanics).
    for (const k of [0, 999, 5000, 11999]) {
      const [, q, v, , H] = t.rows[k];
      expect(H).toBeCloseTo(I * v * v / 2 + MGL * (1 - Math.cos(q)), 10);
    }
  });

  it('adds the LQR baseline when the target is an equilibrium (at rest in a Duffing well)', async () => {
    const r = await runCli(['trial', p('rest.json'), '--q0', '1.3', '--v0', '0', '--duration', '20', '--estimator', 'observer', '--out', p('t2.csv')]);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out[0]);
    expect(j.baselines.map((b: { name: string }) => b.name)).toEqual(['lqr', 'energy-pump', 'open-loop']);
    expect(j.baselines[0].status).toBe('ok');
    expect(j.metrics.target).toBe(0);
    expect(j.target.well).toBe(2);
    // Started at q = 1.3 in well 2 (right of the barrier at 0), it must end there.
    expect(j.finalWell).toBe(2);
    // At rest the band is set by the sensor's energy resolution or 2% of 0: the final energy is small against the start's.
    expect(j.metrics.finalEnergy).toBeLessThan(0.1 * (1.3 ** 2 - 1) ** 2 / 4);
  });

  it('runs a staged design with a stage column and reports the switch times', async () => {
    const r = await runCli(['trial', p('staged.json'), '--q0', '0.2', '--v0', '0', '--duration', '15', '--out', p('t3.csv')]);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out[0]);
    expect(j.switches.length).toBe(1);
    expect(j.switches[0]).toMatchObject({ from: 1, to: 2 });
    const t = csv('t3.csv');
    expect(t.header).toEqual(['t', 'q', 'v', 'u', 'H', 'stage']);
    const k = t.rows.findIndex((row) => row[5] === 2);
    expect(t.rows[k][0]).toBeCloseTo(j.switches[0].t, 12);
    expect(t.rows[k - 1][5]).toBe(1);
    expect(j.target.energy).toBe(0.15);
  });

  it('runs against a plant.json and a Monte Carlo on two workers, reporting the share that converged', async () => {
    const r = await runCli(['trial', p('pend.json'), '--plant', p('plant.json'), '--q0', '0.05', '--v0', '0', '--duration', '6',
      '--runs', '4', '--mismatch', '0.1', '--workers', '2', '--seed', '7', '--out', p('t4.csv')]);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out[0]);
    expect(j.plant).toBe(p('plant.json'));
    expect(j.monteCarlo.completed).toBe(4);
    expect(j.monteCarlo.workers).toBe(2);
    expect(j.monteCarlo.convergedShare).toBe(j.monteCarlo.convergedCount / 4);
    expect(r.err).toMatch(/monte carlo: 4 of 4 runs/);
  });

  it('runs the Monte Carlo of a staged design in this thread', async () => {
    const r = await runCli(['trial', p('staged.json'), '--q0', '0.2', '--v0', '0', '--duration', '6', '--runs', '3', '--mismatch', '0.1', '--out', p('t5.csv')]);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out[0]);
    expect(j.monteCarlo.completed).toBe(3);
    expect(j.monteCarlo.workers).toBe(0);
  });

  it('reports bad files as data errors (exit 1) naming the file and field', async () => {
    const cases: [string[], RegExp][] = [
      [[p('bad-design.json')], /bad-design\.json: law\.R: expected a positive number/],
      [[p('missing.json')], /missing\.json: cannot read the controller design \(ENOENT\)/],
      [[p('pend.json'), '--plant', p('bad-plant.json')], /bad-plant\.json\.params\.l/],
      [[p('pend.json'), '--plant', p('linear-plant.json')], /coordinate is "linear" but the design is for an angle/],
      [[p('plant.json')], /plant\.json: format: expected "ergostat-controller-design"/],
    ];
    for (const [files, msg] of cases) {
      const r = await runCli(['trial', ...files, '--q0', '0', '--v0', '1', '--duration', '1', '--out', p('x.csv')]);
      expect(r.code, files.join(' ')).toBe(1);
      expect(r.err).toMatch(msg);
    }
  });

  it('rejects bad usage with exit 2', async () => {
    const base = [p('pend.json'), '--q0', '0', '--v0', '1', '--duration', '1', '--out', p('x.csv')];
    const cases: [string[], RegExp][] = [
      [[p('pend.json'), '--v0', '1', '--duration', '1', '--out', p('x.csv')], /missing required option --q0/],
      [[...base, '--mismatch', '0.1'], /--mismatch needs --runs/],
      [[...base, '--runs', '3', '--mismatch', '1.5'], /--mismatch expects a fraction in \[0, 1\)/],
      [[...base, '--estimator', 'kalman'], /--estimator expects "difference" or "observer"/],
      [[...base, '--runs', '0'], /--runs expects a whole number from 1/],
      [[...base, '--sensor-range', '3'], /--sensor-range needs --sensor-bits/],
      [[p('pend.json'), '--q0', '0', '--v0', '1', '--duration', '-2', '--out', p('x.csv')], /--duration expects a positive number/],
    ];
    for (const [argv, msg] of cases) {
      const r = await runCli(['trial', ...argv]);
      expect(r.code, argv.join(' ')).toBe(2);
      expect(r.err).toMatch(msg);
    }
  });
});
