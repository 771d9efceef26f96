// `ergostat design ... --to-well K`: the well-hop branch of the design verb, end to end on model
// files written by the test (energy models written down analytically: tests/engine/plan/fixtures.ts).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, rmSync, writeFileSync, existsSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { main, type Io } from '../../src-main/cli.ts';
import { readDesign } from '../../src-main/design/validate.ts';
import { analyticModel, doubleWellModel } from '../engine/plan/fixtures.ts';

let dir = '';
const p = (name: string) => join(dir, name);

async function runCli(argv: string[]): Promise<{ code: number; out: string; err: string }> {
  const out: string[] = [], err: string[] = [];
  const io: Io = { out: (l) => out.push(l), err: (l) => err.push(l) };
  const code = await main(argv, io);
  return { code, out: out.join('\n'), err: err.join('\n') };
}

// Three wells: V'(q) = (q + 1.5)(q + 0.7)(q - 0.1)(q - 0.9)(q - 1.6) (see tests/design/hop.test.ts).
function threeWell() {
  let dV = [1];
  for (const r of [-1.5, -0.7, 0.1, 0.9, 1.6]) { const n = new Array(dV.length + 1).fill(0); dV.forEach((c, i) => { n[i + 1] += c; n[i] -= r * c; }); dV = n; }
  const Vc = dV.map((c, i) => c / (i + 1));
  const V = (q: number) => Vc.reduce((s, c, i) => s + c * q ** (i + 1), 0);
  return analyticModel({
    coordinate: 'linear', terms: [{ kind: 'mono', a: 0, b: 2 }, ...Vc.map((_, i) => ({ kind: 'mono' as const, a: i + 1, b: 0 }))],
    coefficients: [0.5, ...Vc], offset: -V(-1.5), lambda: -0.02, range: [-2.2, 2.3],
  });
}

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'ergostat-hop-'));
  writeFileSync(p('double-well.json'), JSON.stringify(doubleWellModel()));
  writeFileSync(p('three-well.json'), JSON.stringify(threeWell()));
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('ergostat design --to-well', () => {
  it('writes a two-stage hop into the other well of a double well, with its switch and feasibility check', async () => {
    const r = await runCli(['design', p('double-well.json'), '--to-well', '2', '--umax', '0.2', '--rate', '200', '--out', p('hop.json')]);
    expect(r.code).toBe(0);
    const d = readDesign(JSON.parse(readFileSync(p('hop.json'), 'utf8')), 'hop.json');
    expect(d.kind).toBe('well-hop');
    expect(d.stages.map((s) => s.target.kind)).toEqual(['energy', 'at-rest']);
    expect(d.stages[0].target.energy).toBeCloseTo(0.25 * 1.1, 9); // saddle 1/4 (references.md) + 10% default margin
    expect(d.transitions[0].when).toEqual({ qAbove: expect.closeTo(0.1, 6), vSign: 1 });
    expect(r.out).toMatch(/switch 1 -> 2: past the barrier at q = /);
    expect(r.out).toMatch(/\[ok\] feasibility: feasible at u_max = 0\.2 N/);
  });

  it('takes a level, a margin and a start well for a two-hop move on three wells', async () => {
    const r = await runCli(['design', p('three-well.json'), '--to-well', '3', '--from-well', '1', '--level', '0.3', '--margin', '0.2', '--umax', '0.3', '--rate', '200', '--out', p('hop3.json')]);
    expect(r.code).toBe(0);
    const d = readDesign(JSON.parse(readFileSync(p('hop3.json'), 'utf8')), 'hop3.json');
    expect(d.stages).toHaveLength(4);
    expect(d.stages[3].target).toEqual({ kind: 'energy', energy: 0.3 });
    expect(d.transitions.map((t) => [t.from, t.to])).toEqual([[1, 2], [2, 3], [3, 4]]);
  });

  it('refuses what it cannot do, as usage or data errors', async () => {
    const noUmax = await runCli(['design', p('double-well.json'), '--to-well', '2', '--out', p('x.json')]);
    expect(noUmax.code).toBe(2);
    expect(noUmax.err).toMatch(/--umax/);
    const noFrom = await runCli(['design', p('three-well.json'), '--to-well', '3', '--umax', '0.3', '--out', p('y.json')]);
    expect(noFrom.code).toBe(1);
    expect(noFrom.err).toMatch(/fromWell/);
    const badLevel = await runCli(['design', p('double-well.json'), '--to-well', '2', '--level', '0.9', '--umax', '0.2', '--out', p('z.json')]);
    expect(badLevel.code).toBe(1);
    expect(badLevel.err).toMatch(/level.energy: 0.9 is not inside well 2/);
    expect(existsSync(p('z.json'))).toBe(false);
  });
});
