import { describe, it, expect } from 'vitest';
import { meanSquareInputGain } from '../../../src-main/engine/control/orbit-average.ts';
import type { EnergyFunction } from '../../../src-main/engine/types.ts';
import { expectClose } from './helpers.ts';

const W02 = 9.81 / 0.42; // references.md §5 (l = 0.42 m, g = 9.81)
const w0 = Math.sqrt(W02);
const pendulum: EnergyFunction = {
  coordinate: 'angle', lambda: 0,
  H: (q, v) => 0.5 * v * v + W02 * (1 - Math.cos(q)),
  grad: (q, v, out) => { out[0] = W02 * Math.sin(q); out[1] = v; },
};
const pendulumAccel = (q: number): number => -W02 * Math.sin(q);

/** Trapezoid rule on a smooth periodic integrand over one period: converges exponentially (common practice). */
function periodicTrapezoid(f: (x: number) => number, a: number, period: number, n: number): number {
  let s = 0;
  for (let i = 0; i < n; i++) s += f(a + (i * period) / n);
  return (s * period) / n;
}

describe('meanSquareInputGain (<b^2> over the orbit at H*)', () => {
  it('harmonic oscillator: <v^2> = H* (equipartition of the time-averaged energies; elementary), b = g v', () => {
    const w = 3, g = 2;
    const E: EnergyFunction = {
      coordinate: 'linear', lambda: 0,
      H: (q, v) => 0.5 * v * v + 0.5 * w * w * q * q,
      grad: (q, v, out) => { out[0] = w * w * q; out[1] = v; },
    };
    const r = meanSquareInputGain({ energy: E, accel: (q) => -w * w * q, inputGain: g, level: 5, q0: 0 });
    expect(r.status, r.message).toBe('ok');
    expect(r.kind).toBe('libration');
    expectClose(r.meanB2, g * g * 5, 1e-10, '<b^2>');
    expectClose(r.period, (2 * Math.PI) / w, 1e-10, 'period');
  });

  it('pendulum at amplitude 90 deg: period = T0 * 1.180340599016 (references.md §1) and <v^2> = 4 w0^2 (E - (1-m) K) / K', () => {
    // Substituting sin(q/2) = k sin(phi): <v^2> = 4 w0^2 m J / K(m) with J = int_0^{pi/2} cos^2 / sqrt(1 - m sin^2),
    // m = sin^2(45 deg) = 0.5, K(0.5) = 1.854074677301372 (references.md §1, confirmed); J by the
    // trapezoid rule over its period pi (the integrand is even and pi-periodic).
    const m = 0.5, K = 1.854074677301372;
    const J = 0.5 * periodicTrapezoid((p) => Math.cos(p) ** 2 / Math.sqrt(1 - m * Math.sin(p) ** 2), 0, Math.PI, 64);
    const r = meanSquareInputGain({ energy: pendulum, accel: pendulumAccel, inputGain: 1, level: W02, q0: 0 });
    expect(r.status, r.message).toBe('ok');
    expectClose(r.period / ((2 * Math.PI) / w0), 1.180340599016, 1e-9, 'T/T0 (references.md §1)');
    expectClose(r.meanB2, (4 * W02 * m * J) / K, 1e-9, '<v^2>');
  });

  it('rotating pendulum above the separatrix: <v^2> = (closed integral of v dq) / (closed integral of dq / v)', () => {
    // Independent: both integrals over q in [0, 2 pi) by the periodic trapezoid rule, v = sqrt(2 (H* - V(q))).
    const level = 3 * W02, g = 0.7;
    const vOf = (q: number): number => Math.sqrt(2 * (level - W02 * (1 - Math.cos(q))));
    const num = periodicTrapezoid(vOf, 0, 2 * Math.PI, 256);
    const T = periodicTrapezoid((q) => 1 / vOf(q), 0, 2 * Math.PI, 256);
    const r = meanSquareInputGain({ energy: pendulum, accel: pendulumAccel, inputGain: g, level, q0: 0 });
    expect(r.status, r.message).toBe('ok');
    expect(r.kind).toBe('rotation');
    expectClose(r.period, T, 1e-9, 'period');
    expectClose(r.meanB2, (g * g * num) / T, 1e-9, '<b^2>');
  });

  it('says when the level does not reach q0', () => {
    const r = meanSquareInputGain({ energy: pendulum, accel: pendulumAccel, inputGain: 1, level: 0.1, q0: 1 });
    expect(r.status).toBe('no-orbit');
    expect(r.message).toMatch(/q0 = 1/);
  });

  it('names bad arguments', () => {
    expect(() => meanSquareInputGain({ energy: pendulum, accel: pendulumAccel, inputGain: 0, level: 1, q0: 0 })).toThrow(/inputGain/);
    expect(() => meanSquareInputGain({ energy: pendulum, accel: pendulumAccel, inputGain: 1, level: NaN, q0: 0 })).toThrow(/level/);
    expect(() => meanSquareInputGain({ energy: pendulum, accel: pendulumAccel, inputGain: 1, level: 1, q0: 0 }, { stepsPerPeriod: 3 })).toThrow(/stepsPerPeriod/);
  });
});
