// Savitzky–Golay smoothing and differentiation (Savitzky & Golay, Anal. Chem. 36 (1964) 1627):
// a least-squares polynomial of the given order over 2m+1 samples, evaluated (or differentiated)
// at the sample; the first and last m samples use off-centre fits on the edge window.
// Stand-in with the same signature as src-main/engine/signal/savgol.ts (being written by another
// engineer); learn/velocity.ts picks this one only until that file lands.

export interface SavgolOptions { halfWindow: number; order: number; derivative: 0 | 1 | 2 }

const cache = new Map<string, Float64Array>();

/** Weights w_j (j = 0..2m) for the value/derivative at window position `at` (0..2m), in units of samples (cached). */
function weights(m: number, order: number, deriv: number, at: number): Float64Array {
  const key = `${m},${order},${deriv},${at}`;
  let w = cache.get(key);
  if (!w) {
    if (cache.size > 20000) cache.clear();
    w = computeWeights(m, order, deriv, at);
    cache.set(key, w);
  }
  return w;
}

function computeWeights(m: number, order: number, deriv: number, at: number): Float64Array {
  const n = 2 * m + 1, k = order + 1;
  // Normal equations of the fit in z = (j - at) / m (scaled for conditioning).
  const N = new Float64Array(k * k);
  const Z = new Float64Array(n * k);
  for (let j = 0; j < n; j++) {
    const z = (j - at) / m;
    let pw = 1;
    for (let a = 0; a < k; a++) { Z[j * k + a] = pw; pw *= z; }
  }
  for (let a = 0; a < k; a++) for (let b = 0; b < k; b++) {
    let s = 0;
    for (let j = 0; j < n; j++) s += Z[j * k + a] * Z[j * k + b];
    N[a * k + b] = s;
  }
  // Row `deriv` of N^-1 by solving N r = e_deriv (Gaussian elimination, partial pivoting).
  const r = solve(N, k, deriv);
  let fact = 1;
  for (let a = 2; a <= deriv; a++) fact *= a;
  const w = new Float64Array(n);
  const scale = fact / m ** deriv;
  for (let j = 0; j < n; j++) {
    let s = 0;
    for (let a = 0; a < k; a++) s += r[a] * Z[j * k + a];
    w[j] = s * scale;
  }
  return w;
}

function solve(N: Float64Array, k: number, unit: number): Float64Array {
  const A = Float64Array.from(N);
  const x = new Float64Array(k);
  x[unit] = 1;
  for (let c = 0; c < k; c++) {
    let piv = c;
    for (let i = c + 1; i < k; i++) if (Math.abs(A[i * k + c]) > Math.abs(A[piv * k + c])) piv = i;
    if (piv !== c) {
      for (let j = 0; j < k; j++) { const t = A[c * k + j]; A[c * k + j] = A[piv * k + j]; A[piv * k + j] = t; }
      const t = x[c]; x[c] = x[piv]; x[piv] = t;
    }
    for (let i = c + 1; i < k; i++) {
      const f = A[i * k + c] / A[c * k + c];
      for (let j = c; j < k; j++) A[i * k + j] -= f * A[c * k + j];
      x[i] -= f * x[c];
    }
  }
  for (let i = k - 1; i >= 0; i--) {
    let s = x[i];
    for (let j = i + 1; j < k; j++) s -= A[i * k + j] * x[j];
    x[i] = s / A[i * k + i];
  }
  return x;
}

export function savgolLocal(x: Float64Array, dt: number, opts: SavgolOptions): Float64Array {
  const { halfWindow: m, order, derivative: d } = opts;
  const n = x.length;
  if (!Number.isInteger(m) || m < 1) throw new RangeError(`savgol: halfWindow must be a positive integer, got ${m}`);
  if (!Number.isInteger(order) || order < d || order > 2 * m) throw new RangeError(`savgol: order must be an integer in [derivative, 2*halfWindow], got ${order}`);
  if (n < 2 * m + 1) throw new RangeError(`savgol: need at least ${2 * m + 1} samples for halfWindow ${m}, got ${n}`);
  const out = new Float64Array(n);
  const sc = 1 / dt ** d;
  const wc = weights(m, order, d, m);
  const w = 2 * m + 1;
  for (let i = m; i < n - m; i++) {
    let s = 0;
    const o = i - m;
    for (let j = 0; j < w; j++) s += wc[j] * x[o + j];
    out[i] = s * sc;
  }
  for (let e = 0; e < m; e++) {
    const wl = weights(m, order, d, e);
    const wr = weights(m, order, d, 2 * m - e);
    let sl = 0, sr = 0;
    for (let j = 0; j < w; j++) { sl += wl[j] * x[j]; sr += wr[j] * x[n - w + j]; }
    out[e] = sl * sc;
    out[n - 1 - e] = sr * sc;
  }
  return out;
}
