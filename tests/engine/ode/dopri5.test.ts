import { describe, it, expect } from 'vitest';
import { solveDopri5 } from '../../../src-main/engine/ode/index.ts';
import type { Rhs } from '../../../src-main/engine/types.ts';

// Damped oscillator x'' + 2 z w x' + w^2 x = 0, x(0) = 1, v(0) = 0 (linear; exact solution, elementary):
// x = e^{-z w t} (cos(wd t) + (z w / wd) sin(wd t)), v = -(w^2 / wd) e^{-z w t} sin(wd t), wd = w sqrt(1 - z^2).
const w = 3, z = 0.1, wd = w * Math.sqrt(1 - z * z);
const damped: Rhs = (_t, y, d) => { d[0] = y[1]; d[1] = -2 * z * w * y[1] - w * w * y[0]; };
const exact = (t: number): [number, number] => {
  const e = Math.exp(-z * w * t);
  return [e * (Math.cos(wd * t) + ((z * w) / wd) * Math.sin(wd * t)), -e * ((w * w) / wd) * Math.sin(wd * t)];
};
const maxErr = (ts: ArrayLike<number>, value: (k: number) => [number, number]): number => {
  let m = 0;
  for (let k = 0; k < ts.length; k++) {
    const ex = exact(ts[k]), got = value(k);
    m = Math.max(m, Math.abs(got[0] - ex[0]), Math.abs(got[1] - ex[1]));
  }
  return m;
};
/** Fixed steps of size h: loose tolerances accept every step, hMax = h0 = h pins the size. */
const fixedStep = (h: number) => solveDopri5(damped, [0, 4], [1, 0], { rtol: 1, atol: 1, h0: h, hMax: h, dense: true });

