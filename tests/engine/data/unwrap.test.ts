import { describe, expect, it } from 'vitest';
import { unwrapAngle } from '../../../src-main/engine/data/unwrap.ts';

// Reference: the analytic angle before wrapping; wrapping to [-pi, pi) is w = theta - 2 pi floor((theta + pi) / 2 pi).
const wrap = (x: number): number => x - 2 * Math.PI * Math.floor((x + Math.PI) / (2 * Math.PI));

describe('unwrapAngle', () => {
  it('recovers a rotating angle from its wrapped samples (analytic theta(t) = 3t + 0.5 sin 2t)', () => {
    const n = 1001;
    const theta = Float64Array.from({ length: n }, (_, i) => 3 * (i * 0.01) + 0.5 * Math.sin(2 * i * 0.01));
    const wrapped = theta.map(wrap);
    const copy = wrapped.slice();
    const r = unwrapAngle(wrapped);
    let err = 0;
    for (let i = 0; i < n; i++) err = Math.max(err, Math.abs(r.q[i] - theta[i]));
    expect(err).toBeLessThan(1e-12);
    // Wraps: floor((theta_end + pi) / 2 pi) turns were removed, theta(0) = 0 being inside [-pi, pi).
    expect(r.wraps).toBe(Math.floor((theta[n - 1] + Math.PI) / (2 * Math.PI)));
    expect(wrapped).toEqual(copy); // input untouched
  });

  it('unwraps a backwards rotation and leaves a swing below pi alone', () => {
    const back = Float64Array.from({ length: 500 }, (_, i) => -2.5 * i * 0.02);
    const r = unwrapAngle(back.map(wrap));
    for (let i = 0; i < back.length; i++) expect(Math.abs(r.q[i] - back[i])).toBeLessThan(1e-12);
    const swing = Float64Array.from({ length: 500 }, (_, i) => 3 * Math.cos(i * 0.05));
    const s = unwrapAngle(swing);
    expect(s.wraps).toBe(0);
    expect(s.q).toEqual(swing);
  });

  it('works in place when out is the input array', () => {
    const theta = Float64Array.from({ length: 300 }, (_, i) => 0.1 * i);
    const a = theta.map(wrap);
    const r = unwrapAngle(a, a);
    expect(r.q).toBe(a);
    for (let i = 0; i < theta.length; i++) expect(Math.abs(a[i] - theta[i])).toBeLessThan(1e-12);
  });
});
