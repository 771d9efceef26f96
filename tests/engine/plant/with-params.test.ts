import { describe, expect, it } from 'vitest';
import { builtinPlant, withParams } from '../../../src-main/engine/plant/index.ts';

describe('withParams', () => {
  it('scales the named parameters and keeps the rest, leaving the original plant unchanged', () => {
    const p = builtinPlant('pendulum', { l: 0.5, g: 9.81, c: 0 });
    const q = withParams(p, { l: 1.1, m: 0.9 });
    expect(q.params).toEqual({ m: 0.45, l: 0.55, g: 9.81, c: 0 });
    expect(p.params.l).toBe(0.5);
    // Hand check: q'' = -(g/l) sin q at the scaled length.
    expect(q.accel(0.4, 0, 0, 0)).toBeCloseTo(-(9.81 / 0.55) * Math.sin(0.4), 13);
    expect(p.accel(0.4, 0, 0, 0)).toBeCloseTo(-(9.81 / 0.5) * Math.sin(0.4), 13);
    expect(q.energy!(0, 0)).toBeCloseTo(-0.45 * 9.81 * 0.55, 13);
  });

  it('rejects unknown parameters and bad factors, naming them', () => {
    const p = builtinPlant('duffing');
    expect(() => withParams(p, { k: 2 })).toThrow('scale.k: no such parameter; expected one of m, a, b, c');
    expect(() => withParams(p, { a: NaN })).toThrow('scale.a: expected a finite number, got NaN');
    expect(() => withParams(p, null as unknown as Record<string, number>)).toThrow('scale: expected an object of parameter name: factor');
  });
});
