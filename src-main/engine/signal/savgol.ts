// Savitzky–Golay smoothing and differentiation: the value or a derivative, at one point of a
// window of 2m+1 uniformly spaced samples, of the least-squares polynomial of degree p fitted
// to the window (Savitzky & Golay, Anal. Chem. 36 (1964) 1627; table corrections by Steinier,
// Termonia & Deltour, Anal. Chem. 44 (1972) 1906). Near the ends of a record the same fit is
// evaluated off-centre (the window stays inside the data), as in Gorry, Anal. Chem. 62 (1990) 570.
// The fit uses a QR factorisation (modified Gram–Schmidt) of the window's Vandermonde matrix in
// the scaled abscissa (j - m)/m in [-1, 1], which keeps it well conditioned.

export interface SavgolOptions {
  /** m: the window holds 2m+1 samples. */
  halfWindow: number;
  /** p: degree of the fitted polynomial; 2m+1 > p. */
  order: number;
  /** 0 smoothed value, 1 first derivative, 2 second derivative. */
  derivative: 0 | 1 | 2;
}

function checkWindow(fn: string, halfWindow: number, order: number, derivative: number): void {
  if (!Number.isInteger(halfWindow) || halfWindow < 1) {
    throw new RangeError(`${fn}: halfWindow must be an integer >= 1, got ${halfWindow}`);
  }
  if (!Number.isInteger(order) || order < 0) throw new RangeError(`${fn}: order must be an integer >= 0, got ${order}`);
  if (2 * halfWindow + 1 <= order) {
    throw new RangeError(`${fn}: the window of 2*halfWindow+1 = ${2 * halfWindow + 1} samples must exceed order ${order}`);
  }
  if (!Number.isInteger(derivative) || derivative < 0 || derivative > order) {
    throw new RangeError(`${fn}: derivative must be an integer in [0, order = ${order}], got ${derivative}`);
  }
}

/**
 * QR factors of the window's Vandermonde matrix in the scaled abscissa u = (j - m)/m, j = 0..2m,
 * columns u^0..u^p: Q is (2m+1) x (p+1) column-major (column c at c*(2m+1)), R upper, row-major.
 * Modified Gram–Schmidt (Golub & Van Loan, "Matrix Computations", Alg. 5.2.6).
 */
function windowQr(m: number, order: number): { Q: Float64Array; R: Float64Array } {
  const n = 2 * m + 1;
  const k = order + 1;
  const Q = new Float64Array(n * k);
  const R = new Float64Array(k * k);
  for (let j = 0; j < n; j++) {
    const u = (j - m) / m;
    let v = 1;
    for (let c = 0; c < k; c++) {
      Q[c * n + j] = v;
      v *= u;
    }
  }
  for (let c = 0; c < k; c++) {
    let norm = 0;
    for (let j = 0; j < n; j++) norm += Q[c * n + j] * Q[c * n + j];
    norm = Math.sqrt(norm);
    R[c * k + c] = norm;
    for (let j = 0; j < n; j++) Q[c * n + j] /= norm;
    for (let c2 = c + 1; c2 < k; c2++) {
      let dot = 0;
      for (let j = 0; j < n; j++) dot += Q[c * n + j] * Q[c2 * n + j];
      R[c * k + c2] = dot;
      for (let j = 0; j < n; j++) Q[c2 * n + j] -= dot * Q[c * n + j];
    }
  }
  return { Q, R };
}

/**
 * g[c] = d^d/dx^d of ((x - m)/m)^c at the sample x = m + position (unit spacing): the row that
 * turns the fitted coefficients a (in u) into the d-th derivative at that sample.
 */
function evaluationRow(m: number, order: number, derivative: number, position: number): Float64Array {
  const g = new Float64Array(order + 1);
  const u = position / m;
  for (let c = derivative; c <= order; c++) {
    let falling = 1;
    for (let i = 0; i < derivative; i++) falling *= c - i;
    g[c] = (falling * Math.pow(u, c - derivative)) / Math.pow(m, derivative);
  }
  return g;
}

/** Solves R z = b in place (R upper triangular, row-major k x k). */
function backSubstitute(R: Float64Array, k: number, b: Float64Array): void {
  for (let r = k - 1; r >= 0; r--) {
    let s = b[r];
    for (let c = r + 1; c < k; c++) s -= R[r * k + c] * b[c];
    b[r] = s / R[r * k + r];
  }
}

