import { describe, it, expect } from 'vitest';
import { Matrix, pseudoInverse } from 'ml-matrix';
import { savgolCoefficients, savgolFilter } from '../../../src-main/engine/signal/savgol.ts';
import { expectClose, sample } from './helpers.ts';

function expectWeights(w: Float64Array, ints: number[], norm: number, what: string): void {
  expect(w.length).toBe(ints.length);
  for (let j = 0; j < ints.length; j++) expectClose(w[j], ints[j] / norm, 1e-13, `${what}[${j}]`);
}

describe('savgolCoefficients', () => {
  // Convoluting integers of Savitzky & Golay, Anal. Chem. 36 (1964) 1627, Tables I-III (with the
  // corrections of Steinier et al. 1972). Values from memory; each is also checked below against
  // an independent least-squares computation with ml-matrix.
  it('reproduces the published smoothing weights', () => {
    expectWeights(savgolCoefficients(2, 2, 0), [-3, 12, 17, 12, -3], 35, '5-point quadratic');
    expectWeights(savgolCoefficients(3, 2, 0), [-2, 3, 6, 7, 6, 3, -2], 21, '7-point quadratic');
    expectWeights(savgolCoefficients(3, 3, 0), [-2, 3, 6, 7, 6, 3, -2], 21, '7-point cubic (same as quadratic)');
    expectWeights(savgolCoefficients(4, 2, 0), [-21, 14, 39, 54, 59, 54, 39, 14, -21], 231, '9-point quadratic');
    expectWeights(savgolCoefficients(3, 4, 0), [5, -30, 75, 131, 75, -30, 5], 231, '7-point quartic');
    expectWeights(savgolCoefficients(4, 4, 0), [15, -55, 30, 135, 179, 135, 30, -55, 15], 429, '9-point quartic');
  });

  it('reproduces the published first- and second-derivative weights', () => {
    expectWeights(savgolCoefficients(2, 2, 1), [-2, -1, 0, 1, 2], 10, '5-point quadratic d1');
    expectWeights(savgolCoefficients(3, 1, 1), [-3, -2, -1, 0, 1, 2, 3], 28, '7-point linear d1');
    expectWeights(savgolCoefficients(3, 2, 1), [-3, -2, -1, 0, 1, 2, 3], 28, '7-point quadratic d1');
    expectWeights(savgolCoefficients(2, 3, 1), [1, -8, 0, 8, -1], 12, '5-point cubic d1');
    expectWeights(savgolCoefficients(3, 3, 1), [22, -67, -58, 0, 58, 67, -22], 252, '7-point cubic d1');
    expectWeights(savgolCoefficients(3, 4, 1), [22, -67, -58, 0, 58, 67, -22], 252, '7-point quartic d1');
    expectWeights(savgolCoefficients(2, 2, 2), [2, -1, -2, -1, 2], 7, '5-point quadratic d2');
    expectWeights(savgolCoefficients(3, 3, 2), [5, 0, -3, -4, -3, 0, 5], 42, '7-point cubic d2');
  });

  it('agrees with a least-squares fit by ml-matrix at every position in the window', () => {
    // Independent computation: coefficients c = pinv(V) y of the polynomial in u = j - m, then
    // the d-th derivative of sum_k c_k u^k at u = position.
    for (const [m, p] of [[3, 2], [4, 3], [6, 5], [10, 4]]) {
      const n = 2 * m + 1;
      const V = new Matrix(n, p + 1);
      for (let j = 0; j < n; j++) for (let k = 0; k <= p; k++) V.set(j, k, (j - m) ** k);
      const P = pseudoInverse(V);
      for (let d = 0; d <= Math.min(2, p); d++) {
        for (let s = -m; s <= m; s++) {
          const w = savgolCoefficients(m, p, d, s);
          for (let j = 0; j < n; j++) {
            let ref = 0;
            for (let k = d; k <= p; k++) {
              let falling = 1;
              for (let i = 0; i < d; i++) falling *= k - i;
              ref += P.get(k, j) * falling * s ** (k - d);
            }
            expectClose(w[j], ref, 1e-9, `m=${m} p=${p} d=${d} s=${s} j=${j}`);
          }
        }
      }
    }
  });

  it('rejects a window that does not exceed the order, and bad positions', () => {
    expect(() => savgolCoefficients(1, 3, 0)).toThrow(/must exceed order 3/);
    expect(() => savgolCoefficients(0, 0, 0)).toThrow(/halfWindow/);
    expect(() => savgolCoefficients(3, 2, 3)).toThrow(/derivative/);
    expect(() => savgolCoefficients(3, 2, 1, 4)).toThrow(/position/);
  });
});

