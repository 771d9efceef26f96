import { describe, it, expect } from 'vitest';
import { trialMetrics } from '../../../src-main/engine/trial/metrics.ts';
import type { Trace } from '../../../src-main/engine/trial/types.ts';

function trace(n: number, dt: number, f: (t: number, k: number) => { q: number; v: number; u: number; H: number }): Trace {
  const tr: Trace = { t: new Float64Array(n), q: new Float64Array(n), v: new Float64Array(n), u: new Float64Array(n), H: new Float64Array(n) };
  for (let k = 0; k < n; k++) {
    const t = k * dt;
    const r = f(t, k);
    tr.t[k] = t; tr.q[k] = r.q; tr.v[k] = r.v; tr.u[k] = r.u; tr.H[k] = r.H;
  }
  return tr;
}

describe('trialMetrics', () => {
  it('J for a constant u over a known time with H = H*: R u^2 D exactly (rows cover [t_k, t_k + dt))', () => {
    // 1000 rows of 1 ms cover D = 1 s; u = 2, R = 0.5: J = 0.5 * 4 * 1 = 2.
    const tr = trace(1000, 1e-3, () => ({ q: 0, v: 3, u: 2, H: 5 }));
    const m = trialMetrics(tr, { target: 5, Q: 7, R: 0.5 });
    expect(m.J).toBeCloseTo(2, 12);
    expect(m.peakU).toBe(2);
    expect(m.workAbs).toBeCloseTo(6, 12); // |u v| D = 6 W * 1 s
    expect(m.workNet).toBeCloseTo(6, 12);
    expect(m.totalVariation).toBe(0);
  });

  it('J for a constant z: Q z^2 D', () => {
    const tr = trace(500, 2e-3, () => ({ q: 0, v: 0, u: 0, H: 4.5 }));
    expect(trialMetrics(tr, { target: 5, Q: 3, R: 1 }).J).toBeCloseTo(3 * 0.25 * 1, 12);
  });

  it('total variation of a known sequence and work of alternating power', () => {
    const us = [0, 1, -1, 2, 2, -0.5];
    const vs = [1, 1, 1, -1, 1, 2];
    const tr = trace(6, 0.5, (_t, k) => ({ q: 0, v: vs[k], u: us[k], H: 0 }));
    const m = trialMetrics(tr, { target: 0 });
    expect(m.totalVariation).toBeCloseTo(1 + 2 + 3 + 0 + 2.5, 14);
    expect(m.peakU).toBe(2);
    // u v = 0, 1, -1, -2, 2, -1 (hand computation), dt = 0.5.
    expect(m.workNet).toBeCloseTo(0.5 * (0 + 1 - 1 - 2 + 2 - 1), 14);
    expect(m.workAbs).toBeCloseTo(0.5 * (0 + 1 + 1 + 2 + 2 + 1), 14);
  });

  it('swing amplitude, cycle-averaged energy, spread and band entry of a synthetic swing settling exponentially', () => {
    // q = A sin(w t), v = A w cos(w t); H = H* (1 - e^{-t/tau}) + 0.05 H* cos(2 w t) (swings twice per period,
    // mean over a period = H* (1 - e^{-t/tau}) approximately). Amplitude = A (exact extremes of the sine).
    const A = 0.8, w = 2 * Math.PI, Hs = 2, tau = 1;
    const tr = trace(20000, 1e-3, (t) => ({ q: A * Math.sin(w * t), v: A * w * Math.cos(w * t), u: 0, H: Hs * (1 - Math.exp(-t / tau)) + 0.05 * Hs * Math.cos(2 * w * t) }));
    const m = trialMetrics(tr, { target: Hs });
    expect(m.amplitude).toBeCloseTo(A, 5);
    expect(m.qMax).toBeCloseTo(A, 5);
    expect(m.qMin).toBeCloseTo(-A, 5);
    expect(m.converged).toBe(true);
    expect(Math.abs(m.finalRelError)).toBeLessThan(1e-6 + Math.exp(-18.25)); // window mean ~ H*(1 - e^{-t/tau})
    // Spread over the last 3 periods: the 2w ripple's peak to peak, 0.1 H*.
    expect(m.spread).toBeCloseTo(0.1 * Hs, 3);
    expect(m.spreadStd).toBeCloseTo((0.05 * Hs) / Math.SQRT2, 3); // rms of a cosine: amplitude / sqrt 2
    // Windows end at t = 1.25, 2.25, ... (downward crossings of cos); the window ending at t_e averages
    // H over [t_e - 1, t_e]: H* (1 - tau (e^{-(t_e-1)/tau} - e^{-t_e/tau})). It first lies within 2% for
    // t_e with (e - 1) e^{-t_e} <= 0.02: t_e >= ln(50 (e - 1)) = 4.4537; windows end at x.25, so the
    // first inside is 5.25 and the previous (4.25) is outside: entry interpolated between them.
    const mean = (te: number) => 1 - (Math.E - 1) * Math.exp(-te); // window mean / H*
    const expected = 4.25 + (0.98 - mean(4.25)) / (mean(5.25) - mean(4.25));
    expect(m.timeToBand!).toBeGreaterThan(4.25);
    expect(m.timeToBand!).toBeLessThan(5.25);
    expect(m.timeToBand!).toBeCloseTo(expected, 2);
    expect(m.band).toBeCloseTo(0.04, 15);
    expect(m.bandBasis).toBe('relative');
  });

  it('never converges with open loop far from the target', () => {
    const tr = trace(5000, 1e-3, (t) => ({ q: Math.sin(6 * t), v: 6 * Math.cos(6 * t), u: 0, H: 1 }));
    const m = trialMetrics(tr, { target: 2 });
    expect(m.converged).toBe(false);
    expect(m.timeToBand).toBeNull();
    expect(m.finalRelError).toBeCloseTo(-0.5, 3);
  });

  it('uses the sensor energy resolution as the band when it exceeds 2% and says so', () => {
    const H = { coordinate: 'linear' as const, lambda: 0, H: (q: number, v: number) => 0.5 * (q * q + v * v), grad: (q: number, v: number, o: Float64Array) => { o[0] = q; o[1] = v; } };
    const A = 0.1; // H* = A^2 / 2 = 0.005; 2% = 1e-4
    const tr = trace(10000, 1e-3, (t) => ({ q: A * Math.sin(t * 2 * Math.PI), v: A * 2 * Math.PI * Math.cos(t * 2 * Math.PI), u: 0, H: 0.5 * A * A * (1 + 4 * Math.PI ** 2) / 2 }));
    const target = tr.H[0];
    const coarse = trialMetrics(tr, { target, energy: H, sensor: { sigmaQ: 0.01, sigmaV: 0.01 } });
    expect(coarse.resolution).toBeGreaterThan(0.02 * target);
    expect(coarse.bandBasis).toBe('resolution');
    expect(coarse.band).toBe(coarse.resolution);
    const fine = trialMetrics(tr, { target, energy: H, sensor: { sigmaQ: 1e-7, sigmaV: 1e-7 } });
    expect(fine.bandBasis).toBe('relative');
    expect(() => trialMetrics(tr, { target, sensor: { sigmaQ: 1, sigmaV: 1 } })).toThrow(/options\.energy/);
  });

  it('refuses bad input, naming it', () => {
    const tr = trace(10, 1e-3, () => ({ q: 0, v: 0, u: 0, H: 0 }));
    expect(() => trialMetrics(tr, { target: NaN })).toThrow(/target/);
    expect(() => trialMetrics(tr, { target: 1, Q: -1 })).toThrow(/Q, R/);
    expect(() => trialMetrics(trace(1, 1, () => ({ q: 0, v: 0, u: 0, H: 0 })), { target: 1 })).toThrow(/at least 2 rows/);
  });
});
