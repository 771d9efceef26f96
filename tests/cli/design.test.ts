// The `design` verb end to end: main([...]) with a captured Io on a small model file written by the test.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, rmSync, writeFileSync, existsSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { main, type Io } from '../../src-main/cli.ts';
import { readDesign } from '../../src-main/design/validate.ts';
import { SAFETY_CAUTIONS } from '../../src-main/safety.ts';
import { GRAV, LEN, duffingModel, pendulumModel } from '../design/models.ts';

let dir = '';
const p = (name: string) => join(dir, name);
const I = 0.5 * LEN * LEN, MGL = 0.5 * GRAV * LEN;

async function runCli(argv: string[]): Promise<{ code: number; out: string; err: string }> {
  const out: string[] = [], err: string[] = [];
  const io: Io = { out: (l) => out.push(l), err: (l) => err.push(l) };
  const code = await main(argv, io);
  return { code, out: out.join('\n'), err: err.join('\n') };
}

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'ergostat-design-'));
  writeFileSync(p('pendulum.json'), JSON.stringify(pendulumModel()));
  writeFileSync(p('duffing.json'), JSON.stringify(duffingModel()));
  writeFileSync(p('broken.json'), '{"format": "ergostat-energy-model", ');
  const bad = pendulumModel() as unknown as Record<string, unknown>;
  bad.coefficients = [0.5];
  writeFileSync(p('bad-coef.json'), JSON.stringify(bad));
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('ergostat design', () => {
  it('writes a level-hold design for a swing amplitude, prints the summary and the safety cautions', async () => {
    const r = await runCli(['design', p('pendulum.json'), '--target-amplitude', String((120 * Math.PI) / 180), '--mass', String(I), '--umax', '0.3', '--out', p('d1.json')]);
    expect(r.code).toBe(0);
    const d = readDesign(JSON.parse(readFileSync(p('d1.json'), 'utf8')), 'd1.json');
    // Elementary mechanics: H* = m g l (1 - cos A).
    expect(d.stages[0].target.energy).toBeCloseTo(MGL * 1.5, 12);
    expect(d.law.uMax).toBe(0.3);
    expect(d.sampleRateHz).toBe(1000);
    expect(r.out).toMatch(/design: level-hold, 1 stage/);
    for (const c of SAFETY_CAUTIONS) expect(r.out).toContain(c);
    expect(r.out).toContain('[ok] u_max vs losses');
  });

  it('takes weights, rate and integral action', async () => {
    const r = await runCli(['design', p('duffing.json'), '--target-energy', '0.1', '--well', '2', '--weights', '40,2', '--rate', '500', '--integral', '--out', p('d2.json')]);
    expect(r.code).toBe(0);
    const d = JSON.parse(readFileSync(p('d2.json'), 'utf8'));
    expect(d.law.Q).toBe(40);
    expect(d.law.R).toBe(2);
    expect(d.sampleRateHz).toBe(500);
    expect(d.law.integral.antiWindup).toBe('conditional');
    expect(d.law.uMax).toBeNull();
  });

  it('warns (exit 0) when u_max cannot overcome the damping at the target', async () => {
    const r = await runCli(['design', p('pendulum.json'), '--target-amplitude', '2', '--mass', String(I), '--umax', '0.001', '--out', p('d3.json')]);
    expect(r.code).toBe(0);
    expect(r.err).toMatch(/warning: u_max vs losses: u_max = 0\.001 N m is too small to overcome the damping/);
    expect(r.out).toContain('[WARNING] u_max vs losses');
  });

  it('refuses an uncalibrated model without --mass (exit 1, the reason given, no file written)', async () => {
    const r = await runCli(['design', p('pendulum.json'), '--at-rest', '--out', p('d4.json')]);
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/refused: the model is not calibrated/);
    expect(existsSync(p('d4.json'))).toBe(false);
  });

  it('refuses a target outside the recorded range (exit 1)', async () => {
    const r = await runCli(['design', p('duffing.json'), '--target-energy', '5', '--out', p('d5.json')]);
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/above what the model knows: it covers 0 \.\. 1\.254 J/); // (1.8^2 - 1)^2 / 4 = 1.2544
  });

  it('reports unreadable and invalid model files as data errors naming the file and field', async () => {
    const missing = await runCli(['design', p('nope.json'), '--at-rest', '--out', p('x.json')]);
    expect(missing.code).toBe(1);
    expect(missing.err).toMatch(/nope\.json: cannot read the energy model \(ENOENT\)/);
    const broken = await runCli(['design', p('broken.json'), '--at-rest', '--out', p('x.json')]);
    expect(broken.code).toBe(1);
    expect(broken.err).toMatch(/broken\.json: not valid JSON/);
    const coef = await runCli(['design', p('bad-coef.json'), '--at-rest', '--mass', '1', '--out', p('x.json')]);
    expect(coef.code).toBe(1);
    expect(coef.err).toMatch(/bad-coef\.json: coefficients: expected 2 numbers/);
  });

  it('dispatches --to-well to the well-hop designer and writes a staged design', async () => {
    const r = await runCli(['design', p('duffing.json'), '--to-well', '2', '--umax', '0.3', '--out', p('hop.json')]);
    expect(r.code, r.err).toBe(0);
    const d = readDesign(JSON.parse(readFileSync(p('hop.json'), 'utf8')), 'hop.json');
    expect(d.kind).toBe('well-hop');
    expect(d.stages.length).toBeGreaterThan(1);
    expect(r.out).toMatch(/design: well-hop/);
  });

  it('rejects bad usage with exit 2', async () => {
    const cases: [string[], RegExp][] = [
      [[p('duffing.json'), '--out', p('x.json')], /give exactly one target/],
      [[p('duffing.json'), '--at-rest', '--target-energy', '1', '--out', p('x.json')], /several were given/],
      [[p('duffing.json'), '--at-rest'], /missing required option --out/],
      [[p('duffing.json'), '--at-rest', '--weights', '1', '--out', p('x.json')], /--weights expects two positive numbers/],
      [[p('duffing.json'), '--at-rest', '--umax', '-1', '--out', p('x.json')], /--umax expects a positive number/],
      [[p('duffing.json'), '--at-rest', '--mass', '1', '--input-gain', '2', '--out', p('x.json')], /--mass or --input-gain, not both/],
      [[p('duffing.json'), '--at-rest', '--margin', '0.2', '--out', p('x.json')], /--margin needs --to-well/],
      [[p('duffing.json'), '--at-rest', '--gain', '3', '--out', p('x.json')], /unknown option --gain/],
      [['--at-rest', '--out', p('x.json')], /expected one model file/],
      [[p('duffing.json'), '--to-well', '2', '--weights', '1,1', '--out', p('x.json')], /--weights is for level-hold designs/],
    ];
    for (const [argv, msg] of cases) {
      const r = await runCli(['design', ...argv]);
      expect(r.code, argv.join(' ')).toBe(2);
      expect(r.err).toMatch(msg);
    }
  });
});
