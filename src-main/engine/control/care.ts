// Continuous-time algebraic Riccati equation (CARE) A'X + XA - X B R^-1 B' X + Q = 0, solved by
// the Hamiltonian-matrix method:
//   1. the matrix sign function of H = [[A, -G], [-Q, -A']] (G = B R^-1 B') by the scaled Newton
//      iteration Z <- (c Z + (c Z)^-1) / 2 with determinant scaling c = |det Z|^(-1/2n)
//      (Roberts 1980, Int. J. Control 32; Byers 1987, Linear Algebra Appl. 85:267-279;
//      Kenney & Laub 1995, "The matrix sign function", IEEE Trans. Autom. Control 40(8));
//   2. X from the stable invariant subspace ker(sign(H) + I) = range [I; X], i.e. the
//      overdetermined system [W12; W22 + I] X = -[W11 + I; W21], solved by least squares (QR);
//   3. Newton refinement (Kleinman 1968, IEEE TAC 13:114-115) in correction form:
//      (A - GX)' E + E (A - GX) = -Res(X), X <- X + E, accepted only while the residual drops.
// The answer is symmetrised, checked by its residual and by the closed-loop eigenvalues.
// A stabilizing solution exists iff (A, B) is stabilizable and H has no eigenvalue on the
// imaginary axis (Lancaster & Rodman 1995, "Algebraic Riccati Equations", Thm 7.2.4, from memory).
import { CholeskyDecomposition, EigenvalueDecomposition, LuDecomposition, Matrix, QrDecomposition } from 'ml-matrix';
import { expectShape, readMatrix, symmetrise, toMatrix, type MatrixInput } from './matrix-input.ts';

export interface CareProblem {
  /** n x n state matrix, 1 <= n <= 8. */
  A: MatrixInput;
  /** n x m input matrix, 1 <= m <= n. */
  B: MatrixInput;
  /** n x n symmetric state weight (may be indefinite). */
  Q: MatrixInput;
  /** m x m symmetric positive definite input weight. */
  R: MatrixInput;
}

export interface CareOptions {
  /** Stop the sign iteration when ||Z_k+1 - Z_k||_1 <= tol ||Z_k+1||_1. Default 1e-13. */
  tol?: number;
  /** Sign-iteration limit. Default 100. */
  maxIterations?: number;
  /** Newton refinement steps at most. Default 4 (0 switches refinement off). */
  refineSteps?: number;
  /** Largest relative residual still reported as 'ok'. Default 1e-8. */
  acceptRelativeResidual?: number;
}

export type CareStatus = 'ok' | 'no-stabilizing-solution' | 'not-converged' | 'inaccurate';

/** Why no stabilizing solution was found (status 'no-stabilizing-solution'). */
export type CareFailure = 'imaginary-axis-eigenvalues' | 'not-stabilizable' | 'closed-loop-unstable';

export interface Eigenvalues { re: number[]; im: number[] }

export interface CareResult {
  status: CareStatus;
  message: string;
  reason?: CareFailure;
  /** Symmetric stabilizing solution (n x n); null when none could be formed. */
  X: number[][] | null;
  /** Gain K = R^-1 B' X (m x n); u = -K x. */
  K: number[][] | null;
  /** Eigenvalues of A - B K. */
  closedLoopEigenvalues: Eigenvalues | null;
  /** ||A'X + XA - XGX + Q||_F. */
  residual: number;
  /** residual / (||A'X||_F + ||XA||_F + ||XGX||_F + ||Q||_F). */
  relativeResidual: number;
  /** Sign-function iterations. */
  iterations: number;
  /** Newton refinement steps accepted. */
  refinementSteps: number;
  /** Smallest |Re| over the Hamiltonian's eigenvalues relative to ||H||_F (computed on failure). */
  hamiltonianAxisDistance?: number;
}