describe('savgolFilter', () => {
  it('is exact on polynomials up to its order, edges included', () => {
    // A degree-p polynomial is its own least-squares fit (elementary), so value and derivatives are exact.
    const dt = 0.01, n = 101;
    for (const [m, p] of [[5, 2], [7, 3], [8, 4], [12, 6]]) {
      const c = [0.3, -1.2, 0.7, 2.1, -0.9, 0.4, -0.25].slice(0, p + 1);
      const f = (t: number) => c.reduce((s, a, k) => s + a * t ** k, 0);
      const f1 = (t: number) => c.reduce((s, a, k) => s + (k >= 1 ? k * a * t ** (k - 1) : 0), 0);
      const f2 = (t: number) => c.reduce((s, a, k) => s + (k >= 2 ? k * (k - 1) * a * t ** (k - 2) : 0), 0);
      const x = sample(n, dt, f);
      const y0 = savgolFilter(x, dt, { halfWindow: m, order: p, derivative: 0 });
      const y1 = savgolFilter(x, dt, { halfWindow: m, order: p, derivative: 1 });
      const y2 = savgolFilter(x, dt, { halfWindow: m, order: p, derivative: 2 });
      for (let i = 0; i < n; i++) {
        expectClose(y0[i], f(i * dt), 1e-10, `p=${p} value at ${i}`);
        expectClose(y1[i], f1(i * dt), 1e-8, `p=${p} d1 at ${i}`);
        expectClose(y2[i], f2(i * dt), 1e-5, `p=${p} d2 at ${i}`);
      }
    }
  });

  it('differentiates a sampled sine as its frequency response predicts, and close to the cosine', () => {
    // Interior: for antisymmetric weights the output on sin(wt) is exactly G cos(wt) with
    // G = 2 sum_{j>0} w_j sin(w j dt) / dt (trigonometric identity), an independent check of the
    // convolution; G itself must be near w (the analytic derivative w cos(wt)).
    const dt = 0.01, w = 2 * Math.PI * 1.3, n = 400, m = 10, p = 4;
    const x = sample(n, dt, (t) => Math.sin(w * t));
    const y = savgolFilter(x, dt, { halfWindow: m, order: p, derivative: 1 });
    const c = savgolCoefficients(m, p, 1);
    let G = 0;
    for (let j = 1; j <= m; j++) G += (2 * c[m + j] * Math.sin(w * j * dt)) / dt;
    // G must be near w (analytic derivative w cos(wt)). Its relative error is set by the Taylor
    // series sin(u) = u - u^3/3! + u^5/5! - ...: with the moments M_k = sum_j w_j j^k (M_1 = 1,
    // M_3 = 0 for p = 4), G/w - 1 = th^4 M_5/5! - th^6 M_7/7! + ..., th = w dt (elementary).
    let M5 = 0, M7 = 0;
    for (let j = 1; j <= m; j++) { M5 += 2 * c[m + j] * j ** 5; M7 += 2 * c[m + j] * j ** 7; }
    const th = w * dt;
    expectClose(G / w - 1, th ** 4 * M5 / 120 - th ** 6 * M7 / 5040, 1e-6, 'gain error vs its Taylor series');
    expectClose(G, w, 2e-3, 'gain vs analytic derivative');
    for (let i = m; i < n - m; i++) expectClose(y[i], G * Math.cos(w * i * dt), 1e-11, `interior ${i}`, w);
    // Edges (off-centre fits) lose the symmetric cancellation of the even error terms, so they
    // are less accurate: 4.5e-3 of the amplitude w measured at the first sample; allow 1e-2.
    for (const i of [0, 1, 5, m - 1, n - m, n - 2, n - 1]) expectClose(y[i], w * Math.cos(w * i * dt), 1e-2, `edge ${i}`, w);
    // ... and they converge: halving dt with the same number of samples per window divides the
    // first-sample error by about 2^4 (fourth-order fit, error term dt^4 f^(5)); check > 8.
    const edgeError = (h: number): number => {
      const xs = sample(n, h, (t) => Math.sin(w * t));
      return Math.abs(savgolFilter(xs, h, { halfWindow: m, order: p, derivative: 1 })[0] - w);
    };
    expect(edgeError(dt) / edgeError(dt / 2)).toBeGreaterThan(8);
  });

  it('does not modify its input and checks its arguments', () => {
    const x = sample(50, 0.1, (t) => t * t);
    const copy = Float64Array.from(x);
    savgolFilter(x, 0.1, { halfWindow: 3, order: 2, derivative: 1 });
    expect(x).toEqual(copy);
    expect(() => savgolFilter(x, 0, { halfWindow: 3, order: 2, derivative: 1 })).toThrow(/dt must be a positive/);
    expect(() => savgolFilter(x, 0.1, { halfWindow: 30, order: 2, derivative: 0 })).toThrow(/x has 50 samples, fewer than the window of 2\*halfWindow\+1 = 61/);
    expect(() => savgolFilter(x, 0.1, { halfWindow: 1, order: 4, derivative: 0 })).toThrow(/must exceed order 4/);
    const bad = Float64Array.from(x); bad[7] = NaN;
    expect(() => savgolFilter(bad, 0.1, { halfWindow: 3, order: 2, derivative: 0 })).toThrow(/x\[7\] is not finite/);
  });
});
