// controller.design through the gate, on the demo pendulum's learned model. Check value: the
// pendulum's turning-point energy V(A) = m g l (1 - cos A) with the demo's m = 0.35 kg,
// l = 0.42 m, g = 9.81 (elementary mechanics); the learned scale is within a few percent of it.
import { describe, expect, it } from 'vitest';
import { callOperation } from '../../src-main/api/gate.ts';
import { operations } from '../../src-main/api/table.ts';
import { createHandlers } from '../../src-main/api/handlers.ts';

describe('controller operations', () => {
  it('designs a level hold at a swing amplitude and stores it', async () => {
    const h = createHandlers();
    const ctx = { signal: new AbortController().signal, progress: () => {} };
    const call = (name: string, args: unknown) => callOperation(operations, h, name, args, ctx) as Promise<any>;
    await call('recordings.demo', { rig: 'pendulum' });
    const learned = await call('energy.learn', { recording: 'larkspur-pendulum' });
    const A = 1.2;
    const r = await call('controller.design', { model: learned.name, mode: 'level-hold', target: { kind: 'amplitude', value: A }, uMax: 0.4, rateHz: 500 });
    const expected = 0.35 * 9.81 * 0.42 * (1 - Math.cos(A));
    expect(r.design.kind).toBe('level-hold');
    expect(Math.abs(r.design.stages[0].target.energy - expected) / expected).toBeLessThan(0.03);
    expect(r.design.law.uMax).toBe(0.4);
    expect(r.design.cautions.length).toBeGreaterThan(3);
    expect(r.project.designs.map((d: { name: string }) => d.name)).toContain(r.name);
    const back = await call('controller.get', { design: r.name });
    expect(back.design.stages[0].target.energy).toBe(r.design.stages[0].target.energy);
    await expect(call('controller.design', { model: learned.name, mode: 'level-hold', target: { kind: 'amplitude' } })).rejects.toThrow('the target amplitude is required');
    // A target far above anything recorded is refused with the reason (issue 4, bad input).
    await expect(call('controller.design', { model: learned.name, mode: 'level-hold', target: { kind: 'energy', value: 500 }, uMax: 0.4 })).rejects.toThrow(/range|record/i);
  }, 120_000);
});
