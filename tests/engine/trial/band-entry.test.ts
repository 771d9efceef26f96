import { describe, it, expect } from 'vitest';
import { timeToBand } from '../../../src-main/engine/trial/band-entry.ts';

describe('timeToBand', () => {
  it('finds tau ln 50 for the exponential approach y = H* (1 - e^{-t/tau}) into a +-2% band', () => {
    // |y - H*| = H* e^{-t/tau} = 0.02 H*  <=>  t = tau ln(1/0.02) = tau ln 50 (elementary algebra).
    const tau = 1.7, Hs = 3, n = 20001, dt = 0.001;
    const t = new Float64Array(n), y = new Float64Array(n);
    for (let i = 0; i < n; i++) { t[i] = i * dt; y[i] = Hs * (1 - Math.exp(-t[i] / tau)); }
    const te = timeToBand(t, y, Hs, 0.02 * Hs)!;
    // Linear interpolation error ~ curvature * dt^2: far below 1e-6 s here.
    expect(te).toBeCloseTo(tau * Math.log(50), 6);
  });

  it('also from above, and for a decaying oscillation takes the last entry (enter and stay)', () => {
    // y = 1 + e^{-t} cos(2 pi t): |y - 1| <= 0.1 for good after the last time |e^{-t} cos| = 0.1.
    const n = 100001, dt = 1e-4;
    const t = new Float64Array(n), y = new Float64Array(n);
    for (let i = 0; i < n; i++) { t[i] = i * dt; y[i] = 1 + Math.exp(-t[i]) * Math.cos(2 * Math.PI * t[i]); }
    const te = timeToBand(t, y, 1, 0.1)!;
    // Independent computation: brute-force scan backwards for the last sample outside the band.
    let last = -1;
    for (let i = 0; i < n; i++) if (Math.abs(y[i] - 1) > 0.1) last = i;
    expect(te).toBeGreaterThanOrEqual(t[last]);
    expect(te).toBeLessThanOrEqual(t[last + 1]);
    expect(Math.exp(-te) * Math.abs(Math.cos(2 * Math.PI * te))).toBeCloseTo(0.1, 5);
  });

  it('is the first time when the series starts inside and null when it ends outside', () => {
    expect(timeToBand([0, 1, 2], [1, 1.01, 0.99], 1, 0.02)).toBe(0);
    expect(timeToBand([0, 1, 2], [1, 1.01, 1.5], 1, 0.02)).toBeNull();
    expect(timeToBand([], [], 1, 0.02)).toBeNull();
    expect(() => timeToBand([0, 1], [1], 1, 0.1)).toThrow(/one length/);
    expect(() => timeToBand([0], [1], 1, -1)).toThrow(/halfWidth/);
  });
});
