// Streaming Gram matrices for the integral (weak, lagged) form of the Koopman eigenfunction
// problem (EDMD-type least squares, Williams et al., J. Nonlinear Sci. 25 (2015) 1307, eq. 2.6).
// Samples are streamed in chunks of rows; the N x p term matrix is never built. Per segment
// (one run, or one time block of a run) and lag L (in samples) we keep
//   G      = sum_i theta_i theta_i'                        (all rows)
//   D0     = sum_i (theta_{i+L} - theta_i)(theta_{i+L} - theta_i)'   (i = 0 .. n-L-1)
//   Ffirst = sum_{i < L} theta_i theta_i',  Flast = sum_{i >= n-L} theta_i theta_i'
// and the matching row sums. From these, the lagged residual Gram D(lambda)'D(lambda) of
// theta(x(t+tau)) - exp(lambda tau) theta(x(t)) follows for every lambda and every offset
// (weakForm.ts) without streaming the data again, and without cancelling large against small sums.
// Layout: p x p matrices are flat Float64Array, row-major, stored full (symmetric).
import { termEvaluator, type Term } from './library.ts';

export interface LagGram {
  /** Lag in samples. */
  lag: number;
  /** Number of lagged pairs (n - lag, or 0 when the segment is shorter). */
  count: number;
  D0: Float64Array;
  Ffirst: Float64Array;
  Flast: Float64Array;
  sumFirst: Float64Array;
  sumLast: Float64Array;
}

export interface GramSet {
  p: number;
  /** Number of rows. */
  n: number;
  sum: Float64Array;
  G: Float64Array;
  lags: LagGram[];
}

export function emptyGramSet(p: number, lags: number[]): GramSet {
  const m = () => new Float64Array(p * p);
  return {
    p, n: 0, sum: new Float64Array(p), G: m(),
    lags: lags.map((lag) => ({ lag, count: 0, D0: m(), Ffirst: m(), Flast: m(), sumFirst: new Float64Array(p), sumLast: new Float64Array(p) })),
  };
}

/** Adds b into a (same p and lags); returns a. Gram sets of disjoint segments are additive. */
export function addGramSet(a: GramSet, b: GramSet): GramSet {
  if (a.p !== b.p || a.lags.length !== b.lags.length) throw new RangeError('addGramSet: the two Gram sets have different shapes');
  const add = (x: Float64Array, y: Float64Array) => { for (let i = 0; i < x.length; i++) x[i] += y[i]; };
  a.n += b.n; add(a.sum, b.sum); add(a.G, b.G);
  for (let l = 0; l < a.lags.length; l++) {
    const x = a.lags[l], y = b.lags[l];
    if (x.lag !== y.lag) throw new RangeError('addGramSet: the two Gram sets use different lags');
    x.count += y.count; add(x.D0, y.D0); add(x.Ffirst, y.Ffirst); add(x.Flast, y.Flast);
    add(x.sumFirst, y.sumFirst); add(x.sumLast, y.sumLast);
  }
  return a;
}

/** Sum of several Gram sets (a new object; the inputs are not modified). */
export function sumGramSets(sets: GramSet[], p: number, lags: number[]): GramSet {
  const out = emptyGramSet(p, lags);
  for (const s of sets) addGramSet(out, s);
  return out;
}

/** Dot product of two strided slices, four accumulators. */
function dot(x: Float64Array, xo: number, y: Float64Array, yo: number, n: number): number {
  let s0 = 0, s1 = 0, s2 = 0, s3 = 0;
  let i = 0;
  for (; i + 3 < n; i += 4) {
    s0 += x[xo + i] * y[yo + i];
    s1 += x[xo + i + 1] * y[yo + i + 1];
    s2 += x[xo + i + 2] * y[yo + i + 2];
    s3 += x[xo + i + 3] * y[yo + i + 3];
  }
  for (; i < n; i++) s0 += x[xo + i] * y[yo + i];
  return s0 + s1 + s2 + s3;
}

/**
 * Upper triangle of X'X for n rows of the column-major block X (column j at j*stride), added to M.
 * Register-blocked: two rows of M by four columns per sweep over the samples (6 loads per 8
 * multiply-adds instead of 16), which is what makes the streaming accumulation fast in JS.
 */
