// The `export` verb end to end: main([...]) with a captured Io, files in a temp dir.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { main, type Io } from '../../src-main/cli.ts';
import { SAFETY_CAUTIONS } from '../../src-main/safety.ts';
import { traceToCsv } from '../../src-main/export/csv.ts';
import { pendulumDesign } from '../design/fixtures.ts';

let dir = '';

async function runCli(argv: string[]): Promise<{ code: number; out: string; err: string }> {
  const out: string[] = [], err: string[] = [];
  const io: Io = { out: (l) => out.push(l), err: (l) => err.push(l) };
  const code = await main(argv, io);
  return { code, out: out.join('\n'), err: err.join('\n') };
}

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'ergostat-export-'));
  writeFileSync(join(dir, 'design.json'), JSON.stringify(pendulumDesign(), null, 2));
  const n = 400, t = new Float64Array(n), q = new Float64Array(n), v = new Float64Array(n), u = new Float64Array(n), H = new Float64Array(n);
  for (let i = 0; i < n; i++) { t[i] = i * 0.005; q[i] = 0.5 * Math.cos(5 * t[i]); v[i] = -2.5 * Math.sin(5 * t[i]); u[i] = 0.1 * Math.sin(t[i]); H[i] = 0.4; }
  writeFileSync(join(dir, 'trial.csv'), traceToCsv({ t, q, v, u, H }));
  writeFileSync(join(dir, 'bad-trial.csv'), 't,q,v,u,H\n0,0,0,0,0\n0.1,0,0,oops,0\n');
  const bad = { ...pendulumDesign(), law: { ...pendulumDesign().law, R: 0 } };
  writeFileSync(join(dir, 'bad-design.json'), JSON.stringify(bad));
});

afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('ergostat export', () => {
  it('writes C, report, plots and JSON, lists them, prints the cautions, exits 0', async () => {
    const c = join(dir, 'c'), plots = join(dir, 'plots'), json = join(dir, 'json'), report = join(dir, 'report.html');
    const r = await runCli(['export', join(dir, 'design.json'), '--c', c, '--name', 'pend', '--report', report, '--trial', join(dir, 'trial.csv'), '--plots', plots, '--json', json]);
    expect(r.err).toBe('');
    expect(r.code).toBe(0);
    for (const f of ['pend.h', 'pend.c', 'pend_check.c']) expect(existsSync(join(c, f))).toBe(true);
    for (const f of ['landscape', 'trial1-energy', 'trial1-input', 'trial1-phase']) {
      expect(readFileSync(join(plots, `${f}.svg`), 'utf8')).toMatch(/^<svg /);
      expect(Array.from(readFileSync(join(plots, `${f}.png`)).subarray(0, 4))).toEqual([137, 80, 78, 71]); // PNG signature
    }
    expect(JSON.parse(readFileSync(join(json, 'design.json'), 'utf8'))).toEqual(pendulumDesign());
    expect(readFileSync(report, 'utf8')).toContain('trial.csv');
    expect(r.out).toContain(`wrote ${join(c, 'pend_check.c')}`);
    expect(r.out).toMatch(/C99 controller: 3000 test vectors/);
    for (const caution of SAFETY_CAUTIONS) expect(r.out).toContain(caution);
  });

  it('exit 1 for bad input files, naming the file and the field or line', async () => {
    let r = await runCli(['export', join(dir, 'missing.json'), '--report', join(dir, 'x.html')]);
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/missing\.json: cannot read the design file: ENOENT/);
    r = await runCli(['export', join(dir, 'bad-design.json'), '--report', join(dir, 'x.html')]);
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/bad-design\.json: law\.R: expected a positive number, got 0/);
    r = await runCli(['export', join(dir, 'design.json'), '--report', join(dir, 'x.html'), '--trial', join(dir, 'bad-trial.csv')]);
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/bad-trial\.csv: line 3, column u: expected a number, got "oops"/);
    expect(existsSync(join(dir, 'x.html'))).toBe(false);
  });

  it('exit 2 for usage errors', async () => {
    expect((await runCli(['export', join(dir, 'design.json')])).code).toBe(2); // nothing to write
    const r = await runCli(['export', join(dir, 'design.json'), '--c', join(dir, 'c2'), '--name', 'my-ctl']);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/option --name: NAME: "my-ctl" is not a C identifier/);
    expect((await runCli(['export'])).code).toBe(2);
    expect((await runCli(['export', join(dir, 'design.json'), '--report'])).code).toBe(2);
  });
});