/**
 * Least-squares polynomial weights w[0..2m] such that sum_j w[j] * y[j] is the `derivative`-th
 * derivative (unit sample spacing) at offset `position` (in samples from the window centre,
 * -m..m) of the degree-`order` polynomial fitted to the 2m+1 samples y[0..2m] of the window.
 * Divide by dt^derivative for a physical spacing dt. Weights are in sample order (correlation,
 * not flipped convolution): the published first-derivative weights (-2, -1, 0, 1, 2)/10 come out
 * in that order.
 */
export function savgolCoefficients(halfWindow: number, order: number, derivative: number, position = 0): Float64Array {
  checkWindow('savgolCoefficients', halfWindow, order, derivative);
  if (!Number.isInteger(position) || Math.abs(position) > halfWindow) {
    throw new RangeError(`savgolCoefficients: position must be an integer in [-${halfWindow}, ${halfWindow}], got ${position}`);
  }
  const m = halfWindow;
  const n = 2 * m + 1;
  const k = order + 1;
  const { Q, R } = windowQr(m, order);
  // Coefficients a = R^{-1} Q' y, so the value is g' R^{-1} Q' y: weights = Q z with R' z = g
  // (forward substitution).
  const g = evaluationRow(m, order, derivative, position);
  const z = new Float64Array(k);
  for (let r = 0; r < k; r++) {
    let s = g[r];
    for (let c = 0; c < r; c++) s -= R[c * k + r] * z[c];
    z[r] = s / R[r * k + r];
  }
  const w = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    let s = 0;
    for (let c = 0; c < k; c++) s += Q[c * n + j] * z[c];
    w[j] = s;
  }
  return w;
}

/**
 * Smooths or differentiates a uniformly sampled signal. Interior points use the centred weights;
 * the first and last m points use the off-centre fits of the same window at the record's ends.
 * Returns a new array of x's length; the derivative is scaled by 1/dt^derivative.
 */
export function savgolFilter(x: Float64Array, dt: number, opts: SavgolOptions): Float64Array {
  if (!(x instanceof Float64Array)) throw new TypeError('savgolFilter: x must be a Float64Array');
  if (!(dt > 0) || !Number.isFinite(dt)) throw new RangeError(`savgolFilter: dt must be a positive finite number, got ${dt}`);
  if (opts === null || typeof opts !== 'object') throw new TypeError('savgolFilter: opts {halfWindow, order, derivative} is required');
  const { halfWindow: m, order, derivative } = opts;
  checkWindow('savgolFilter', m, order, derivative);
  const n = x.length;
  const width = 2 * m + 1;
  if (n < width) throw new RangeError(`savgolFilter: x has ${n} samples, fewer than the window of 2*halfWindow+1 = ${width}`);
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(x[i])) throw new RangeError(`savgolFilter: x[${i}] is not finite (${x[i]})`);
  }
  const scale = 1 / Math.pow(dt, derivative);
  const y = new Float64Array(n);
  const w = savgolCoefficients(m, order, derivative, 0);
  for (let c = 0; c < width; c++) w[c] *= scale;
  for (let i = m; i < n - m; i++) {
    let s = 0;
    const base = i - m;
    for (let c = 0; c < width; c++) s += w[c] * x[base + c];
    y[i] = s;
  }
  // Ends: fit the first (last) window once, a = R^{-1} Q' x, then evaluate the polynomial's
  // derivative at the offsets -m..-1 (1..m) from that window's centre.
  const { Q, R } = windowQr(m, order);
  const k = order + 1;
  const head = new Float64Array(k), tail = new Float64Array(k);
  const base = n - width;
  for (let c = 0; c < k; c++) {
    let sh = 0, st = 0;
    for (let j = 0; j < width; j++) {
      sh += Q[c * width + j] * x[j];
      st += Q[c * width + j] * x[base + j];
    }
    head[c] = sh;
    tail[c] = st;
  }
  backSubstitute(R, k, head);
  backSubstitute(R, k, tail);
  for (let off = 1; off <= m; off++) {
    const gl = evaluationRow(m, order, derivative, -off);
    const gr = evaluationRow(m, order, derivative, off);
    let yl = 0, yr = 0;
    for (let c = 0; c < k; c++) {
      yl += gl[c] * head[c];
      yr += gr[c] * tail[c];
    }
    y[m - off] = yl * scale;
    y[n - 1 - m + off] = yr * scale;
  }
  return y;
}
