// trial.run, trial.get and export.write through the gate, on the demo pendulum's learned model
// and a level hold at A = 1.2 rad. Check values: the pendulum energy m g l (1 - cos q) + 1/2 m l^2 v^2
// with the demo's m = 0.35 kg, l = 0.42 m, g = 9.81 (elementary mechanics); the cost
// J = sum (Q z^2 + R u^2) dt recomputed from the stored full trace (left rectangle rule, design.md §2);
// with zero mismatch and no noise every Monte Carlo run is the nominal plant, so its time to band
// equals the nominal run's (an independent path: the worker pool against this thread).
import { describe, expect, it } from 'vitest';
import { existsSync, mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { callOperation } from '../../src-main/api/gate.ts';
import type { CallContext } from '../../src-main/api/define.ts';
import { operations } from '../../src-main/api/table.ts';
import { createHandlers } from '../../src-main/api/handlers.ts';
import { Workspace } from '../../src-main/api/workspace.ts';
import { traceFromCsv } from '../../src-main/export/csv.ts';
import { readDesign } from '../../src-main/design/validate.ts';
import { serializeModel } from '../../src-main/model/index.ts';
import { doubleWellModel } from '../engine/plan/fixtures.ts';

const m = 0.35, l = 0.42, g = 9.81;
const Htrue = (q: number, v: number) => m * g * l * (1 - Math.cos(q)) + 0.5 * m * l * l * v * v;

describe('trial and export operations', () => {
  it('runs a trial with baselines and a Monte Carlo, stores it, reads it back and exports it', async () => {
    const ws = new Workspace();
    const h = createHandlers(ws);
    const ctx: CallContext = { signal: new AbortController().signal, progress: () => {} };
    const call = (name: string, args: unknown, c: CallContext = ctx) => callOperation(operations, h, name, args, c) as Promise<any>;
    await call('recordings.demo', { rig: 'pendulum' });
    const learned = await call('energy.learn', { recording: 'larkspur-pendulum' });
    const d = await call('controller.design', { model: learned.name, mode: 'level-hold', target: { kind: 'amplitude', value: 1.2 }, uMax: 0.4, rateHz: 500 });

    const progress: string[] = [];
    const r = await call('trial.run', { design: d.name, q0: 0.3, v0: 0, duration: 20, runs: 3, mismatch: 0, maxPoints: 1000 },
      { signal: new AbortController().signal, progress: (p) => { progress.push(p.message); } });
    expect(progress.some((p) => /monte carlo: 3 of 3/.test(p))).toBe(true);
    // The trace starts at the given state; the learned H there is the pendulum's energy within 3 %.
    expect(r.trace.q[0]).toBe(0.3);
    expect(Math.abs(r.trace.H[0] - Htrue(0.3, 0)) / Htrue(0.3, 0)).toBeLessThan(0.03);
    expect(r.trace.decimated).toBe(true);
    expect(r.trace.t.length).toBeLessThanOrEqual(1000);
    expect(r.trace.samples).toBe(10_000);
    expect(r.outcome.converged).toBe(true);
    expect(r.outcome.baselines.map((b: { name: string }) => b.name)).toEqual(['energy-pump', 'open-loop']);
    // Open loop never enters the band from 0.3 rad (the target is the swing at 1.2 rad).
    expect(r.outcome.baselines[1].converged).toBe(false);
    expect(r.outcome.baselines[1].metrics.peakU).toBe(0);
    // Monte Carlo: 3 of 3 converged, each with the nominal time to band.
    expect(r.outcome.monteCarlo.convergedCount).toBe(3);
    for (const x of r.monteCarloRuns) expect(x.timeToBand).toBe(r.outcome.metrics.timeToBand);
    expect(r.project.trials.map((t: { name: string }) => t.name)).toContain(r.name);
    expect(r.grid.H.length).toBe(r.grid.q.length * r.grid.v.length);

    // The full trace from the project: J recomputed, and the decimated trace kept its extremes.
    const full = await call('trial.get', { trial: r.name, maxPoints: 200_000 });
    expect(full.trace.decimated).toBe(false);
    const dt = full.trace.t[1] - full.trace.t[0];
    let J = 0;
    for (let k = 0; k < full.trace.t.length; k++) {
      const z = full.trace.H[k] - r.finalTarget;
      J += (d.design.law.Q * z * z + d.design.law.R * full.trace.u[k] ** 2) * dt;
    }
    expect(Math.abs(J - r.outcome.metrics.J) / r.outcome.metrics.J).toBeLessThan(1e-9);
    for (const c of ['u', 'H', 'v'] as const) {
      expect(Math.max(...r.trace[c])).toBe(Math.max(...full.trace[c]));
      expect(Math.min(...r.trace[c])).toBe(Math.min(...full.trace[c]));
    }
    expect(full.outcome).toEqual(r.outcome);

    // Export: refused without the acknowledgement, and into a relative folder.
    const dir = join(mkdtempSync(join(tmpdir(), 'ergostat-export-')), 'out');
    const args = { design: d.name, folder: dir, outputs: { c: { name: 'hold' }, json: true, csv: true, report: true, plots: true }, trials: [r.name] };
    await expect(call('export.write', { ...args, cautionsAcknowledged: false })).rejects.toThrow(/cautions/);
    await expect(call('export.write', args)).rejects.toThrow(/cautionsAcknowledged/);
    await expect(call('export.write', { ...args, folder: 'out', cautionsAcknowledged: true })).rejects.toThrow(/absolute path/);
    await expect(call('export.write', { ...args, trials: ['nope'], cautionsAcknowledged: true })).rejects.toThrow(/trials\[0\]: no trial named "nope"/);
    expect(existsSync(dir)).toBe(false);
    const ex = await call('export.write', { ...args, cautionsAcknowledged: true });
    const names = ex.files.map((f: { path: string }) => f.path.slice(dir.length + 1)).sort();
    for (const f of ['hold.h', 'hold.c', 'hold_check.c', 'design.json', 'model.json', 'report.html', 'plots/landscape.svg', 'plots/landscape.png']) expect(names).toContain(f);
    for (const f of ex.files) expect(existsSync(f.path)).toBe(true);
    // The CSV holds the full stored trace, digit for digit (shortest round-trip numbers).
    const csv = ex.files.find((f: { kind: string }) => f.kind === 'csv');
    const back = traceFromCsv(readFileSync(csv.path, 'utf8'), csv.path);
    expect(Array.from(back.u)).toEqual(full.trace.u);
    expect(readDesign(JSON.parse(readFileSync(join(dir, 'design.json'), 'utf8')), 'design.json').stages[0].target.energy).toBe(d.design.stages[0].target.energy);
    expect(readFileSync(join(dir, 'report.html'), 'utf8')).toMatch(/emergency stop/i);

    // The trial survives a save and a reopen (project file round trip).
    const file = join(dir, 'rig.ergostat');
    await call('project.save', { path: file });
    const h2 = createHandlers();
    await callOperation(operations, h2, 'project.open', { path: file }, ctx);
    const reopened = (await callOperation(operations, h2, 'trial.get', { trial: r.name, maxPoints: 200_000 }, ctx)) as typeof full;
    expect(reopened.trace.u).toEqual(full.trace.u);
    expect(reopened.outcome).toEqual(full.outcome);

    // Cancel stops a long Monte Carlo: the call ends as cancelled and nothing is stored.
    const ac = new AbortController();
    const before = ws.store.trials.size;
    const pending = call('trial.run', { design: d.name, q0: 0.3, v0: 0, duration: 20, runs: 5000, mismatch: 0.1 },
      { signal: ac.signal, progress: (p) => { if (/monte carlo: \d+ of/.test(p.message)) ac.abort(); } });
    await expect(pending).rejects.toThrow(/cancelled/);
    expect(ws.store.trials.size).toBe(before);
  }, 120_000);

  it('runs a well hop: stage switches, the stage column and the final well on the far side of the barrier', async () => {
    // Double-well Duffing H = v^2/2 - q^2/2 + q^4/4 + 1/4 (tests/engine/plan/fixtures.ts): wells at
    // q = -1 and q = +1, the barrier at q = 0 with energy 1/4 (calculus on V).
    const ws = new Workspace();
    ws.store.models.put({ name: 'duffing', kind: 'energy-model', body: { recording: '', model: JSON.parse(serializeModel({ ...doubleWellModel(), formula: '0.5*v^2 - 0.5*q^2 + 0.25*q^4 + 0.25' })) } });
    const h = createHandlers(ws);
    const ctx: CallContext = { signal: new AbortController().signal, progress: () => {} };
    const call = (name: string, args: unknown) => callOperation(operations, h, name, args, ctx) as Promise<any>;
    const d = await call('controller.design', { model: 'duffing', mode: 'well-hop', target: { kind: 'energy', value: 0.1 }, toWell: 2, uMax: 0.2, rateHz: 200, inputGain: 1 });
    expect(d.design.stages.length).toBeGreaterThan(1);
    const r = await call('trial.run', { design: d.name, q0: -1.05, v0: 0, duration: 60, runs: 2, mismatch: 0.05 });
    expect(r.outcome.switches.length).toBeGreaterThan(0);
    expect(r.trace.stage).toBeDefined();
    expect(r.trace.stage[0]).toBe(1);
    expect(r.trace.stage[r.trace.stage.length - 1]).toBe(r.outcome.switches[r.outcome.switches.length - 1].to);
    expect(r.outcome.finalWell).toBe(2);
    // The last tenth of the run stays right of the barrier at q = 0, below its energy 1/4.
    const n = r.trace.q.length;
    for (let k = Math.floor(0.9 * n); k < n; k++) {
      expect(r.trace.q[k]).toBeGreaterThan(0);
      expect(r.trace.H[k]).toBeLessThan(0.25);
    }
    expect(r.outcome.monteCarlo.workers).toBe(0); // staged designs run their Monte Carlo in-thread
    expect(r.monteCarloRuns.length).toBe(2);
  }, 60_000);

  it('refuses bad trial settings naming the argument', async () => {
    const h = createHandlers();
    const ctx = { signal: new AbortController().signal, progress: () => {} };
    const call = (name: string, args: unknown) => callOperation(operations, h, name, args, ctx) as Promise<any>;
    await expect(call('trial.run', { design: 'x', q0: 0, v0: 0, duration: -1 })).rejects.toThrow(/arguments\.duration/);
    await expect(call('trial.run', { design: 'x', q0: 0, v0: 0, duration: 1, estimator: 'kalman' })).rejects.toThrow(/arguments\.estimator/);
    await expect(call('trial.run', { design: 'x', q0: 0, v0: 0, duration: 1 })).rejects.toThrow(/no design named "x"/);
    await expect(call('trial.get', { trial: 'x' })).rejects.toThrow(/no trial named "x"/);
    await expect(call('export.write', { design: 'x', folder: '/tmp/x', outputs: {}, cautionsAcknowledged: true, extra: 1 })).rejects.toThrow(/arguments\.extra/);
  });
});
