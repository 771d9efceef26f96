import { describe, expect, it } from 'vitest';
import { estimateQuantization } from '../../../src-main/engine/data/quantization.ts';

// References: signals built on a known grid (k * step, step and level count known by construction).
describe('estimateQuantization', () => {
  it('finds the step, level count and bits of a 7-bit-quantized swing', () => {
    const step = 2 / 127; // 128 levels over [-1, 1]
    const x = Float64Array.from({ length: 5000 }, (_, i) => -1 + step * Math.round((Math.cos(i * 0.01) + 1) / step));
    const r = estimateQuantization(x)!;
    expect(Math.abs(r.step - step) / step).toBeLessThan(1e-9);
    expect(r.levels).toBe(128);
    expect(r.bits).toBeCloseTo(7, 12);
  });

  it('finds the grid even when no two adjacent levels occur (common divisor of the gaps)', () => {
    // values at levels 0, 3, 7, 12, 20 (gaps 3, 4, 5, 8: their common divisor is one level)
    const step = 0.0125;
    const levels = [0, 3, 7, 12, 20];
    const x = Float64Array.from({ length: 400 }, (_, i) => 0.3 + step * levels[i % levels.length]);
    const r = estimateQuantization(x)!;
    expect(Math.abs(r.step - step) / step).toBeLessThan(1e-9);
    expect(r.levels).toBe(21);
  });

  it('finds a fine grid on a long run from its subsample (values printed to 1e-6)', () => {
    const x = Float64Array.from({ length: 300000 }, (_, i) => Number((2 * Math.sin(i * 0.0007)).toFixed(6)));
    const r = estimateQuantization(x)!;
    expect(Math.abs(r.step - 1e-6) / 1e-6).toBeLessThan(1e-6);
    expect(r.levels).toBe(4000001);
  });

  it('finds the grid of calibrated ADC counts (offset + count x gain, computed in floating point)', () => {
    // a 12-bit angle encoder: gain 2 pi / 4096 rad per count, offset 0.0123 rad
    const gain = (2 * Math.PI) / 4096;
    const x = Float64Array.from({ length: 3000 }, (_, i) => 0.0123 + Math.round(200 * Math.sin(i * 0.02)) * gain);
    const r = estimateQuantization(x)!;
    expect(Math.abs(r.step - gain) / gain).toBeLessThan(1e-9);
    expect(r.levels).toBe(401);
  });

  it('reports no grid for unquantized data or a constant channel', () => {
    const x = Float64Array.from({ length: 2000 }, (_, i) => Math.sin(i * 0.37) + 1e-3 * Math.cos(i * 1.3));
    expect(estimateQuantization(x)).toBeUndefined();
    expect(estimateQuantization(new Float64Array(50).fill(1.5))).toBeUndefined();
  });
});
