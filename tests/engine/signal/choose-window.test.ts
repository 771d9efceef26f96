import { describe, it, expect } from 'vitest';
import { chooseSavgol } from '../../../src-main/engine/signal/choose-window.ts';
import { estimateNoise } from '../../../src-main/engine/signal/noise.ts';
import { savgolCoefficients } from '../../../src-main/engine/signal/savgol.ts';
import { Pcg32 } from '../../../src-main/engine/signal/random.ts';
import { addNoise, sample } from './helpers.ts';

interface Case { fs: number; f: number; sigma: number; n: number }

const EDGE = 60; // compare on the same interior for every window (all m <= 60 below)

/** Interior RMS error of the centred Savitzky–Golay velocity against the analytic one. */
function velocityError(x: Float64Array, v: Float64Array, dt: number, m: number, p: number): number {
  const w = savgolCoefficients(m, p, 1); // checked against the published tables in savgol.test.ts
  let s = 0;
  for (let i = EDGE; i < x.length - EDGE; i++) {
    let d = 0;
    for (let j = -m; j <= m; j++) d += w[m + j] * x[i + j];
    s += (d / dt - v[i]) ** 2;
  }
  return Math.sqrt(s / (x.length - 2 * EDGE));
}

describe('chooseSavgol', () => {
  it('picks a window whose velocity error is within 1.3x of the best on a brute-force grid', () => {
    // Independent check: the exact velocity of x = sin(wt) + 0.3 sin(3wt + 1) (elementary
    // calculus) against every order 2, 4, 6 and half window 1..60, searched exhaustively (odd
    // orders repeat the centred velocity weights of the even order above them).
    const cases: Case[] = [
      { fs: 200, f: 1, sigma: 0.01, n: 3000 },
      { fs: 100, f: 2, sigma: 0.05, n: 3000 },
      { fs: 500, f: 1.3, sigma: 1e-4, n: 3000 },
    ];
    for (const { fs, f, sigma, n } of cases) {
      const dt = 1 / fs, w = 2 * Math.PI * f;
      const x = addNoise(sample(n, dt, (t) => Math.sin(w * t) + 0.3 * Math.sin(3 * w * t + 1)), sigma, 17);
      const v = sample(n, dt, (t) => w * Math.cos(w * t) + 0.9 * w * Math.cos(3 * w * t + 1));
      const choice = chooseSavgol(x, dt);
      let best = Infinity;
      for (const p of [2, 4, 6]) for (let m = Math.ceil(p / 2); m <= EDGE; m++) best = Math.min(best, velocityError(x, v, dt, m, p));
      const chosen = velocityError(x, v, dt, choice.halfWindow, choice.order);
      expect(chosen, `fs ${fs}, sigma ${sigma}: chosen m=${choice.halfWindow} p=${choice.order}`).toBeLessThan(1.3 * best);
      // The rule's own error estimate is close to the error actually made (within 25 %).
      expect(Math.abs(choice.velocityRmsError / chosen - 1)).toBeLessThan(0.25);
    }
  });

  it('honours a fixed order or half window and names its reason', () => {
    const dt = 0.005;
    const x = addNoise(sample(2000, dt, (t) => Math.sin(2 * Math.PI * t)), 0.01, 3);
    const noise = estimateNoise(x, dt);
    const fixedOrder = chooseSavgol(x, dt, noise, { order: 3 });
    expect(fixedOrder.order).toBe(3);
    expect(fixedOrder.reason).toMatch(/^order given, half window chosen/);
    const fixedWindow = chooseSavgol(x, dt, noise, { halfWindow: 9 });
    expect(fixedWindow.halfWindow).toBe(9);
    expect(fixedWindow.reason).toMatch(/^half window given, order chosen/);
    const both = chooseSavgol(x, dt, noise, { halfWindow: 9, order: 2 });
    expect([both.halfWindow, both.order]).toEqual([9, 2]);
    expect(both.reason).toMatch(/^given by the caller/);
    expect(() => chooseSavgol(x, dt, noise, { halfWindow: 1, order: 4 })).toThrow(/window 2\*halfWindow\+1 = 3 must exceed order 4/);
    expect(() => chooseSavgol(x, dt, noise, { halfWindow: 5000 })).toThrow(/override.halfWindow must be an integer in \[1, 999\]/);
    expect(() => chooseSavgol(x.subarray(0, 20), dt)).toThrow(/at least 64 samples/);
  });

  it('takes the widest window when no oscillation stands above the noise', () => {
    // Pure white noise: any window's bias is zero, and the noise gain falls as the window grows.
    const x = new Pcg32(8).normals(4000, 0.1);
    const c = chooseSavgol(x, 0.01);
    expect(c.halfWindow).toBe(999);
    expect(c.order).toBe(2);
    expect(c.reason).toMatch(/no oscillation stands above the noise floor/);
  });
});
