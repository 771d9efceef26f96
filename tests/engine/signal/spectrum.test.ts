import { describe, it, expect } from 'vitest';
import { welchSpectrum } from '../../../src-main/engine/signal/spectrum.ts';
import { Pcg32 } from '../../../src-main/engine/signal/random.ts';
import { expectClose, sample } from './helpers.ts';

describe('welchSpectrum', () => {
  it('puts a sine at its frequency with total power A^2/2 (Parseval)', () => {
    // Mean square of A sin(wt) is A^2/2 (elementary); bins spaced 1/(L dt).
    const dt = 0.01, A = 2, f = 3.125; // on bin 64 of L = 2048: 3.125 = 64 / (2048 * 0.01)
    const sp = welchSpectrum(sample(5000, dt, (t) => A * Math.sin(2 * Math.PI * f * t)), dt);
    expect(sp.segment).toBe(2048);
    let total = 0, kmax = 0;
    for (let k = 1; k < sp.power.length; k++) {
      total += (k === sp.power.length - 1 ? 1 : 2) * sp.power[k];
      if (sp.power[k] > sp.power[kmax]) kmax = k;
    }
    expectClose(kmax * sp.df, f, 1e-12, 'peak frequency');
    expectClose(total, (A * A) / 2, 1e-3, 'total power');
  });

  it('gives white noise the flat level sigma^2 / L in every bin', () => {
    // E|X_k|^2 = sigma^2 sum w^2 for white noise (elementary), hence sigma^2 / L after normalising.
    const sigma = 0.3, x = new Pcg32(5).normals(40000, sigma);
    const sp = welchSpectrum(x, 1e-3, 1024);
    let mean = 0;
    for (let k = 10; k < 500; k++) mean += sp.power[k];
    mean /= 490;
    // 490 bins averaged over ~77 segments: relative standard error well under 2 %.
    expectClose(mean, (sigma * sigma) / sp.segment, 0.03, 'noise floor');
  });
});
