import { describe, it, expect } from 'vitest';
import { targetAtRest, targetFromAmplitude, targetFromEnergy } from '../../../src-main/engine/control/targets.ts';
import type { EnergyFunction } from '../../../src-main/engine/types.ts';

describe('level targets', () => {
  it('an amplitude A means the turning-point energy V(A) = H(A, 0) (design.md §2)', () => {
    // Duffing double well H = v^2/2 - x^2/2 + x^4/4 (a = b = 1; references.md, Duffing section).
    const E: EnergyFunction = { coordinate: 'linear', lambda: 0, H: (q, v) => 0.5 * v * v - 0.5 * q * q + 0.25 * q ** 4, grad: (q, v, o) => { o[0] = -q + q ** 3; o[1] = v; } };
    expect(targetFromAmplitude(1, E)).toEqual({ kind: 'amplitude', energy: -0.25, amplitude: 1 }); // well bottom -a^2/(4b)
    expect(targetFromAmplitude(Math.SQRT2, (q) => -0.5 * q * q + 0.25 * q ** 4).energy).toBeCloseTo(0, 15); // barrier energy 0
    expect(targetFromEnergy(2.5)).toEqual({ kind: 'energy', energy: 2.5 });
    expect(targetAtRest(-0.25)).toEqual({ kind: 'rest', energy: -0.25 });
  });

  it('names bad arguments', () => {
    expect(() => targetFromEnergy(NaN)).toThrow(/E: expected a finite/);
    expect(() => targetFromAmplitude(1, {} as EnergyFunction)).toThrow(/V: expected/);
    expect(() => targetAtRest(Infinity)).toThrow(/wellBottomEnergy/);
  });
});
