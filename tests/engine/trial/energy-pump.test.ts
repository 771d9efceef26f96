import { describe, it, expect } from 'vitest';
import { energyPump, openLoop } from '../../../src-main/engine/trial/energy-pump.ts';
import { simulate } from '../../../src-main/engine/trial/simulate.ts';
import type { EnergyFunction } from '../../../src-main/engine/types.ts';
import type { TrialPlant } from '../../../src-main/engine/trial/types.ts';

// Unit-mass oscillator H = (v^2 + q^2) / 2: dH/dv = v, b = g v.
const H: EnergyFunction = { coordinate: 'linear', lambda: 0, H: (q, v) => 0.5 * (q * q + v * v), grad: (q, v, o) => { o[0] = q; o[1] = v; } };

describe('energyPump', () => {
  it('computes u = -k sign(b) (H - H*), saturated (Astrom & Furuta 2000; hand values)', () => {
    const c = energyPump({ energy: H, target: 1, gain: 2, uMax: 0.5, inputGain: 3 });
    // (q, v) = (0.5, 0.5): H = 0.25, z = -0.75, b = 1.5 > 0: u = -2 * 1 * (-0.75) = 1.5 -> 0.5.
    expect(c.step(0.5, 0.5, 0, 1e-3)).toBe(0.5);
    // (q, v) = (1, -0.5): H = 0.625, z = -0.375, b < 0: u = -2 * (-1) * (-0.375) = -0.75 -> -0.5.
    expect(c.step(1, -0.5, 0, 1e-3)).toBe(-0.5);
    const u = energyPump({ energy: H, target: 1, gain: 2 });
    expect(u.step(1.2, 0.4, 0, 1e-3)).toBeCloseTo(-2 * (0.5 * (1.44 + 0.16) - 1), 14);
    expect(Math.abs(u.step(1.2, 0, 0, 1e-3))).toBe(0); // b = 0: no authority at a turning point
  });

  it('regularises sign(b) as b / sqrt(b^2 + eps^2) (design.md §2)', () => {
    const c = energyPump({ energy: H, target: 1, gain: 2, eps: 0.1 });
    const b = 0.05, z = 0.5 * (0.25 + 0.0025) - 1;
    expect(c.step(0.5, 0.05, 0, 1e-3)).toBeCloseTo(-2 * (b / Math.hypot(b, 0.1)) * z, 14);
  });

  it('brings an undamped oscillator to H* with the Lyapunov decrease dH/dt = -k|v|(H - H*) (monotone approach)', () => {
    const plant: TrialPlant = { coordinate: 'linear', accel: (q, _v, u) => -q + u };
    const r = simulate({ plant, energy: H, controller: energyPump({ energy: H, target: 2, gain: 1, uMax: 0.3 }), q0: 0.1, v0: 0, duration: 30, estimator: { kind: 'ideal' } });
    let prev = Infinity;
    for (let k = 0; k < r.trace.H.length; k += 10) {
      const z = Math.abs(r.trace.H[k] - 2);
      expect(z).toBeLessThanOrEqual(prev + 1e-9); // V = z^2 / 2 never increases (sampled law: tiny slack)
      prev = z;
    }
    expect(Math.abs(r.trace.H[r.trace.H.length - 1] - 2)).toBeLessThan(1e-3);
  });

  it('integral action removes the steady error that damping leaves with the plain law', () => {
    // Damped oscillator q'' = -q - 0.05 v + u: the plain law settles below H* by about c <v^2> / (k <|v|>).
    const plant: TrialPlant = { coordinate: 'linear', accel: (q, v, u) => -q - 0.05 * v + u };
    const run = (integral: number) => {
      const r = simulate({ plant, energy: H, controller: energyPump({ energy: H, target: 1, gain: 0.5, uMax: 1, integral }), q0: 1.4, v0: 0, duration: 120, estimator: { kind: 'ideal' } });
      const n = r.trace.H.length, rows = Math.round((10 * 2 * Math.PI) / 1e-3); // the last 10 periods (w = 1)
      let s = 0, cnt = 0;
      for (let k = n - rows; k < n; k++) { s += r.trace.H[k]; cnt++; }
      return s / cnt - 1;
    };
    const plain = run(0), withI = run(0.5);
    // Plain: z_ss = c <v^2> / (k <|v|>) = 0.05 * (1) / (0.5 * (2 sqrt2 / pi)) = 0.111 for H = 1 (v amplitude sqrt 2;
    // <v^2> = 1, <|v|> = 2 sqrt(2) / pi: averages of a sinusoid). Steady-state balance, hand computation.
    expect(plain).toBeCloseTo(-0.05 / (0.5 * (2 * Math.SQRT2 / Math.PI)), 1);
    expect(Math.abs(withI)).toBeLessThan(0.01);
  });

  it('open loop returns 0; bad settings are refused by name', () => {
    expect(openLoop().step(1, 2, 3, 4)).toBe(0);
    expect(() => energyPump({ energy: H, target: NaN, gain: 1 })).toThrow(/target/);
    expect(() => energyPump({ energy: H, target: 1, gain: -1 })).toThrow(/gain/);
    expect(() => energyPump({ energy: H, target: 1, gain: 1, uMax: 0 })).toThrow(/uMax/);
    expect(() => energyPump({ energy: H, target: 1, gain: 1, inputGain: 0 })).toThrow(/inputGain/);
    expect(() => energyPump({ energy: H, target: 1, gain: 1, integral: -2 })).toThrow(/integral/);
  });
});