export function solveCare(problem: CareProblem, options: CareOptions = {}): CareResult {
  if (problem === null || typeof problem !== 'object') throw new TypeError('problem: expected an object {A, B, Q, R}');
  const a = readMatrix(problem.A, 'A');
  const n = a.rows;
  expectShape(a, n, n, 'A', 'square state matrix');
  if (n > 8) throw new RangeError(`A: this solver is for small systems, n <= 8; got n = ${n}`);
  const b = readMatrix(problem.B, 'B');
  if (b.rows !== n) throw new RangeError(`B: expected ${n} rows (as A), got ${b.rows}`);
  const m = b.cols;
  if (m > n) throw new RangeError(`B: expected at most n = ${n} columns, got ${m}`);
  const q = readMatrix(problem.Q, 'Q');
  expectShape(q, n, n, 'Q', 'symmetric state weight');
  symmetrise(q, 'Q');
  const r = readMatrix(problem.R, 'R');
  expectShape(r, m, m, 'R', 'symmetric positive definite input weight');
  symmetrise(r, 'R');
  const tol = numberOption(options.tol, 1e-13, 'options.tol');
  const maxIterations = intOption(options.maxIterations, 100, 'options.maxIterations');
  const refineSteps = intOption(options.refineSteps, 4, 'options.refineSteps');
  const accept = numberOption(options.acceptRelativeResidual, 1e-8, 'options.acceptRelativeResidual');

  const A = toMatrix(a), B = toMatrix(b), Q = toMatrix(q), R = toMatrix(r);
  const chol = new CholeskyDecomposition(R);
  if (!chol.isPositiveDefinite()) throw new RangeError('R: expected a symmetric positive definite matrix (Cholesky factorisation failed)');
  const RinvBt = chol.solve(B.transpose()); // m x n
  const G = symm(B.mmul(RinvBt));

  // Hamiltonian matrix, 2n x 2n.
  const N = 2 * n;
  const H = new Matrix(N, N);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      H.set(i, j, A.get(i, j));
      H.set(i, n + j, -G.get(i, j));
      H.set(n + i, j, -Q.get(i, j));
      H.set(n + i, n + j, -A.get(j, i));
    }
  }

  const fail = (status: CareStatus, reason: CareFailure | undefined, message: string, iterations: number): CareResult => ({
    status, message, reason, X: null, K: null, closedLoopEigenvalues: null,
    residual: NaN, relativeResidual: NaN, iterations, refinementSteps: 0,
    hamiltonianAxisDistance: axisDistance(H),
  });

  // 1. Matrix sign function, scaled Newton iteration.
  let Z = H.clone();
  const I = Matrix.eye(N, N);
  let iterations = 0;
  let converged = false;
  let scaling = true;
  let prevRel = Infinity;
  for (iterations = 1; iterations <= maxIterations; iterations++) {
    const lu = new LuDecomposition(Z);
    const U = lu.upperTriangularMatrix;
    let logDet = 0;
    for (let i = 0; i < N; i++) logDet += Math.log(Math.abs(U.get(i, i)));
    if (lu.isSingular() || !Number.isFinite(logDet)) {
      return fail('no-stabilizing-solution', 'imaginary-axis-eigenvalues',
        'the Hamiltonian matrix has (numerically) an eigenvalue on the imaginary axis: the sign iteration met a singular matrix; (A, B) may not be stabilizable or (A, Q) not detectable on the imaginary axis', iterations);
    }
    const Zinv = lu.solve(I);
    const c = scaling ? Math.exp(-logDet / N) : 1; // Byers' determinant scaling
    const Znew = Z.clone().mul(0.5 * c).add(Zinv.mul(0.5 / c));
    const rel = norm1(Matrix.sub(Znew, Z)) / norm1(Znew);
    Z = Znew;
    if (!Number.isFinite(rel)) break;
    if (rel < 1e-2) scaling = false; // near convergence: plain Newton, quadratic
    if (rel <= tol || (rel < 1e-8 && rel >= 0.5 * prevRel)) { converged = true; break; }
    prevRel = rel;
  }
  iterations = Math.min(iterations, maxIterations);
  if (!converged) {
    const dist = axisDistance(H);
    if (dist < 1e-6) {
      return fail('no-stabilizing-solution', 'imaginary-axis-eigenvalues',
        `the sign iteration did not converge and the Hamiltonian matrix has an eigenvalue within ${dist.toExponential(2)} (relative) of the imaginary axis: no stabilizing solution`, iterations);
    }
    return fail('not-converged', undefined, `the sign iteration did not converge in ${maxIterations} iterations`, iterations);
  }

  // 2. X from [W12; W22 + I] X = -[W11 + I; W21] (least squares).
  const M = new Matrix(N, n), Rhs = new Matrix(N, n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      M.set(i, j, Z.get(i, n + j));
      M.set(n + i, j, Z.get(n + i, n + j) + (i === j ? 1 : 0));
      Rhs.set(i, j, -(Z.get(i, j) + (i === j ? 1 : 0)));
      Rhs.set(n + i, j, -Z.get(n + i, j));
    }
  }
  const qr = new QrDecomposition(M);
  let X: Matrix | null = null;
  if (qr.isFullRank()) {
    X = symm(qr.solve(Rhs));
    if (!allFinite(X)) X = null;
  }
  if (X === null) {
    return fail('no-stabilizing-solution', 'not-stabilizable',
      'the stable invariant subspace of the Hamiltonian is not of the form [I; X] (rank-deficient): (A, B) is probably not stabilizable', iterations);
  }

  // Closed loop must be stable before Newton refinement (Newton keeps a stabilizing iterate stabilizing).
  let eig = closedLoop(A, G, X);
  const maxRe = Math.max(...eig.re);
  if (!(maxRe < 0)) {
    const r0 = residuals(A, G, Q, X);
    return {
      ...fail('no-stabilizing-solution', 'closed-loop-unstable',
        `the computed solution is not stabilizing: A - BK has an eigenvalue with real part ${maxRe.toPrecision(4)} >= 0; (A, B) is probably not stabilizable`, iterations),
      X: X.to2DArray(), K: RinvBt.mmul(X).to2DArray(), closedLoopEigenvalues: eig,
      residual: r0.residual, relativeResidual: r0.relativeResidual,
    };
  }

  // 3. Newton refinement in correction form.
  let res = residuals(A, G, Q, X);
  let refinementSteps = 0;
  for (let s = 0; s < refineSteps && res.residual > 0; s++) {
    const E = lyapunovCorrection(Matrix.sub(A, G.mmul(X)), res.R);
    if (E === null) break;
    const Xn = symm(Matrix.add(X, E));
    const rn = residuals(A, G, Q, Xn);
    if (!(rn.residual < 0.9 * res.residual)) break;
    X = Xn;
    res = rn;
    refinementSteps++;
  }
  eig = closedLoop(A, G, X);
  const K = RinvBt.mmul(X);
  const stable = Math.max(...eig.re) < 0;
  let status: CareStatus = 'ok';
  let message = `stabilizing solution found (relative residual ${res.relativeResidual.toExponential(2)})`;
  if (!stable) {
    status = 'no-stabilizing-solution';
    message = 'refinement lost closed-loop stability: no reliable stabilizing solution';
  } else if (!(res.relativeResidual <= accept)) {
    status = 'inaccurate';
    message = `relative residual ${res.relativeResidual.toExponential(2)} exceeds ${accept.toExponential(1)}: the problem is ill-conditioned`;
  }
  return {
    status, message, reason: stable ? undefined : 'closed-loop-unstable',
    X: X.to2DArray(), K: K.to2DArray(), closedLoopEigenvalues: eig,
    residual: res.residual, relativeResidual: res.relativeResidual, iterations, refinementSteps,
  };
}

