import { describe, expect, it } from 'vitest';
import { buildHopPlan, buildRotationPlan, type Landscape } from '../../../src-main/engine/plan/index.ts';
import { doubleWellModel, pendulumModel } from './fixtures.ts';

// Double well with V = 0 at q = +-1 and the saddle V = 1/4 at 0 (references.md, Duffing double well).
const H = (q: number, v: number) => (q * q - 1) ** 2 / 4 + v * v / 2;
const dw = doubleWellModel().landscape!;
const line: Landscape = {
  qMin: -3, qMax: 3, periodic: false,
  wells: [{ index: 1, q: -2, V: 0 }, { index: 2, q: 0, V: 0.3 }, { index: 3, q: 2, V: 0.1 }],
  barriers: [{ q: -1, V: 1, between: [1, 2] }, { q: 1, V: 0.6, between: [2, 3] }],
};

describe('buildHopPlan', () => {
  it('raises to the barrier plus the margin, switches past it heading in, settles at rest (design.md §2)', () => {
    const p = buildHopPlan(dw, H, { from: 1, to: 2, margin: 0.2, switchFraction: 0.25 });
    expect(p.stages).toHaveLength(2);
    expect(p.stages[0].target.energy).toBeCloseTo(0.25 + 0.2 * 0.25, 9); // barrier + 20% of its height above well 1
    expect(p.transitions).toHaveLength(1);
    const w = p.transitions[0].when;
    expect(w.vSign).toBe(1);
    expect(w.qAbove).toBeCloseTo(0.25, 6); // a quarter of the way from the saddle (0) to the well bottom (1)
    expect(w.qBelow).toBeUndefined();
    expect(p.stages[1].target).toMatchObject({ kind: 'at-rest', well: 2 });
    expect(p.stages[1].target.energy).toBeCloseTo(0, 9);
    expect(p.settleBand).toBeCloseTo(0.02 * 0.25, 9);
    expect(p.entryStages).toEqual([2]);
  });

  it('mirrors the switch for a move toward -q and takes an amplitude target', () => {
    const p = buildHopPlan(dw, H, { from: 2, to: 1, level: { kind: 'amplitude', amplitude: 0.3 } });
    const w = p.transitions[0].when;
    expect(w.vSign).toBe(-1);
    expect(w.qBelow).toBeCloseTo(-0.1, 6);
    expect(p.finalEnergy).toBeCloseTo((0.7 ** 2 - 1) ** 2 / 4, 7); // V(-1 + 0.3); the well bottom is found to ~1e-8
  });

  it('chains a two-hop move: raise, settle, captured in the middle well, raise, settle', () => {
    const Hline = (q: number, v: number) => q * 0 + v * v / 2; // only used for amplitude levels
    const p = buildHopPlan(line, Hline, { from: 1, to: 3, margin: 0.1, captureBand: 0.1 });
    expect(p.stages.map((s) => s.index)).toEqual([1, 2, 3, 4]);
    expect(p.stages[0].target.energy).toBeCloseTo(1 + 0.1 * 1, 12);
    expect(p.stages[2].target.energy).toBeCloseTo(0.6 + 0.1 * (0.6 - 0.3), 12);
    expect(p.transitions.map((t) => [t.from, t.to])).toEqual([[1, 2], [2, 3], [3, 4]]);
    expect(p.transitions[1].when).toEqual({ qAbove: -1, qBelow: 1, energyBelow: 0.6 - 0.1 * (0.6 - 0.3) });
    expect(p.transitions[2].when.qAbove).toBeCloseTo(1.1, 12);
    expect(p.entryStages).toEqual([2, 4]);
  });
});

describe('buildHopPlan on a circle', () => {
  it('states the switches on the wrapped angle, one per side of the target well', () => {
    const circle: Landscape = {
      qMin: -Math.PI, qMax: Math.PI, periodic: true,
      wells: [{ index: 1, q: -1.5, V: 0 }, { index: 2, q: 1.5, V: 0.2 }],
      barriers: [{ q: 0, V: 1, between: [1, 2] }, { q: 3, V: 2, between: [2, 1] }],
    };
    const p = buildHopPlan(circle, H, { from: 1, to: 2, switchFraction: 0.2 });
    expect(p.periodic).toBe(true);
    // +q side: from the barrier at 0, 20% of the way to 1.5; -q side: from the barrier at 3, 20% of the way back to 1.5.
    expect(p.transitions.map((t) => t.when)).toEqual([
      { qAbove: expect.closeTo(0.3, 12), qBelow: expect.closeTo(1.5, 12), vSign: 1, wrapped: true },
      { qAbove: expect.closeTo(1.5, 12), qBelow: expect.closeTo(2.7, 12), vSign: -1, wrapped: true },
    ]);
    const q = buildHopPlan(circle, H, { from: 2, to: 1, direction: 1, switchFraction: 0.2 });
    // Well 1 entered from its left over the barrier at 3 - 2 pi: the interval (3 - 2 pi + 0.3, -1.5), wrapped.
    expect(q.transitions[0].when).toEqual({ qAbove: expect.closeTo(3 - 2 * Math.PI + 0.2 * (-1.5 - (3 - 2 * Math.PI)), 12), qBelow: expect.closeTo(-1.5, 12), vSign: 1, wrapped: true });
  });
});

describe('buildRotationPlan', () => {
  it('holds the rotation energy, then stops after the given turns either way', () => {
    const m = 0.5, l = 0.42, g = 9.81, I = m * l * l;
    const Hp = (q: number, v: number) => (I * v * v) / 2 + m * g * l * (1 - Math.cos(q));
    const p = buildRotationPlan(pendulumModel().landscape!, Hp, { from: 1, speed: 4, turns: 2 });
    expect(p.stages[0].target).toEqual({ kind: 'rotation', speed: 4, energy: Hp(Math.PI, 4) });
    expect(p.transitions.map((t) => t.when)).toEqual([
      { qAbove: expect.closeTo(4 * Math.PI, 6), vSign: 1 },
      { qBelow: expect.closeTo(-4 * Math.PI, 6), vSign: -1 },
    ]);
    expect(p.finalEnergy).toBeCloseTo(0, 9);
    expect(() => buildRotationPlan(pendulumModel().landscape!, Hp, { from: 1, speed: 4, turns: 0.5 })).toThrow(/rotation.turns/);
  });
});
