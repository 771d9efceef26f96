import { describe, it, expect } from 'vitest';
import { estimateNoise, quantizationStep } from '../../../src-main/engine/signal/noise.ts';
import { addNoise, expectClose, sample } from './helpers.ts';

const dt = 0.005;
const swing = (t: number): number => 0.8 * Math.sin(2 * Math.PI * 0.9 * t) + 0.2 * Math.sin(2 * Math.PI * 2.7 * t + 0.5);

describe('estimateNoise', () => {
  it('recovers the standard deviation of Gaussian noise added to a smooth swing', () => {
    // The known sigma is the independent value. A standard deviation of N = 6000 samples has a
    // relative standard error of about 1/sqrt(2N) = 0.9 % for k = 1 (common practice), more for
    // the correlated higher differences; allow 8 %.
    const clean = sample(6000, dt, swing);
    for (const [sigma, seed] of [[1e-3, 1], [1e-2, 2], [5e-2, 3], [1e-4, 4]]) {
      const est = estimateNoise(addNoise(clean, sigma, seed), dt);
      expectClose(est.sigma, sigma, 0.08, `sigma ${sigma}`, 0);
      expect(est.quantStep).toBe(0);
      expect(est.method).toMatch(/robust spread of differences of order \d/);
      expectClose(est.density, est.sigma ** 2 * 2 * dt, 1e-12, 'density');
    }
  });

  it('falls back on the quantization floor step/sqrt(12) for a quantized noise-free sine', () => {
    // Rounding to a step q leaves an error uniform on [-q/2, q/2]: sd q/sqrt(12) (common practice).
    const q = 0.01;
    const x = sample(6000, dt, swing).map((v) => Math.round(v / q) * q);
    const est = estimateNoise(x, dt);
    expectClose(est.quantStep, q, 1e-9, 'step', 0);
    expect(est.sigma).toBeGreaterThanOrEqual(est.quantStep / Math.sqrt(12)); // the floor
    expectClose(est.sigma, q / Math.sqrt(12), 0.15, 'sigma', 0);
  });

  it('reports the Gaussian noise when it dominates the quantization', () => {
    // Independent noise and rounding errors add in variance (elementary): sqrt(s^2 + q^2/12).
    // q = sigma/2 is coarse enough that a plain MAD would sit on the grid and miss by ~10 %.
    for (const [q, sigma] of [[1e-3, 0.01], [5e-4, 1e-3]]) {
      const x = addNoise(sample(6000, dt, swing), sigma, 9).map((v) => Math.round(v / q) * q);
      const est = estimateNoise(x, dt);
      expectClose(est.quantStep, q, 1e-9, 'step', 0);
      expectClose(est.sigma, Math.sqrt(sigma ** 2 + q ** 2 / 12), 0.05, `sigma ${sigma}, step ${q}`, 0);
      expect(est.method).toMatch(/above the quantization floor/);
    }
  });

  it('is not thrown off by a few glitches', () => {
    // 10 single-sample spikes of 50 sigma in 6000 samples would raise a plain standard deviation
    // of the differences about 2-fold; the robust cut keeps the estimate within 8 % of sigma.
    const sigma = 2e-3;
    const x = addNoise(sample(6000, dt, swing), sigma, 12);
    for (let k = 0; k < 10; k++) x[300 + 571 * k] += 50 * sigma * (k % 2 ? 1 : -1);
    expectClose(estimateNoise(x, dt).sigma, sigma, 0.08, 'sigma with glitches', 0);
  });

  it('checks its arguments and leaves x unchanged', () => {
    const x = sample(100, dt, swing);
    const copy = Float64Array.from(x);
    estimateNoise(x, dt);
    expect(x).toEqual(copy);
    expect(() => estimateNoise(x, -1)).toThrow(/dt must be a positive/);
    expect(() => estimateNoise(x.subarray(0, 10), dt)).toThrow(/at least 24 samples, got 10/);
    const bad = Float64Array.from(x); bad[3] = Infinity;
    expect(() => estimateNoise(bad, dt)).toThrow(/x\[3\] is not finite/);
  });
});

describe('quantizationStep', () => {
  it('finds a grid with an offset and unvisited levels, and no grid in continuous data', () => {
    // Every value is 0.37 + k * 0.25 with k in {0, 2, 3, 5}: smallest gap 0.25 (elementary).
    expect(quantizationStep(Float64Array.from([0.37, 0.87, 1.12, 1.62, 0.87, 0.37]))).toBeCloseTo(0.25, 12);
    // Levels 0, 0.5, 0.75 only: smallest gap 0.25 again; levels 0, 0.5, 1.5: gap 0.5.
    expect(quantizationStep(Float64Array.from([0, 0.5, 1.5, 0.5, 0]))).toBeCloseTo(0.5, 12);
    expect(quantizationStep(sample(500, dt, swing))).toBe(0);
  });
});