function addGram(X: Float64Array, stride: number, n: number, p: number, M: Float64Array): void {
  let j = 0;
  for (; j + 1 < p; j += 2) {
    const a = j * stride, b = a + stride;
    // The 2x2 diagonal block (j, j), (j, j+1), (j+1, j+1).
    let d00 = 0, d01 = 0, d11 = 0;
    for (let i = 0; i < n; i++) { const x = X[a + i], y = X[b + i]; d00 += x * x; d01 += x * y; d11 += y * y; }
    M[j * p + j] += d00; M[j * p + j + 1] += d01; M[(j + 1) * p + j + 1] += d11;
    let k = j + 2;
    for (; k + 3 < p; k += 4) {
      const c0 = k * stride, c1 = c0 + stride, c2 = c1 + stride, c3 = c2 + stride;
      let s00 = 0, s01 = 0, s02 = 0, s03 = 0, s10 = 0, s11 = 0, s12 = 0, s13 = 0;
      for (let i = 0; i < n; i++) {
        const x = X[a + i], y = X[b + i];
        const z0 = X[c0 + i], z1 = X[c1 + i], z2 = X[c2 + i], z3 = X[c3 + i];
        s00 += x * z0; s01 += x * z1; s02 += x * z2; s03 += x * z3;
        s10 += y * z0; s11 += y * z1; s12 += y * z2; s13 += y * z3;
      }
      const r0 = j * p + k, r1 = r0 + p;
      M[r0] += s00; M[r0 + 1] += s01; M[r0 + 2] += s02; M[r0 + 3] += s03;
      M[r1] += s10; M[r1 + 1] += s11; M[r1 + 2] += s12; M[r1 + 3] += s13;
    }
    for (; k < p; k++) {
      const c = k * stride;
      let s0 = 0, s1 = 0;
      for (let i = 0; i < n; i++) { const z = X[c + i]; s0 += X[a + i] * z; s1 += X[b + i] * z; }
      M[j * p + k] += s0; M[(j + 1) * p + k] += s1;
    }
  }
  if (j < p) M[j * p + j] += dot(X, j * stride, X, j * stride, n);
}

function symmetrise(M: Float64Array, p: number): void {
  for (let j = 0; j < p; j++) for (let k = j + 1; k < p; k++) M[k * p + j] = M[j * p + k];
}

export interface AccumulateOptions {
  /** Rows per chunk (default 4096). */
  chunk?: number;
}

/**
 * Gram set of one segment with states (q[i], v[i]), i = 0..n-1 (equal lengths, uniform step),
 * for the given lags in samples. q and v are read only.
 */
export function accumulateGrams(q: Float64Array, v: Float64Array, terms: Term[], lags: number[], opts: AccumulateOptions = {}): GramSet {
  const n = q.length;
  if (v.length !== n) throw new RangeError(`accumulateGrams: q and v must have equal lengths (${n} vs ${v.length})`);
  for (const L of lags) if (!Number.isInteger(L) || L < 1) throw new RangeError(`accumulateGrams: lags must be positive integers, got ${L}`);
  const p = terms.length;
  const chunk = opts.chunk ?? 4096;
  const Lmax = lags.length ? Math.max(...lags) : 0;
  const ev = termEvaluator(terms, chunk + Lmax);
  const out = emptyGramSet(p, lags);
  out.n = n;
  const stride = chunk + Lmax;
  const X = new Float64Array(p * stride);
  const Dx = new Float64Array(p * chunk);
  for (let s = 0; s < n; s += chunk) {
    const e = Math.min(n, s + chunk);
    const rows = Math.min(n, e + Lmax) - s;
    ev.evaluate(q, v, s, rows, X, stride);
    addGram(X, stride, e - s, p, out.G);
    for (let j = 0; j < p; j++) out.sum[j] += sumOf(X, j * stride, e - s);
    for (let l = 0; l < lags.length; l++) {
      const L = lags[l];
      const m = Math.min(e, n - L) - s;
      if (m <= 0) continue;
      for (let j = 0; j < p; j++) {
        const o = j * stride, od = j * chunk;
        for (let i = 0; i < m; i++) Dx[od + i] = X[o + i + L] - X[o + i];
      }
      addGram(Dx, chunk, m, p, out.lags[l].D0);
      out.lags[l].count += m;
    }
  }
  // Edge rows: the first and last L rows of the segment.
  for (let l = 0; l < lags.length; l++) {
    const L = lags[l], lg = out.lags[l];
    if (lg.count === 0) continue;
    const E = new Float64Array(p * L);
    ev.evaluate(q, v, 0, L, E, L);
    addGram(E, L, L, p, lg.Ffirst);
    for (let j = 0; j < p; j++) lg.sumFirst[j] = sumOf(E, j * L, L);
    ev.evaluate(q, v, n - L, L, E, L);
    addGram(E, L, L, p, lg.Flast);
    for (let j = 0; j < p; j++) lg.sumLast[j] = sumOf(E, j * L, L);
    symmetrise(lg.D0, p); symmetrise(lg.Ffirst, p); symmetrise(lg.Flast, p);
  }
  symmetrise(out.G, p);
  return out;
}

function sumOf(x: Float64Array, o: number, n: number): number {
  let s = 0;
  for (let i = 0; i < n; i++) s += x[o + i];
  return s;
}
