import { describe, it, expect } from 'vitest';
import { levelHoldController } from '../../../src-main/engine/trial/level-hold-adapter.ts';
import { energyPump } from '../../../src-main/engine/trial/energy-pump.ts';
import { simulate } from '../../../src-main/engine/trial/simulate.ts';
import type { EnergyFunction } from '../../../src-main/engine/types.ts';
import type { TrialPlant } from '../../../src-main/engine/trial/types.ts';

// Pendulum with m l^2 = 1, g/l = 9: H = v^2/2 + 9 (1 - cos q), b = v.
const H: EnergyFunction = { coordinate: 'angle', lambda: 0, H: (q, v) => 0.5 * v * v + 9 * (1 - Math.cos(q)), grad: (q, v, o) => { o[0] = 9 * Math.sin(q); o[1] = v; } };
const plant: TrialPlant = { coordinate: 'angle', accel: (q, v, u) => -9 * Math.sin(q) - 0.02 * v + u };

describe('levelHoldController', () => {
  it('with lambda = 0 drives the same closed-loop trajectory as the energy-pumping law with k = sqrt(Q/R) (issue 4; Astrom & Furuta 2000)', () => {
    const common = { plant, energy: H, q0: 0.2, v0: 0, duration: 10, estimator: { kind: 'ideal' as const } };
    const a = simulate({ ...common, controller: levelHoldController({ energy: H, inputGain: 1, target: 12, Q: 4, R: 1, eps: 0.3, uMax: 2 }) });
    const b = simulate({ ...common, controller: energyPump({ energy: H, target: 12, gain: 2, eps: 0.3, uMax: 2 }) });
    let dq = 0, du = 0;
    for (let k = 0; k < a.trace.t.length; k++) {
      dq = Math.max(dq, Math.abs(a.trace.q[k] - b.trace.q[k]));
      du = Math.max(du, Math.abs(a.trace.u[k] - b.trace.u[k]));
    }
    expect(dq).toBeLessThan(1e-9);
    expect(du).toBeLessThan(1e-9);
    expect(Math.abs(a.trace.H[a.trace.H.length - 1] - 12)).toBeLessThan(0.5);
  });

  it('exposes the law\'s last output and resets its state', () => {
    const c = levelHoldController({ energy: H, inputGain: 1, target: 12, Q: 4, R: 1, uMax: 1, rateMax: 100 });
    const u = c.step(0, 1, 0, 1e-3);
    expect(c.last.u).toBe(u);
    expect(c.last.z).toBeCloseTo(0.5 - 12, 14);
    expect(c.last.b).toBe(1);
    expect(c.law.internal.uPrev).toBe(u);
    c.reset();
    expect(c.law.internal.uPrev).toBe(0);
    expect(() => levelHoldController({ energy: H, inputGain: 1, target: 12, Q: -1, R: 1 })).toThrow(/design\.Q/);
  });
});
