// The energy operations end to end through the gate: demo recording -> learn in a worker thread
// -> model detail and phase-plane grid. The check values are the demo pendulum's own physics
// (elementary mechanics: H = m l^2 v^2/2 - m g l cos q with the demo's m = 0.35 kg, l = 0.42 m).
import { describe, expect, it } from 'vitest';
import { callOperation } from '../../src-main/api/gate.ts';
import { operations } from '../../src-main/api/table.ts';
import { createHandlers } from '../../src-main/api/handlers.ts';

describe('energy operations', () => {
  it('learns the demo pendulum in a worker and serves its views', async () => {
    const h = createHandlers();
    const progress: string[] = [];
    const ctx = { signal: new AbortController().signal, progress: (p: { message: string }) => progress.push(p.message) };
    const call = (name: string, args: unknown) => callOperation(operations, h, name, args, ctx) as Promise<any>;
    const imp = await call('recordings.demo', { rig: 'pendulum' });
    expect(imp.recording.runs.length).toBe(6);
    const learned = await call('energy.learn', { recording: imp.recording.name });
    expect(learned.status).toBe('ok');
    expect(progress.length).toBeGreaterThan(0);
    const detail = await call('energy.get', { model: learned.name });
    const m = detail.model;
    // V(pi) - V(0) = 2 m g l for the pendulum (barrier at the top).
    const mgl = 0.35 * 9.81 * 0.42;
    const barrier = m.landscape.barriers[0];
    expect(Math.abs(barrier.V - 2 * mgl) / (2 * mgl)).toBeLessThan(0.03);
    expect(detail.runs.length).toBe(6);
    expect(detail.potential.q.length).toBeGreaterThan(10);
    const grid = await call('energy.grid', { model: learned.name, qMin: -1, qMax: 1, vMin: -2, vMax: 2, nq: 5, nv: 3 });
    expect(grid.H).toHaveLength(15);
    // H grows with |v| at q = 0 (the model's sign convention).
    expect(grid.H[2 * 5 + 2]).toBeGreaterThan(grid.H[1 * 5 + 2]);
  }, 120_000);

  it('cancels learning', async () => {
    const h = createHandlers();
    const ac = new AbortController();
    const ctx = { signal: ac.signal, progress: () => {} };
    await callOperation(operations, h, 'recordings.demo', { rig: 'strip' }, ctx);
    const pending = callOperation(operations, h, 'energy.learn', { recording: 'tamsin-strip' }, ctx);
    setTimeout(() => ac.abort(), 300);
    await expect(pending).rejects.toThrow('learning cancelled');
  }, 60_000);
});
