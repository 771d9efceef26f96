import { describe, expect, it } from 'vitest';
import { planRoute, type Landscape } from '../../../src-main/engine/plan/index.ts';
import { doubleWellModel } from './fixtures.ts';

// A hand-made three-well line and a two-well circle (positions and energies invented for the test).
const line: Landscape = {
  qMin: -3, qMax: 3, periodic: false,
  wells: [{ index: 1, q: -2, V: 0 }, { index: 2, q: 0, V: 0.3 }, { index: 3, q: 2, V: 0.1 }],
  barriers: [{ q: -1, V: 1, between: [1, 2] }, { q: 1, V: 0.6, between: [2, 3] }],
};
const circle: Landscape = {
  qMin: -Math.PI, qMax: Math.PI, periodic: true,
  wells: [{ index: 1, q: -1.5, V: 0 }, { index: 2, q: 1.5, V: 0.2 }],
  barriers: [{ q: 0, V: 1, between: [1, 2] }, { q: 3, V: 2, between: [2, 1] }],
};

describe('planRoute', () => {
  it('makes one leg per neighbouring pair, crossing the barrier between them', () => {
    const legs = planRoute(line, 1, 3);
    expect(legs.map((l) => [l.from, l.to, l.direction])).toEqual([[1, 2, 1], [2, 3, 1]]);
    expect(legs[0].crossed).toEqual([{ q: -1, V: 1 }]);
    expect(legs[1].highest).toBe(0.6);
    expect(legs[1].target.q).toBe(2);
  });

  it('goes down the line and, directly, over the highest barrier on the way', () => {
    const back = planRoute(line, 3, 1);
    expect(back.map((l) => [l.from, l.to, l.direction])).toEqual([[3, 2, -1], [2, 1, -1]]);
    const direct = planRoute(line, 3, 1, { mode: 'direct' });
    expect(direct).toHaveLength(1);
    expect(direct[0].crossed.map((b) => b.q)).toEqual([1, -1]);
    expect(direct[0].highest).toBe(1);
  });

  it('goes round a circle the way with the lower barrier, unwrapping the target copy', () => {
    const up = planRoute(circle, 1, 2); // equal steps both ways: the barrier at 0 (V = 1) is lower than at 3 (V = 2)
    expect(up[0].direction).toBe(1);
    expect(up[0].target.q).toBeCloseTo(1.5, 12);
    const down = planRoute(circle, 1, 2, { direction: -1 });
    expect(down[0].crossed[0].q).toBeCloseTo(3 - 2 * Math.PI, 12);
    expect(down[0].target.q).toBeCloseTo(1.5 - 2 * Math.PI, 12);
    expect(down[0].target.right!.q).toBeCloseTo(3 - 2 * Math.PI, 12);
  });

  it('works on a learned-shape landscape (double well) and refuses moves it cannot make', () => {
    const dw = doubleWellModel().landscape!;
    expect(planRoute(dw, 2, 1)[0].crossed[0].V).toBeCloseTo(0.25, 10);
    expect(() => planRoute(dw, 1, 1)).toThrow(/already/);
    expect(() => planRoute(dw, 1, 4)).toThrow(/to: expected a well number 1..2, got 4/);
    expect(() => planRoute(dw, 1, 2, { direction: -1 })).toThrow(/direction/);
  });
});
