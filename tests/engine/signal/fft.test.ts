import { describe, it, expect } from 'vitest';
import { fftInPlace } from '../../../src-main/engine/signal/fft.ts';
import { Pcg32 } from '../../../src-main/engine/signal/random.ts';
import { expectClose } from './helpers.ts';

describe('fftInPlace', () => {
  it('equals the direct discrete Fourier sum', () => {
    // Independent computation: X_k = sum_n x_n exp(-2 pi i k n / N) evaluated term by term.
    const rng = new Pcg32(11);
    for (const N of [1, 2, 8, 64, 256]) {
      const re = rng.normals(N), im = rng.normals(N);
      const r0 = Float64Array.from(re), i0 = Float64Array.from(im);
      fftInPlace(re, im);
      for (let k = 0; k < N; k++) {
        let sr = 0, si = 0;
        for (let n = 0; n < N; n++) {
          const a = (-2 * Math.PI * k * n) / N;
          sr += r0[n] * Math.cos(a) - i0[n] * Math.sin(a);
          si += r0[n] * Math.sin(a) + i0[n] * Math.cos(a);
        }
        expectClose(re[k], sr, 1e-11, `N=${N} re[${k}]`);
        expectClose(im[k], si, 1e-11, `N=${N} im[${k}]`);
      }
    }
  });

  it('rejects lengths that are not a power of two', () => {
    expect(() => fftInPlace(new Float64Array(6), new Float64Array(6))).toThrow(/power of two, got 6/);
    expect(() => fftInPlace(new Float64Array(8), new Float64Array(4))).toThrow(/lengths differ/);
  });
});
