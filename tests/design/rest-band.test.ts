// The convergence band for a target at rest: 2 % of H* is no band when H* ~ 0, so the band is
// the energy of a residual swing of 2 % of the way to the nearest barrier, 0.02^2 of the well's
// depth (common practice for "at rest"; the square from a quadratic well bottom, elementary).
import { describe, expect, it } from 'vitest';
import { trialMetrics } from '../../src-main/engine/trial/index.ts';
import { restBandFloor } from '../../src-main/design/run-trial.ts';
import type { ControllerDesign } from '../../src-main/design/types.ts';

function trace(H: (t: number) => number) {
  // A harmonic swing at 1 Hz (v = cos 2 pi t) whose energy follows H(t); 10 s at 1 kHz.
  const n = 10_001;
  const t = new Float64Array(n), q = new Float64Array(n), v = new Float64Array(n), u = new Float64Array(n), h = new Float64Array(n);
  for (let i = 0; i < n; i++) { t[i] = i / 1000; q[i] = Math.sin(2 * Math.PI * t[i]); v[i] = Math.cos(2 * Math.PI * t[i]); h[i] = H(t[i]); }
  return { t, q, v, u, H: h };
}

describe('band for targets at rest', () => {
  it('uses the floor when 2 % of |H*| is smaller, and says so', () => {
    const tr = trace((t) => 1e-4 * Math.exp(-t));
    const plain = trialMetrics(tr, { target: 0 });
    expect(plain.band).toBe(0);
    expect(plain.converged).toBe(false);
    const floored = trialMetrics(tr, { target: 0, bandFloor: 1e-5 });
    expect(floored.band).toBe(1e-5);
    expect(floored.bandBasis).toBe('floor');
    expect(floored.converged).toBe(true);
    // The cycle averages of 1e-4 e^{-t} fall below 1e-5 after t = ln 10 = 2.303 s, give or take a cycle.
    expect(Math.abs(floored.timeToBand! - Math.log(10))).toBeLessThan(1.01);
    // A floor below 2 % of H* changes nothing.
    expect(trialMetrics(tr, { target: 1, bandFloor: 1e-3 }).bandBasis).toBe('relative');
  });
  it('is 0.02^2 of the depth of the target well', () => {
    const design = {
      model: {
        wells: [{ index: 1, q: -1, energy: 0 }, { index: 2, q: 1, energy: 0.1 }],
        barriers: [{ q: 0, energy: 0.25, between: [1, 2] }],
      },
    } as unknown as ControllerDesign;
    expect(restBandFloor(design, { kind: 'at-rest', energy: 0.1, well: 2 })).toBeCloseTo(0.0004 * 0.15, 15);
    expect(restBandFloor(design, { kind: 'at-rest', energy: 0, well: 1 })).toBeCloseTo(0.0004 * 0.25, 15);
    expect(restBandFloor(design, { kind: 'energy', energy: 0.2 })).toBeUndefined();
  });
});
