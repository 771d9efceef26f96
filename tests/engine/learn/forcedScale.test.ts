import { describe, it, expect } from 'vitest';
import { learnEnergy } from '../../../src-main/engine/learn/index.ts';
import { simulate } from './simulate.ts';

describe('forced-run calibration', () => {
  it('estimates the mass within 3% from a forced run and expresses H in joules', () => {
    // m q'' = a q - b q^3 - c q' + u with m = 2.5 kg: the input gain is g = 1/m (design.md §2,
    // "Scale, offset, sign"); the Duffing energy per unit mass is v^2/2 - a q^2/(2m) + b q^4/(4m).
    const mass = 2.5, a = 5, b = 1.25, c = 0.05;
    const inits: [number, number][] = [[2.5, 0], [-1.2, 0.5], [0.2, 2.2], [3, 0], [-2.8, 0.3], [1.6, 0], [2, 0], [-2, 0]];
    const forced = new Set([6, 7]);
    const sim = simulate({
      accel: (q, v) => (a * q - b * q ** 3 - c * v) / mass, inits, dt: 0.01, seconds: 25, noise: 0.002, bits: 14, seed: 21,
      gain: 1 / mass,
      input: (t, k) => (forced.has(k) ? 1.5 * Math.sin(1.3 * t) + 0.8 * Math.sin(2.9 * t + k) : 0),
    });
    const m = learnEnergy(sim.recording);
    expect(m.status).toBe('ok');
    expect(m.metrics.forcedRuns).toBe(2);
    expect(m.scale.massSource).toBe('forced-run');
    expect(Math.abs(m.scale.mass! - mass) / mass).toBeLessThan(0.03);
    expect(m.units).toBe('J');
    // In joules the barrier is a^2/(4b) = 5 J above the wells (references.md "Duffing double well", scaled by m).
    const L = m.landscape!;
    expect(Math.abs(L.barriers[0].V - L.wells[0].V - (a * a) / (4 * b)) / 5).toBeLessThan(0.03);
  });

  it('uses a given mass for the scale (v^2 coefficient m/2)', () => {
    // Pendulum, unit length: H = m v^2/2 - m (g/l) cos q with m = 0.7 (elementary mechanics).
    const w2 = 9.81 / 0.42;
    const sim = simulate({ accel: (q, v) => -w2 * Math.sin(q) - 0.05 * v, inits: [[0.3, 0], [0.9, 0], [-1.4, 0], [2.2, 0]], dt: 0.005, seconds: 10, noise: 0.002, bits: 14, seed: 2, angle: true });
    const m = learnEnergy(sim.recording, { mass: 0.7 });
    expect(m.status).toBe('ok');
    const j = m.library.terms.findIndex((t) => t.kind === 'mono' && t.a === 0 && t.b === 2);
    expect(m.coefficients[j]).toBeCloseTo(0.35, 10);
    expect(m.units).toBe('J');
    expect(Math.abs(m.landscape!.barriers[0].V - 2 * 0.7 * w2) / (2 * 0.7 * w2)).toBeLessThan(0.01);
  });
});
