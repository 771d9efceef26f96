import { describe, expect, it } from 'vitest';
import { checkLandscape, insideBasin, wellAt, wellBounds } from '../../../src-main/engine/plan/index.ts';
import { doubleWellModel, pendulumModel } from './fixtures.ts';

// Double well H = v^2/2 - q^2/2 + q^4/4 + 1/4: wells at q = +-1 with V = 0, saddle at 0 with V = 1/4
// (references.md, "Duffing double well": wells +-sqrt(a/b), barrier a^2/(4b) above the wells).
const dw = doubleWellModel().landscape!;
// Pendulum: one well at 0, the top at +-pi with V = 2 m g l (elementary mechanics).
const MGL = 0.5 * 9.81 * 0.42;
const pend = pendulumModel().landscape!;

describe('wellBounds', () => {
  it('bounds the double well wells by the saddle, with an open outer side', () => {
    const left = wellBounds(dw, 1), right = wellBounds(dw, 2);
    expect(left.q).toBeCloseTo(-1, 8);
    expect(left.left).toBeNull();
    expect(left.right!.q).toBeCloseTo(0, 6);
    expect(left.rim).toBeCloseTo(0.25, 10);
    expect(right.left!.q).toBeCloseTo(0, 6);
    expect(right.right).toBeNull();
    expect(right.V).toBeCloseTo(0, 10);
  });

  it('places the pendulum top on both sides of the well, in the copy asked for', () => {
    const b = wellBounds(pend, 1);
    expect(b.left!.q).toBeCloseTo(-Math.PI, 6);
    expect(b.right!.q).toBeCloseTo(Math.PI, 6);
    expect(b.rim).toBeCloseTo(2 * MGL, 8);
    const c = wellBounds(pend, 1, 4 * Math.PI + 0.3); // two turns up
    expect(c.q).toBeCloseTo(4 * Math.PI, 6);
    expect(c.left!.q).toBeCloseTo(3 * Math.PI, 6);
    expect(c.right!.q).toBeCloseTo(5 * Math.PI, 6);
  });

  it('finds the well whose basin holds a position', () => {
    expect(wellAt(dw, -0.4)).toBe(1);
    expect(wellAt(dw, 0.4)).toBe(2);
    expect(wellAt(dw, 7)).toBe(2);
    expect(wellAt(pend, 13)).toBe(1);
    expect(insideBasin(wellBounds(dw, 2), 0.01)).toBe(true);
    expect(insideBasin(wellBounds(dw, 2), -0.01)).toBe(false);
  });

  it('refuses a bad well number or landscape, naming it', () => {
    expect(() => wellBounds(dw, 3)).toThrow(/well: expected a well number 1..2, got 3/);
    expect(() => checkLandscape({ ...dw, wells: [dw.wells[1], dw.wells[0]] })).toThrow(/landscape.wells\[0\].index/);
    expect(() => checkLandscape({ ...dw, barriers: [{ q: 0, V: 1, between: [1, 5] }] })).toThrow(/landscape.barriers\[0\].between/);
  });
});