describe('solveDopri5: accuracy', () => {
  it('is fifth order: the global error falls by ~2^5 when the (fixed) step is halved', () => {
    const errs = [0.1, 0.05, 0.025].map((h) => {
      const r = fixedStep(h);
      expect(r.nRejected).toBe(0);
      expect(r.nSteps).toBe(Math.round(4 / h));
      return maxErr(r.t, (k) => [r.y[2 * k], r.y[2 * k + 1]]);
    });
    // Order 5 (Dormand & Prince 1980; HNW §II.5): ratio 32 asymptotically.
    for (let j = 1; j < errs.length; j++) {
      expect(errs[j - 1] / errs[j]).toBeGreaterThan(28);
      expect(errs[j - 1] / errs[j]).toBeLessThan(36);
    }
  });

  it('has a dense output that matches the exact solution between steps, with error falling ~2^5 per halving', () => {
    // Within a step the continuous extension (order 4, local error O(h^5): HNW §II.6) adds an error of the
    // same order as the fifth-order global error, so the error at interior points also scales like h^5;
    // a cubic Hermite interpolant (local O(h^4)) would give ratios near 16.
    const errs = [0.1, 0.05, 0.025].map((h) => {
      const r = fixedStep(h);
      const ts: number[] = [];
      for (let k = 0; k + 1 < r.t.length; k++) for (const th of [0.25, 0.5, 0.8]) ts.push(r.t[k] + th * h);
      return maxErr(ts, (k) => { const s = r.sol!(ts[k]); return [s[0], s[1]]; });
    });
    for (let j = 1; j < errs.length; j++) expect(errs[j - 1] / errs[j]).toBeGreaterThan(28);
    expect(errs[2]).toBeLessThan(1e-8);
  });

  it('meets the tolerance and scales its error with it (tolerance proportionality)', () => {
    const errs = [1e-6, 1e-8, 1e-10].map((tol) => {
      const r = solveDopri5(damped, [0, 4], [1, 0], { rtol: tol, atol: tol, dense: true });
      expect(r.status).toBe('done');
      expect(r.tFinal).toBe(4);
      const grid = maxErr(r.t, (k) => [r.y[2 * k], r.y[2 * k + 1]]);
      const mids: number[] = [];
      for (let k = 0; k + 1 < r.t.length; k++) mids.push(0.5 * (r.t[k] + r.t[k + 1]));
      const dense = maxErr(mids, (k) => { const s = r.sol!(mids[k]); return [s[0], s[1]]; });
      expect(grid).toBeLessThan(10 * tol);
      expect(dense).toBeLessThan(10 * tol);
      return grid;
    });
    // Error per step is controlled to the tolerance (HNW §II.4), so the global error follows it:
    // 100x tighter gives roughly 100x smaller error (a factor of 30 to 300 allowed).
    for (let j = 1; j < errs.length; j++) {
      expect(errs[j - 1] / errs[j]).toBeGreaterThan(30);
      expect(errs[j - 1] / errs[j]).toBeLessThan(300);
    }
  });

  it('rejects fewer steps with the PI controller (beta = 0.04) than with the classic one (beta = 0), at similar cost', () => {
    // HNW §IV.2: the classic controller lets step sizes oscillate, with repeated rejections; a little of the
    // previous error (Gustafsson's PI control) damps that. Measured here (not a published figure): fewer
    // rejections on both pendulum scalings, right-hand-side evaluations within 5% or fewer.
    for (const w2 of [1, 9.81 / 0.42]) {
      const pend: Rhs = (_t, y, d) => { d[0] = y[1]; d[1] = -w2 * Math.sin(y[0]); };
      const run = (beta: number) => solveDopri5(pend, [0, 300], [2, 0], { rtol: 1e-6, atol: 1e-6, beta, saveSteps: false });
      const classic = run(0), pi = run(0.04);
      expect(pi.nRejected).toBeLessThan(classic.nRejected);
      expect(pi.nfev).toBeLessThan(1.05 * classic.nfev);
      // Energy v^2/2 - w2 cos q is conserved by the exact flow (elementary). At rtol = 1e-6 over about 35 to 170
      // periods it drifts by 2e-4 to 2e-3 relative (measured); the PI run must be no worse than 1.2x classic.
      const H = (y: Float64Array): number => 0.5 * y[1] * y[1] - w2 * Math.cos(y[0]);
      const H0 = -w2 * Math.cos(2);
      expect(Math.abs(H(pi.yFinal) - H0)).toBeLessThan(1.2 * Math.abs(H(classic.yFinal) - H0));
      expect(Math.abs(H(classic.yFinal) - H0) / H0).toBeLessThan(3e-3);
    }
  });

  it('integrates backwards in time when tSpan[1] < tSpan[0]', () => {
    const r = solveDopri5(damped, [4, 0], exact(4), { rtol: 1e-10, atol: 1e-12 });
    expect(r.status).toBe('done');
    expect(r.tFinal).toBe(0);
    for (let k = 1; k < r.t.length; k++) expect(r.t[k]).toBeLessThan(r.t[k - 1]);
    expect(Math.abs(r.yFinal[0] - 1)).toBeLessThan(1e-8);
    expect(Math.abs(r.yFinal[1])).toBeLessThan(1e-8);
  });

  it('returns the state exactly at the requested tEval times (forwards and backwards)', () => {
    const tEval = [0, 0.37, 1, 2.5, 3.999, 4];
    const r = solveDopri5(damped, [0, 4], [1, 0], { rtol: 1e-10, atol: 1e-12, tEval });
    expect(Array.from(r.t)).toEqual(tEval);
    expect(maxErr(r.t, (k) => [r.y[2 * k], r.y[2 * k + 1]])).toBeLessThan(1e-9);
    const back = solveDopri5(damped, [4, 0], exact(4), { rtol: 1e-10, atol: 1e-12, tEval: [3, 2, 0.5] });
    expect(Array.from(back.t)).toEqual([3, 2, 0.5]);
    expect(maxErr(back.t, (k) => [back.y[2 * k], back.y[2 * k + 1]])).toBeLessThan(1e-9);
  });
});

