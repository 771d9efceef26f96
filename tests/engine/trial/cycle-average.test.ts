import { describe, it, expect } from 'vitest';
import { cycleAverages } from '../../../src-main/engine/trial/cycle-average.ts';

function series(n: number, dt: number, f: (t: number) => [number, number]) {
  const t = new Float64Array(n), v = new Float64Array(n), H = new Float64Array(n);
  for (let i = 0; i < n; i++) { t[i] = i * dt; [v[i], H[i]] = f(t[i]); }
  return { t, v, H };
}

describe('cycleAverages', () => {
  it('averages H over each swing period, windows from one downward zero crossing of v to the next', () => {
    // v = cos(2 pi t / P): downward crossings at t = P/4 + k P. H = 2 + 0.3 sin(4 pi t / P) + 0.1 cos(2 pi t / P)
    // has mean exactly 2 over any full period (integrals of sines over whole periods vanish).
    const P = 1.3, dt = 1e-3;
    const { t, v, H } = series(13001, dt, (s) => [Math.cos((2 * Math.PI * s) / P), 2 + 0.3 * Math.sin((4 * Math.PI * s) / P) + 0.1 * Math.cos((2 * Math.PI * s) / P)]);
    const c = cycleAverages(t, v, H);
    expect(c.mean.length).toBe(9); // crossings at 0.325 + 1.3 k up to 13 s: 10 crossings, 9 full periods
    for (let j = 0; j < c.mean.length; j++) {
      expect(c.mean[j]).toBeCloseTo(2, 3); // sampled mean: error of order dt / P
      expect(c.start[j]).toBeCloseTo(P / 4 + j * P, 2);
      expect(c.end[j] - c.start[j]).toBeCloseTo(P, 2);
    }
  });

  it('closes a window after maxWindow seconds when v does not cross zero (at rest or rotating)', () => {
    const { t, v, H } = series(3001, 0.01, (s) => [1, s]); // v > 0 always: rotating; H = t
    const c = cycleAverages(t, v, H, 10);
    expect(c.mean.length).toBe(3); // [0, 10), [10, 20), [20, 30): the last closes at the last sample, t = 30
    expect(c.mean[0]).toBeCloseTo(4.995, 9); // mean of 0, 0.01, ..., 9.99 (arithmetic series)
    expect(c.mean[1]).toBeCloseTo(14.995, 9);
    expect(c.end[2]).toBeCloseTo(30, 9);
  });

  it('refuses mismatched columns', () => {
    expect(() => cycleAverages([0, 1], [0], [0, 1])).toThrow(/one length/);
    expect(() => cycleAverages([0], [0], [0], 0)).toThrow(/maxWindow/);
  });
});
