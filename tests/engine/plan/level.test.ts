import { describe, expect, it } from 'vitest';
import { resolveLevel, rotationTarget, wellBounds } from '../../../src-main/engine/plan/index.ts';
import { doubleWellModel, pendulumModel } from './fixtures.ts';

// H = (q^2 - 1)^2 / 4 + v^2 / 2 (the double well with V = 0 at the wells; algebra).
const H = (q: number, v: number) => (q * q - 1) ** 2 / 4 + v * v / 2;
const dw = doubleWellModel().landscape!;

describe('resolveLevel', () => {
  it('takes the well bottom for at rest, and V(q_well + A) for an amplitude (design.md §2)', () => {
    const w = wellBounds(dw, 2);
    expect(resolveLevel({ kind: 'at-rest' }, w, H)).toEqual({ kind: 'at-rest', well: 2, energy: w.V });
    const t = resolveLevel({ kind: 'amplitude', amplitude: 0.3 }, w, H);
    expect(t.energy).toBeCloseTo((1.3 ** 2 - 1) ** 2 / 4, 8);
    expect(resolveLevel({ kind: 'energy', energy: 0.1 }, w, H).energy).toBe(0.1);
  });

  it('refuses levels that do not stay in the well, naming the field', () => {
    const w = wellBounds(dw, 2);
    expect(() => resolveLevel({ kind: 'energy', energy: 0.3 }, w, H)).toThrow(/level.energy: 0.3 is not inside well 2/);
    expect(() => resolveLevel({ kind: 'amplitude', amplitude: -1.2 }, w, H)).toThrow(/level.amplitude: the turning point/);
    expect(() => resolveLevel({ kind: 'energy', energy: NaN }, w, H)).toThrow(/level.energy: expected a finite energy/);
  });
});

describe('rotationTarget', () => {
  it('is the energy over the top at the given speed: I w^2/2 + 2 m g l (elementary mechanics)', () => {
    const m = 0.5, l = 0.42, g = 9.81, I = m * l * l;
    const Hp = (q: number, v: number) => (I * v * v) / 2 + m * g * l * (1 - Math.cos(q));
    const t = rotationTarget(pendulumModel().landscape!, 3, Hp);
    expect(t.kind).toBe('rotation');
    expect(t.energy).toBeCloseTo((I * 9) / 2 + 2 * m * g * l, 9);
    expect(() => rotationTarget(pendulumModel().landscape!, -1, Hp)).toThrow(/rotation.speed/);
    expect(() => rotationTarget(dw, 1, H)).toThrow(/not an angle/);
  });
});
