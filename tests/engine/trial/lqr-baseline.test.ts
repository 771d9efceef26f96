import { describe, it, expect } from 'vitest';
import { lqrBaseline } from '../../../src-main/engine/trial/lqr-baseline.ts';
import { simulate } from '../../../src-main/engine/trial/simulate.ts';
import type { EnergyFunction } from '../../../src-main/engine/types.ts';
import type { TrialPlant } from '../../../src-main/engine/trial/types.ts';

describe('lqrBaseline', () => {
  it('on q\'\' = u with H = (q^2 + v^2) / 2 solves CARE with A = [[0,1],[0,0]], Q = I, R = 1: K = [1, sqrt 3] (references.md §3, CAREX 2.3 at eps = 1)', () => {
    const plant: TrialPlant = { coordinate: 'linear', accel: (_q, _v, u) => u };
    const H: EnergyFunction = { coordinate: 'linear', lambda: 0, H: (q, v) => 0.5 * (q * q + v * v), grad: (q, v, o) => { o[0] = q; o[1] = v; } };
    const r = lqrBaseline({ model: plant, energy: H, equilibrium: 0 });
    expect(r.status).toBe('ok');
    expect(r.A[0][0]).toBeCloseTo(0, 9); expect(r.A[1][0]).toBeCloseTo(0, 9); expect(r.B[1][0]).toBeCloseTo(1, 9);
    expect(r.Qx[0][0]).toBeCloseTo(1, 6); expect(r.Qx[1][1]).toBeCloseTo(1, 6); expect(r.Qx[0][1]).toBeCloseTo(0, 6);
    expect(r.K![0]).toBeCloseTo(1, 6);
    expect(r.K![1]).toBeCloseTo(Math.sqrt(3), 6);
    expect(r.controller!.step(0.2, -0.1, 0, 1e-3)).toBeCloseTo(-(0.2 - 0.1 * Math.sqrt(3)), 6);
  });

  it('linearises a damped pendulum about the bottom (A = [[0,1],[-g/l,-c]], B = [0; 1/(m l^2)]) and brings it to rest', () => {
    const gl = 23.357142857143, c = 0.1, J = 0.0882; // g/l for l = 0.42 m (references.md §5)
    const plant: TrialPlant = { coordinate: 'angle', accel: (q, v, u) => -gl * Math.sin(q) - c * v + u / J };
    const H: EnergyFunction = { coordinate: 'angle', lambda: -c, H: (q, v) => 0.5 * J * v * v + J * gl * (1 - Math.cos(q)), grad: (q, v, o) => { o[0] = J * gl * Math.sin(q); o[1] = J * v; } };
    const r = lqrBaseline({ model: plant, energy: H, equilibrium: 0, Q: 1, R: 0.01, uMax: 0.5 });
    expect(r.A[1][0]).toBeCloseTo(-gl, 5);
    expect(r.A[1][1]).toBeCloseTo(-c, 6);
    expect(r.B[1][0]).toBeCloseTo(1 / J, 5);
    expect(r.care.relativeResidual).toBeLessThan(1e-10);
    // Closed loop A - B K is stable (eigenvalues from the CARE result).
    for (const re of r.care.closedLoopEigenvalues!.re) expect(re).toBeLessThan(0);
    const sim = simulate({ plant, energy: H, controller: r.controller!, q0: 0.5, v0: 0, duration: 5, estimator: { kind: 'ideal' } });
    expect(Math.abs(sim.final.q)).toBeLessThan(1e-3);
    expect(sim.diagnostics.peakU).toBeLessThanOrEqual(0.5);
  });

  it('reports a failed design (no stabilizing solution) as a status, and refuses bad arguments', () => {
    // B = 0 (no input authority) on an unstable plant: (A, B) not stabilizable.
    const plant: TrialPlant = { coordinate: 'linear', accel: (q) => q };
    const H: EnergyFunction = { coordinate: 'linear', lambda: 0, H: (q, v) => 0.5 * (q * q + v * v), grad: (q, v, o) => { o[0] = q; o[1] = v; } };
    const r = lqrBaseline({ model: plant, energy: H, equilibrium: 0 });
    expect(r.status).toBe('failed');
    expect(r.controller).toBeNull();
    expect(r.message).toMatch(/LQR baseline/);
    expect(() => lqrBaseline({ model: plant, energy: H, equilibrium: NaN })).toThrow(/equilibrium/);
    expect(() => lqrBaseline({ model: plant, energy: H, equilibrium: 0, R: 0 })).toThrow(/Q and R/);
  });
});
