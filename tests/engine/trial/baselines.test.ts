import { describe, it, expect } from 'vitest';
import { compareWithBaselines } from '../../../src-main/engine/trial/baselines.ts';
import { energyPump } from '../../../src-main/engine/trial/energy-pump.ts';
import { levelHoldController } from '../../../src-main/engine/trial/level-hold-adapter.ts';
import { simulate } from '../../../src-main/engine/trial/simulate.ts';
import { trialMetrics } from '../../../src-main/engine/trial/metrics.ts';
import { Pcg32 } from '../../../src-main/engine/signal/random.ts';
import type { EnergyFunction } from '../../../src-main/engine/types.ts';
import type { TrialPlant } from '../../../src-main/engine/trial/types.ts';

// Pendulum, m l^2 = 1, g/l = 9, damping 0.05; H with V = 0 at the bottom.
const plant: TrialPlant = { coordinate: 'angle', accel: (q, v, u) => -9 * Math.sin(q) - 0.05 * v + u };
const H: EnergyFunction = { coordinate: 'angle', lambda: -0.05, H: (q, v) => 0.5 * v * v + 9 * (1 - Math.cos(q)), grad: (q, v, o) => { o[0] = 9 * Math.sin(q); o[1] = v; } };
const sim = { plant, energy: H, q0: 1, v0: 0, duration: 20, sensor: { bits: 12, noiseStd: 3e-4 } };
const makeRandom = () => { const r = new Pcg32(3, 9); return () => r.uniform(); };

describe('compareWithBaselines', () => {
  it('scores the design, LQR (target at rest), the energy pump and open loop on the same trial', () => {
    const target = 0; // at rest: H* = V(bottom) = 0
    const rows = compareWithBaselines({
      sim, makeRandom, metrics: { target, Q: 1, R: 1 },
      controller: { name: 'level-hold', controller: levelHoldController({ energy: H, inputGain: 1, target, Q: 1, R: 1, eps: 0.1, uMax: 2 }) },
      gain: 1, uMax: 2, eps: 0.1, equilibrium: 0,
    });
    expect(rows.map((r) => r.name)).toEqual(['level-hold', 'lqr', 'energy-pump', 'open-loop']);
    for (const r of rows) expect(r.status).toBe('ok');
    const by = Object.fromEntries(rows.map((r) => [r.name, r.metrics!]));
    // Open loop: no input, no work; the energy decays only by damping, so J is the largest.
    expect(by['open-loop'].peakU).toBe(0);
    expect(by['open-loop'].workAbs).toBe(0);
    expect(by['lqr'].J).toBeLessThan(by['open-loop'].J);
    expect(by['energy-pump'].J).toBeLessThan(by['open-loop'].J);
    // Every controller respects the same limit.
    for (const name of ['level-hold', 'lqr', 'energy-pump']) expect(by[name].peakU).toBeLessThanOrEqual(2);
    // LQR brings the pendulum to rest: final energy far below the start V(1 rad) = 9 (1 - cos 1) = 4.14.
    expect(by['lqr'].finalEnergy).toBeLessThan(0.01);
  });

  it('the energy-pump row equals a direct run with the same settings and noise (independent path)', () => {
    const target = 9 * (1 - Math.cos(2)); // swing of 2 rad
    const rows = compareWithBaselines({ sim, makeRandom, metrics: { target }, gain: 0.5, uMax: 1, eps: 0.1 });
    expect(rows.map((r) => r.name)).toEqual(['energy-pump', 'open-loop']); // not at rest: no LQR row
    const direct = simulate({ ...sim, controller: energyPump({ energy: H, target, gain: 0.5, uMax: 1, eps: 0.1 }), random: makeRandom() });
    const m = trialMetrics(direct.trace, { target });
    expect(rows[0].metrics).toEqual(m);
  });
});
