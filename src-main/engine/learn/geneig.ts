// Symmetric-definite generalized eigenproblem A x = mu C x by Cholesky reduction
// (Golub & Van Loan, "Matrix Computations", 4th ed., §8.7.2, Algorithm 8.7.1): with C = L L',
// solve the standard symmetric problem (L^-1 A L^-T) y = mu y and map back x = L^-T y.
// C is first scaled to unit diagonal (Jacobi scaling); when it is not numerically positive
// definite a ridge delta*I (relative to the unit diagonal) is added and reported.
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';

export interface GenEigResult {
  /** Eigenvalues in ascending order. */
  values: Float64Array;
  /** Eigenvectors, column j belongs to values[j]; row-major p x p (x_j[i] = vectors[i * p + j]); x_j' C x_j = 1. */
  vectors: Float64Array;
  p: number;
  /** Ridge added to the unit-diagonal C (0 when C was positive definite as given). */
  ridge: number;
  /** Smallest / largest Cholesky pivot squared of the scaled C: a cheap conditioning indicator. */
  pivotRatio: number;
}

/** In-place Cholesky of a p x p row-major SPD matrix into its lower factor; returns false if a pivot fails. */
function cholesky(M: Float64Array, p: number, minPivot: number): { ok: boolean; ratio: number } {
  let lo = Infinity, hi = 0;
  for (let j = 0; j < p; j++) {
    let d = M[j * p + j];
    for (let k = 0; k < j; k++) d -= M[j * p + k] * M[j * p + k];
    if (!(d > minPivot)) return { ok: false, ratio: 0 };
    lo = Math.min(lo, d); hi = Math.max(hi, d);
    const l = Math.sqrt(d);
    M[j * p + j] = l;
    for (let i = j + 1; i < p; i++) {
      let s = M[i * p + j];
      for (let k = 0; k < j; k++) s -= M[i * p + k] * M[j * p + k];
      M[i * p + j] = s / l;
    }
    for (let i = 0; i < j; i++) M[i * p + j] = 0;
  }
  return { ok: true, ratio: lo / hi };
}

/**
 * Solves A x = mu C x for symmetric A and symmetric positive (semi)definite C, both p x p row-major.
 * Inputs are not modified. Throws if the shapes disagree or C has a non-positive diagonal entry.
 */
export function generalizedEigen(A: Float64Array, C: Float64Array, p: number): GenEigResult {
  if (A.length !== p * p || C.length !== p * p) throw new RangeError(`generalizedEigen: A and C must be ${p}x${p}`);
  const s = new Float64Array(p);
  for (let j = 0; j < p; j++) {
    const c = C[j * p + j];
    if (!(c > 0) || !Number.isFinite(c)) throw new RangeError(`generalizedEigen: C[${j}][${j}] must be positive (a term is constant or non-finite on the data), got ${c}`);
    s[j] = 1 / Math.sqrt(c);
  }
  let ridge = 0;
  let L = new Float64Array(p * p);
  let ratio = 0;
  for (let attempt = 0; attempt < 12; attempt++) {
    for (let i = 0; i < p; i++) for (let j = 0; j < p; j++) L[i * p + j] = C[i * p + j] * s[i] * s[j] + (i === j ? ridge : 0);
    const r = cholesky(L, p, 1e-13);
    if (r.ok) { ratio = r.ratio; break; }
    ridge = ridge === 0 ? 1e-12 : ridge * 10;
    if (attempt === 11) throw new RangeError('generalizedEigen: C is not positive definite even with a ridge of 1e-1');
  }
  // W = L^-1 (S A S) L^-T, built column by column with forward substitutions.
  const B = new Float64Array(p * p);
  for (let i = 0; i < p; i++) for (let j = 0; j < p; j++) B[i * p + j] = A[i * p + j] * s[i] * s[j];
  const Y = forwardColumns(L, B, p); // L^-1 B
  const Yt = new Float64Array(p * p);
  for (let i = 0; i < p; i++) for (let j = 0; j < p; j++) Yt[i * p + j] = Y[j * p + i];
  const W = forwardColumns(L, Yt, p); // L^-1 (L^-1 B)' = L^-1 B L^-T (B symmetric)
  const rows: number[][] = [];
  for (let i = 0; i < p; i++) {
    const r: number[] = [];
    for (let j = 0; j < p; j++) r.push(0.5 * (W[i * p + j] + W[j * p + i]));
    rows.push(r);
  }
  const evd = new EigenvalueDecomposition(new Matrix(rows), { assumeSymmetric: true });
  const vals = evd.realEigenvalues;
  const V = evd.eigenvectorMatrix;
  const order = vals.map((_, i) => i).sort((a, b) => vals[a] - vals[b]);
  const values = new Float64Array(p);
  const vectors = new Float64Array(p * p);
  const y = new Float64Array(p);
  for (let jj = 0; jj < p; jj++) {
    const j = order[jj];
    values[jj] = vals[j];
    for (let i = 0; i < p; i++) y[i] = V.get(i, j);
    // x = S L^-T y: back substitution with L'.
    for (let i = p - 1; i >= 0; i--) {
      let t = y[i];
      for (let k = i + 1; k < p; k++) t -= L[k * p + i] * y[k];
      y[i] = t / L[i * p + i];
    }
    for (let i = 0; i < p; i++) vectors[i * p + jj] = y[i] * s[i];
  }
  return { values, vectors, p, ridge, pivotRatio: ratio };
}

/** L^-1 B for lower-triangular L (row-major), column by column. */
function forwardColumns(L: Float64Array, B: Float64Array, p: number): Float64Array {
  const X = new Float64Array(p * p);
  for (let c = 0; c < p; c++) {
    for (let i = 0; i < p; i++) {
      let t = B[i * p + c];
      for (let k = 0; k < i; k++) t -= L[i * p + k] * X[k * p + c];
      X[i * p + c] = t / L[i * p + i];
    }
  }
  return X;
}

/** Column j of a row-major p x p matrix. */
export function column(M: Float64Array, p: number, j: number): Float64Array {
  const x = new Float64Array(p);
  for (let i = 0; i < p; i++) x[i] = M[i * p + j];
  return x;
}