/** Residual Res(X) = A'X + XA - XGX + Q with its Frobenius norm and the brief's relative norm. */
function residuals(A: Matrix, G: Matrix, Q: Matrix, X: Matrix): { R: Matrix; residual: number; relativeResidual: number } {
  const AtX = A.transpose().mmul(X);
  const XA = X.mmul(A);
  const XGX = X.mmul(G).mmul(X);
  const R = symm(AtX.clone().add(XA).sub(XGX).add(Q));
  const residual = R.norm('frobenius');
  const denom = AtX.norm('frobenius') + XA.norm('frobenius') + XGX.norm('frobenius') + Q.norm('frobenius');
  return { R, residual, relativeResidual: denom > 0 ? residual / denom : residual };
}

/** Solves Ac' E + E Ac = -Res for E by the Kronecker form (n^2 unknowns; n <= 8 so at most 64). */
function lyapunovCorrection(Ac: Matrix, Res: Matrix): Matrix | null {
  const n = Ac.rows, n2 = n * n;
  const L = new Matrix(n2, n2);
  const rhs = new Matrix(n2, 1);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      const row = i * n + j;
      rhs.set(row, 0, -Res.get(i, j));
      for (let k = 0; k < n; k++) {
        L.set(row, k * n + j, L.get(row, k * n + j) + Ac.get(k, i)); // (Ac' E)_ij
        L.set(row, i * n + k, L.get(row, i * n + k) + Ac.get(k, j)); // (E Ac)_ij
      }
    }
  }
  const lu = new LuDecomposition(L);
  if (lu.isSingular()) return null;
  const e = lu.solve(rhs);
  const E = new Matrix(n, n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) E.set(i, j, e.get(i * n + j, 0));
  return allFinite(E) ? symm(E) : null;
}

function closedLoop(A: Matrix, G: Matrix, X: Matrix): Eigenvalues {
  const evd = new EigenvalueDecomposition(Matrix.sub(A, G.mmul(X)));
  return { re: evd.realEigenvalues.slice(), im: evd.imaginaryEigenvalues.slice() };
}

function axisDistance(H: Matrix): number {
  const evd = new EigenvalueDecomposition(H);
  const scale = H.norm('frobenius') || 1;
  let d = Infinity;
  for (const re of evd.realEigenvalues) d = Math.min(d, Math.abs(re) / scale);
  return d;
}

function symm(M: Matrix): Matrix {
  const n = M.rows;
  for (let i = 0; i < n; i++) {
    for (let j = i + 1; j < n; j++) {
      const s = 0.5 * (M.get(i, j) + M.get(j, i));
      M.set(i, j, s);
      M.set(j, i, s);
    }
  }
  return M;
}

function norm1(M: Matrix): number {
  let best = 0;
  for (let j = 0; j < M.columns; j++) {
    let s = 0;
    for (let i = 0; i < M.rows; i++) s += Math.abs(M.get(i, j));
    best = Math.max(best, s);
  }
  return best;
}

function allFinite(M: Matrix): boolean {
  for (let i = 0; i < M.rows; i++) for (let j = 0; j < M.columns; j++) if (!Number.isFinite(M.get(i, j))) return false;
  return true;
}

function numberOption(v: number | undefined, dflt: number, name: string): number {
  if (v === undefined) return dflt;
  if (typeof v !== 'number' || !(v > 0) || !Number.isFinite(v)) throw new RangeError(`${name}: expected a positive finite number, got ${String(v)}`);
  return v;
}

function intOption(v: number | undefined, dflt: number, name: string): number {
  if (v === undefined) return dflt;
  if (!Number.isInteger(v) || v < 0) throw new RangeError(`${name}: expected a non-negative integer, got ${String(v)}`);
  return v;
}

