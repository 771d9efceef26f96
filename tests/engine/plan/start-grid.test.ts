import { describe, expect, it } from 'vitest';
import { startGrid, wellBounds } from '../../../src-main/engine/plan/index.ts';
import { doubleWellModel } from './fixtures.ts';

// H = (q^2 - 1)^2 / 4 + v^2 / 2: at level E the left well's turning points are
// q = -sqrt(1 +- 2 sqrt(E)) and the bottom speed sqrt(2 E) (algebra).
const H = (q: number, v: number) => (q * q - 1) ** 2 / 4 + v * v / 2;

describe('startGrid', () => {
  it('puts four states on each level: both turning points and the bottom either way', () => {
    const w = wellBounds(doubleWellModel().landscape!, 1);
    const grid = startGrid(w, H, [0.2, 0.6]);
    expect(grid).toHaveLength(8);
    for (const [k, f] of [0.2, 0.6].entries()) {
      const E = f * 0.25;
      const s = grid.slice(4 * k, 4 * k + 4);
      expect(s[0].q).toBeCloseTo(-Math.sqrt(1 + 2 * Math.sqrt(E)), 9);
      expect(s[1].q).toBeCloseTo(-Math.sqrt(1 - 2 * Math.sqrt(E)), 9);
      expect(s[2].v).toBeCloseTo(Math.sqrt(2 * E), 9);
      expect(s[3].v).toBeCloseTo(-Math.sqrt(2 * E), 9);
      for (const x of s) expect(H(x.q, x.v)).toBeCloseTo(E, 9);
    }
  });

  it('refuses levels outside (0, 1)', () => {
    const w = wellBounds(doubleWellModel().landscape!, 1);
    expect(() => startGrid(w, H, [0, 0.5])).toThrow(/levels: expected fractions in \(0, 1\), got 0/);
  });
});