describe('solveDopri5: statuses, observer and inputs', () => {
  it('reports max-steps, stopping where it was', () => {
    const r = solveDopri5(damped, [0, 100], [1, 0], { maxSteps: 10 });
    expect(r.status).toBe('max-steps');
    expect(r.nSteps + r.nRejected).toBe(10);
    expect(r.tFinal).toBeLessThan(100);
    expect(r.tFinal).toBe(r.t[r.t.length - 1]);
  });

  it('reports a blow-up (y\' = y^2, singular at t = 1) as step-too-small or non-finite near t = 1', () => {
    // Exact solution y = 1/(1 - t) (elementary).
    const r = solveDopri5((_t, y, d) => { d[0] = y[0] * y[0]; }, [0, 2], [1]);
    expect(['step-too-small', 'non-finite']).toContain(r.status);
    expect(Math.abs(r.tFinal - 1)).toBeLessThan(1e-3);
    expect(r.message).toMatch(/t = /);
  });

  it('reports non-finite when the right-hand side returns NaN', () => {
    const r = solveDopri5((t, y, d) => { d[0] = t < 0.5 ? -y[0] : NaN; }, [0, 1], [1]);
    expect(r.status).toBe('non-finite');
    expect(r.tFinal).toBeLessThanOrEqual(0.5);
    expect(Math.abs(r.yFinal[0] - Math.exp(-r.tFinal))).toBeLessThan(1e-6);
    const r0 = solveDopri5((_t, _y, d) => { d[0] = Infinity; }, [0, 1], [1]);
    expect(r0.status).toBe('non-finite');
    expect(r0.message).toMatch(/initial point/);
  });

  it('calls onStep after every accepted step and stops when it returns false', () => {
    const seen: number[] = [];
    const r = solveDopri5(damped, [0, 4], [1, 0], { onStep: (t, y) => { seen.push(t); expect(y.length).toBe(2); } });
    expect(seen).toEqual(Array.from(r.t.subarray(1)));
    expect(seen.length).toBe(r.nSteps);
    const s = solveDopri5(damped, [0, 4], [1, 0], { onStep: (t) => t < 1 });
    expect(s.status).toBe('stopped');
    expect(s.tFinal).toBeGreaterThanOrEqual(1);
    expect(s.tFinal).toBeLessThan(4);
  });

  it('keeps only the end points with saveSteps: false, and never modifies y0', () => {
    const y0 = [1, 0];
    const r = solveDopri5(damped, [0, 4], y0, { saveSteps: false });
    expect(Array.from(r.t)).toEqual([0, 4]);
    expect(y0).toEqual([1, 0]);
    const f64 = Float64Array.from([1, 0]);
    solveDopri5(damped, [0, 4], f64);
    expect(Array.from(f64)).toEqual([1, 0]);
  });

  it('raises an rtol below 100 eps to 100 eps, with a warning', () => {
    const r = solveDopri5(damped, [0, 0.1], [1, 0], { rtol: 1e-17 });
    expect(r.warnings.join(' ')).toMatch(/rtol\[0\]/);
  });

  it('throws on bad arguments, naming them', () => {
    const f: Rhs = (_t, y, d) => { d[0] = -y[0]; };
    const bad: [() => unknown, RegExp][] = [
      [() => solveDopri5(null as unknown as Rhs, [0, 1], [1]), /rhs must be a function/],
      [() => solveDopri5(f, [0] as unknown as [number, number], [1]), /tSpan must be/],
      [() => solveDopri5(f, [0, NaN], [1]), /tSpan\[1\] must be a finite number/],
      [() => solveDopri5(f, [1, 1], [1]), /tSpan\[1\] must be different/],
      [() => solveDopri5(f, [0, 1], []), /y0 must be a non-empty array/],
      [() => solveDopri5(f, [0, 1], [1, NaN]), /y0\[1\] must be a finite number/],
      [() => solveDopri5(f, [0, 1], [1], { rtol: 0 }), /options.rtol must be a positive/],
      [() => solveDopri5(f, [0, 1], [1], { atol: [1e-6, 1e-6] }), /options.atol must be an array of length 1/],
      [() => solveDopri5(f, [0, 1], [1], { atol: -1 }), /options.atol must be a non-negative/],
      [() => solveDopri5(f, [0, 1], [1], { hMax: 0 }), /options.hMax must be a positive/],
      [() => solveDopri5(f, [0, 1], [1], { maxSteps: 2.5 }), /options.maxSteps must be an integer/],
      [() => solveDopri5(f, [0, 1], [1], { safety: 1.2 }), /options.safety/],
      [() => solveDopri5(f, [0, 1], [1], { beta: 0.5 }), /options.beta must be a number in \[0, 0.2\]/],
      [() => solveDopri5(f, [0, 1], [1], { tEval: [0.5, 2] }), /options.tEval\[1\] must lie in tSpan/],
      [() => solveDopri5(f, [0, 1], [1], { tEval: [0.5, 0.2] }), /options.tEval must be strictly increasing/],
      [() => solveDopri5(f, [1, 0], [1], { tEval: [0.2, 0.5] }), /options.tEval must be strictly decreasing/],
      [() => solveDopri5(f, [0, 1], [1], { events: [{ g: (t) => t, direction: 2 as 1 }] }), /options.events\[0\].direction/],
      [() => solveDopri5(f, [0, 1], [1], { events: [{ g: 3 as unknown as () => number }] }), /options.events\[0\].g must be a function/],
      [() => solveDopri5(f, [0, 1], [1], { events: [{ g: (t) => t, terminal: 0 }] }), /options.events\[0\].terminal/],
      [() => solveDopri5(f, [0, 1], [1], { rTol: 1e-3 } as never), /options.rTol is not an option/],
    ];
    for (const [call, msg] of bad) expect(call).toThrow(msg);
    const r = solveDopri5(f, [0, 1], [1], { dense: true });
    expect(() => r.sol!(1.5)).toThrow(/sol: t must lie in/);
  });
});
