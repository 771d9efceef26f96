import { describe, it, expect } from 'vitest';
import { findLandscape } from '../../../src-main/engine/learn/landscape.ts';

describe('findLandscape', () => {
  it('finds the Duffing wells at +-sqrt(a/b) and the barrier a^2/(4b) above them', () => {
    // V = -a q^2/2 + b q^4/4 (references.md "Duffing double well"), a = 3, b = 0.7.
    const a = 3, b = 0.7;
    const L = findLandscape((q) => -a * q * q / 2 + b * q ** 4 / 4, -3, 3, false);
    expect(L.wells.map((w) => w.index)).toEqual([1, 2]);
    expect(L.wells[0].q).toBeCloseTo(-Math.sqrt(a / b), 6);
    expect(L.wells[1].q).toBeCloseTo(Math.sqrt(a / b), 6);
    expect(L.barriers).toHaveLength(1);
    expect(L.barriers[0].q).toBeCloseTo(0, 6);
    expect(L.barriers[0].V - L.wells[0].V).toBeCloseTo(a * a / (4 * b), 9);
    expect(L.barriers[0].between).toEqual([1, 2]);
  });

  it('wraps around for angles: the pendulum has one well and its barrier at the top', () => {
    // V = -cos q (elementary mechanics): well at 0, barrier at +-pi, height 2.
    const L = findLandscape((q) => -Math.cos(q), -Math.PI, Math.PI, true);
    expect(L.wells).toHaveLength(1);
    expect(L.wells[0].q).toBeCloseTo(0, 6);
    expect(Math.abs(L.barriers[0].q)).toBeCloseTo(Math.PI, 6);
    expect(L.barriers[0].V - L.wells[0].V).toBeCloseTo(2, 9);
  });
});
