// Savitzky–Golay smoothing and differentiation: the value or a derivative, at one point of a
// window of 2m+1 uniformly spaced samples, of the least-squares polynomial of degree p fitted
// to the window (Savitzky & Golay, Anal. Chem. 36 (1964) 1627; table corrections by Steinier,
// Termonia & Deltour, Anal. Chem. 44 (1972) 1906). Near the ends of a record the same fit is
// evaluated off-centre (the window stays inside the data), as in Gorry, Anal. Chem. 62 (1990) 570.
// The weights come from a QR factorisation (modified Gram–Schmidt) of the window's Vandermonde
// matrix in the scaled abscissa (j - position)/m, which keeps it well conditioned.

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
  // Q: n x k column-major (column c at c*n), R: k x k upper, row-major.
  const Q = new Float64Array(n * k);
  const R = new Float64Array(k * k);
  for (let j = 0; j < n; j++) {
    const s = (j - m - position) / m;
    let v = 1;
    for (let c = 0; c < k; c++) {
      Q[c * n + j] = v;
      v *= s;
    }
  }
  // Modified Gram–Schmidt (Golub & Van Loan, "Matrix Computations", Alg. 5.2.6).
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
  // Coefficient a_d = e_d' R^{-1} Q' y: solve R' z = e_d by forward substitution, weights = Q z.
  const z = new Float64Array(k);
  for (let r = 0; r < k; r++) {
    let s = r === derivative ? 1 : 0;
    for (let c = 0; c < r; c++) s -= R[c * k + r] * z[c];
    z[r] = s / R[r * k + r];
  }
  // d-th derivative of sum a_c ((x - position)/m)^c at x = position is d! a_d / m^d.
  let factor = 1;
  for (let i = 2; i <= derivative; i++) factor *= i;
  factor /= Math.pow(m, derivative);
  const w = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    let s = 0;
    for (let c = 0; c < k; c++) s += Q[c * n + j] * z[c];
    w[j] = s * factor;
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
  // Ends: the window [0, 2m] (resp. [n-1-2m, n-1]) evaluated at offsets -m..-1 (resp. 1..m).
  for (let off = 1; off <= m; off++) {
    const we = savgolCoefficients(m, order, derivative, -off);
    let head = 0;
    for (let c = 0; c < width; c++) head += we[c] * x[c];
    y[m - off] = head * scale;
    // By reflection j -> 2m - j, the weights at +off are the reversed weights at -off, times (-1)^d.
    const sign = derivative % 2 === 0 ? 1 : -1;
    let tail = 0;
    const base = n - width;
    for (let c = 0; c < width; c++) tail += we[width - 1 - c] * x[base + c];
    y[n - 1 - m + off] = sign * tail * scale;
  }
  return y;
}
