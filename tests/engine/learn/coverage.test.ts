import { describe, expect, it } from 'vitest';
import { percentileSorted, recordedCoverage } from '../../../src-main/engine/learn/coverage.ts';

/** States of the unit harmonic oscillator q = A cos t, v = -A sin t, on which H = (q^2 + v^2)/2 = A^2/2 exactly. */
function circle(A: number, n: number, dt = 0.01) {
  const q = new Float64Array(n), v = new Float64Array(n);
  for (let i = 0; i < n; i++) { q[i] = A * Math.cos(i * dt); v[i] = -A * Math.sin(i * dt); }
  return { q, v };
}
const H = (q: number, v: number) => (q * q + v * v) / 2;

describe('percentileSorted', () => {
  it('interpolates between order statistics (Hyndman & Fan 1996, definition 7)', () => {
    // On 1, 2, ..., 101 definition 7 puts the p-th percentile at 1 + p exactly: h = (n - 1) p / 100 = p.
    const x = Float64Array.from({ length: 101 }, (_, i) => i + 1);
    for (const p of [0, 0.5, 37.25, 99.5, 100]) expect(percentileSorted(x, p)).toBeCloseTo(1 + p, 12);
    // Two points: the median is their mean (definition 7, by hand).
    expect(percentileSorted(Float64Array.from([2, 5]), 50)).toBe(3.5);
    expect(percentileSorted(new Float64Array(0), 50)).toBeNaN();
  });
});

describe('recordedCoverage', () => {
  it('gives the energy, position and speed extremes of conservative orbits (H = A^2/2 on each)', () => {
    // Two runs of the unit oscillator, amplitudes 1 and 2, over several periods: H = A^2/2 on each
    // run (elementary mechanics), so the range is 0.5 .. 2; q reaches +-A and |v| reaches A.
    const runs = [circle(1, 2000), circle(2, 2000)];
    const c = recordedCoverage(runs, H, { periodic: false, trim: 0, lo: 0, hi: 100, joulesPerModelUnit: 1 })!;
    expect(c.energyMin).toBeCloseTo(0.5, 12);
    expect(c.energyMax).toBeCloseTo(2, 12);
    expect(c.qMin).toBeCloseTo(-2, 4);
    expect(c.qMax).toBeCloseTo(2, 12);
    expect(c.vMaxAbs).toBeCloseTo(2, 4);
    expect(c.joulesPerModelUnit).toBe(1);
  });

  it('is not widened by a noise spike, unlike a plain maximum, and leaves its input alone', () => {
    const run = circle(1, 4000);
    run.v[1234] = 50; // one wild velocity sample: H = 1250 there
    const before = Float64Array.from(run.v);
    const robust = recordedCoverage([run], H, { periodic: false, trim: 0, joulesPerModelUnit: 1 })!;
    const plain = recordedCoverage([run], H, { periodic: false, trim: 0, lo: 0, hi: 100, joulesPerModelUnit: 1 })!;
    expect(plain.energyMax).toBeGreaterThan(1000);
    // Every other sample has H = 1/2 exactly: the 99.5th percentile stays there.
    expect(robust.energyMax).toBeCloseTo(0.5, 12);
    expect(robust.vMaxAbs).toBeLessThanOrEqual(1);
    expect(run.v).toEqual(before);
  });

  it('skips the trimmed ends of a run (the off-centre smoothing windows)', () => {
    const run = circle(1, 1000);
    for (let i = 0; i < 10; i++) { run.v[i] = 9; run.v[999 - i] = 9; }
    const c = recordedCoverage([run], H, { periodic: false, trim: 10, lo: 0, hi: 100, joulesPerModelUnit: 1 })!;
    expect(c.energyMax).toBeCloseTo(0.5, 12);
  });

  it('wraps angles to [-pi, pi) before their percentiles', () => {
    // A libration about q = 2 pi (an unwrapped copy of the bottom) reads as one about 0.
    const run = circle(0.5, 3000);
    const shifted = { q: run.q.map((x) => x + 2 * Math.PI), v: run.v };
    const c = recordedCoverage([shifted], (q, v) => v * v / 2 + (1 - Math.cos(q)), { periodic: true, trim: 0, lo: 0, hi: 100, joulesPerModelUnit: 1 })!;
    expect(c.qMin).toBeCloseTo(-0.5, 4);
    expect(c.qMax).toBeCloseTo(0.5, 10);
  });

  it('returns null without samples or with a non-finite energy, and refuses bad percentiles', () => {
    expect(recordedCoverage([], H, { periodic: false, trim: 0, joulesPerModelUnit: 1 })).toBeNull();
    expect(recordedCoverage([circle(1, 100)], () => NaN, { periodic: false, trim: 0, joulesPerModelUnit: 1 })).toBeNull();
    expect(() => recordedCoverage([circle(1, 100)], H, { periodic: false, trim: 0, lo: 60, hi: 40, joulesPerModelUnit: 1 })).toThrow(/lo <= hi/);
  });
});
