// Fast path of the CARE A'X + XA - XGX + Q = 0 for n = 2 (G = B R^-1 B' given directly), with no
// allocation per call: the SDRE with integral action solves one of these per control step.
// Same method as care.ts, written out on flat Float64Arrays: matrix sign function of the 4x4
// Hamiltonian by the determinant-scaled Newton iteration (Byers 1987, Linear Algebra Appl.
// 85:267-279; Kenney & Laub 1995, IEEE TAC 40(8)), X from [W12; W22 + I] X = -[W11 + I; W21]
// by a 4x2 QR (modified Gram-Schmidt), then Newton (Kleinman 1968) corrections, each a 3x3
// Lyapunov solve, and the closed-loop stability test trace < 0, det > 0 (Routh-Hurwitz, n = 2).
// Layouts: a = [a11, a12, a21, a22] (row-major), g = [g11, g12, g22], q = [q11, q12, q22],
// x = [x11, x12, x22] (symmetric matrices by their upper triangle).
import { expectShape, readMatrix, symmetrise, type MatrixInput } from './matrix-input.ts';
import type { CareResult } from './care.ts';

export const CARE2_OK = 0;
export const CARE2_NO_STABILIZING_SOLUTION = 1;
export const CARE2_NOT_CONVERGED = 2;

/** Work arrays and the diagnostics of the last care2 call. */
export interface Care2Work {
  z: Float64Array;
  zi: Float64Array;
  aug: Float64Array;
  /** Sign iterations of the last call. */
  iterations: number;
  /** Relative residual ||Res||_F / (||A'X|| + ||XA|| + ||XGX|| + ||Q||) of the last call. */
  relativeResidual: number;
}

export function care2Work(): Care2Work {
  return { z: new Float64Array(16), zi: new Float64Array(16), aug: new Float64Array(32), iterations: 0, relativeResidual: NaN };
}

const MAX_ITER = 60;

/**
 * Solves the 2x2 CARE; writes [x11, x12, x22] into x and returns CARE2_OK, or a failure code
 * (x then holds NaN). No argument checks: this is the hot-loop entry (see solveCare2 for a checked one).
 */
export function care2(a: ArrayLike<number>, g: ArrayLike<number>, q: ArrayLike<number>, x: Float64Array, w: Care2Work): number {
  const a11 = a[0], a12 = a[1], a21 = a[2], a22 = a[3];
  const g11 = g[0], g12 = g[1], g22 = g[2];
  const q11 = q[0], q12 = q[1], q22 = q[2];
  const z = w.z, zi = w.zi;
  // H = [[A, -G], [-Q, -A']], row-major 4x4.
  z[0] = a11; z[1] = a12; z[2] = -g11; z[3] = -g12;
  z[4] = a21; z[5] = a22; z[6] = -g12; z[7] = -g22;
  z[8] = -q11; z[9] = -q12; z[10] = -a11; z[11] = -a21;
  z[12] = -q12; z[13] = -q22; z[14] = -a12; z[15] = -a22;
  x[0] = x[1] = x[2] = NaN;
  w.relativeResidual = NaN;
  let scaling = true;
  let prevRel = Infinity;
  let converged = false;
  let it = 0;
  for (it = 1; it <= MAX_ITER; it++) {
    const det = inv4(z, zi, w.aug);
    if (det === 0 || !Number.isFinite(det)) { w.iterations = it; return CARE2_NO_STABILIZING_SOLUTION; }
    const c = scaling ? Math.pow(Math.abs(det), -0.25) : 1; // |det(cZ)| = 1
    const hc = 0.5 * c, hic = 0.5 / c;
    let dmax = 0, zmax = 0;
    for (let k = 0; k < 16; k++) {
      const zn = hc * z[k] + hic * zi[k];
      const d = Math.abs(zn - z[k]);
      if (d > dmax) dmax = d;
      const az = Math.abs(zn);
      if (az > zmax) zmax = az;
      z[k] = zn;
    }
    const rel = dmax / zmax;
    if (!(rel === rel)) break;
    if (rel < 1e-2) scaling = false;
    if (rel <= 1e-14 || (rel < 1e-8 && rel >= 0.5 * prevRel)) { converged = true; break; }
    prevRel = rel;
  }
  w.iterations = Math.min(it, MAX_ITER);
  if (!converged) return CARE2_NOT_CONVERGED;

  // M = [W12; W22 + I] (columns m1, m2), N = -[W11 + I; W21] (columns n1, n2).
  const m10 = z[2], m11 = z[6], m12 = z[10] + 1, m13 = z[14];
  const m20 = z[3], m21 = z[7], m22 = z[11], m23 = z[15] + 1;
  const n10 = -(z[0] + 1), n11 = -z[4], n12 = -z[8], n13 = -z[12];
  const n20 = -z[1], n21 = -(z[5] + 1), n22 = -z[9], n23 = -z[13];
  // Modified Gram-Schmidt with one re-orthogonalisation: M = [e1 e2] [[r11, r12], [0, r22]].
  const r11 = Math.hypot(m10, m11, m12, m13);
  if (!(r11 > 0)) return CARE2_NO_STABILIZING_SOLUTION;
  const e10 = m10 / r11, e11 = m11 / r11, e12 = m12 / r11, e13 = m13 / r11;
  let r12 = e10 * m20 + e11 * m21 + e12 * m22 + e13 * m23;
  let p0 = m20 - r12 * e10, p1 = m21 - r12 * e11, p2 = m22 - r12 * e12, p3 = m23 - r12 * e13;
  const s = e10 * p0 + e11 * p1 + e12 * p2 + e13 * p3;
  r12 += s; p0 -= s * e10; p1 -= s * e11; p2 -= s * e12; p3 -= s * e13;
  const r22 = Math.hypot(p0, p1, p2, p3);
  if (!(r22 > 1e-15 * r11)) return CARE2_NO_STABILIZING_SOLUTION; // subspace not a graph: not stabilizable
  const e20 = p0 / r22, e21 = p1 / r22, e22 = p2 / r22, e23 = p3 / r22;
  // X = R^-1 E' N.
  const c11 = e10 * n10 + e11 * n11 + e12 * n12 + e13 * n13, c12 = e10 * n20 + e11 * n21 + e12 * n22 + e13 * n23;
  const c21 = e20 * n10 + e21 * n11 + e22 * n12 + e23 * n13, c22 = e20 * n20 + e21 * n21 + e22 * n22 + e23 * n23;
  const y21 = c21 / r22, y22 = c22 / r22;
  const y11 = (c11 - r12 * y21) / r11, y12 = (c12 - r12 * y22) / r11;
  let x11 = y11, x12 = 0.5 * (y12 + y21), x22 = y22;
  if (!(Number.isFinite(x11) && Number.isFinite(x12) && Number.isFinite(x22))) return CARE2_NO_STABILIZING_SOLUTION;

  // Closed loop Ac = A - G X must be stable before Newton refinement.
  let k11 = a11 - (g11 * x11 + g12 * x12), k12 = a12 - (g11 * x12 + g12 * x22);
  let k21 = a21 - (g12 * x11 + g22 * x12), k22 = a22 - (g12 * x12 + g22 * x22);
  if (!(k11 + k22 < 0 && k11 * k22 - k12 * k21 > 0)) return CARE2_NO_STABILIZING_SOLUTION;

  let res = resid2(a11, a12, a21, a22, g11, g12, g22, q11, q12, q22, x11, x12, x22);
  for (let step = 0; step < 3 && res > 0; step++) {
    // Residual entries Res = A'X + XA - XGX + Q.
    const gx11 = g11 * x11 + g12 * x12, gx12 = g11 * x12 + g12 * x22, gx21 = g12 * x11 + g22 * x12, gx22 = g12 * x12 + g22 * x22;
    const s11 = 2 * (a11 * x11 + a21 * x12) - (x11 * gx11 + x12 * gx21) + q11;
    const s12 = a11 * x12 + a21 * x22 + x11 * a12 + x12 * a22 - (x11 * gx12 + x12 * gx22) + q12;
    const s22 = 2 * (a12 * x12 + a22 * x22) - (x12 * gx12 + x22 * gx22) + q22;
    // Ac' E + E Ac = -Res with Ac = [[k11, k12], [k21, k22]], E symmetric (e11, e12, e22):
    //   2 k11 e11 + 2 k21 e12 = -s11;  k12 e11 + (k11 + k22) e12 + k21 e22 = -s12;  2 k12 e12 + 2 k22 e22 = -s22.
    const t = k11 + k22;
    const det3 = 2 * k11 * (t * 2 * k22 - k21 * 2 * k12) - 2 * k21 * (k12 * 2 * k22);
    if (!(det3 !== 0 && Number.isFinite(det3))) break;
    const b1 = -s11, b2 = -s12, b3 = -s22;
    const e11 = (b1 * (t * 2 * k22 - k21 * 2 * k12) - 2 * k21 * (b2 * 2 * k22 - k21 * b3)) / det3;
    const e12 = (2 * k11 * (b2 * 2 * k22 - k21 * b3) - b1 * (k12 * 2 * k22)) / det3;
    const e22 = (2 * k11 * (t * b3 - 2 * k12 * b2) - 2 * k21 * (k12 * b3) + b1 * (k12 * 2 * k12)) / det3;
    const nx11 = x11 + e11, nx12 = x12 + e12, nx22 = x22 + e22;
    const nres = resid2(a11, a12, a21, a22, g11, g12, g22, q11, q12, q22, nx11, nx12, nx22);
    if (!(nres < 0.9 * res)) break;
    x11 = nx11; x12 = nx12; x22 = nx22; res = nres;
    k11 = a11 - (g11 * x11 + g12 * x12); k12 = a12 - (g11 * x12 + g12 * x22);
    k21 = a21 - (g12 * x11 + g22 * x12); k22 = a22 - (g12 * x12 + g22 * x22);
  }
  if (!(k11 + k22 < 0 && k11 * k22 - k12 * k21 > 0)) return CARE2_NO_STABILIZING_SOLUTION;
  x[0] = x11; x[1] = x12; x[2] = x22;
  w.relativeResidual = res;
  return CARE2_OK;
}

/** Relative Frobenius residual of a 2x2 CARE (the brief's definition). */
function resid2(a11: number, a12: number, a21: number, a22: number, g11: number, g12: number, g22: number,
  q11: number, q12: number, q22: number, x11: number, x12: number, x22: number): number {
  // P = A'X (not symmetric); XA = P'.
  const p11 = a11 * x11 + a21 * x12, p12 = a11 * x12 + a21 * x22, p21 = a12 * x11 + a22 * x12, p22 = a12 * x12 + a22 * x22;
  const gx11 = g11 * x11 + g12 * x12, gx12 = g11 * x12 + g12 * x22, gx21 = g12 * x11 + g22 * x12, gx22 = g12 * x12 + g22 * x22;
  const w11 = x11 * gx11 + x12 * gx21, w12 = x11 * gx12 + x12 * gx22, w22 = x12 * gx12 + x22 * gx22;
  const s11 = 2 * p11 - w11 + q11, s12 = p12 + p21 - w12 + q12, s22 = 2 * p22 - w22 + q22;
  const r = Math.sqrt(s11 * s11 + 2 * s12 * s12 + s22 * s22);
  const nP = Math.sqrt(p11 * p11 + p12 * p12 + p21 * p21 + p22 * p22);
  const den = 2 * nP + Math.sqrt(w11 * w11 + 2 * w12 * w12 + w22 * w22) + Math.sqrt(q11 * q11 + 2 * q12 * q12 + q22 * q22);
  return den > 0 ? r / den : r;
}

/** Inverse of a row-major 4x4 matrix by Gauss-Jordan with partial pivoting; returns det (0 if singular). */
function inv4(m: Float64Array, out: Float64Array, aug: Float64Array): number {
  for (let i = 0; i < 4; i++) {
    for (let j = 0; j < 4; j++) { aug[i * 8 + j] = m[i * 4 + j]; aug[i * 8 + 4 + j] = i === j ? 1 : 0; }
  }
  let det = 1;
  for (let col = 0; col < 4; col++) {
    let piv = col, best = Math.abs(aug[col * 8 + col]);
    for (let r = col + 1; r < 4; r++) { const v = Math.abs(aug[r * 8 + col]); if (v > best) { best = v; piv = r; } }
    if (best === 0) return 0;
    if (piv !== col) {
      for (let j = 0; j < 8; j++) { const t = aug[col * 8 + j]; aug[col * 8 + j] = aug[piv * 8 + j]; aug[piv * 8 + j] = t; }
      det = -det;
    }
    const p = aug[col * 8 + col];
    det *= p;
    const ip = 1 / p;
    for (let j = 0; j < 8; j++) aug[col * 8 + j] *= ip;
    for (let r = 0; r < 4; r++) {
      if (r === col) continue;
      const f = aug[r * 8 + col];
      if (f === 0) continue;
      for (let j = 0; j < 8; j++) aug[r * 8 + j] -= f * aug[col * 8 + j];
    }
  }
  for (let i = 0; i < 4; i++) for (let j = 0; j < 4; j++) out[i * 4 + j] = aug[i * 8 + 4 + j];
  return det;
}

/**
 * Checked entry for n = 2 (any m <= 2): same inputs and result shape as solveCare, computed by the
 * fast path. closedLoopEigenvalues from the 2x2 characteristic polynomial.
 */
export function solveCare2(problem: { A: MatrixInput; B: MatrixInput; Q: MatrixInput; R: MatrixInput }): CareResult {
  if (problem === null || typeof problem !== 'object') throw new TypeError('problem: expected an object {A, B, Q, R}');
  const A = readMatrix(problem.A, 'A');
  expectShape(A, 2, 2, 'A', 'the fast path is for n = 2');
  const B = readMatrix(problem.B, 'B');
  if (B.rows !== 2 || B.cols > 2) throw new RangeError(`B: expected 2x1 or 2x2, got ${B.rows}x${B.cols}`);
  const m = B.cols;
  const Q = symmetrise(readMatrix(problem.Q, 'Q'), 'Q');
  expectShape(Q, 2, 2, 'Q', 'symmetric state weight');
  const R = readMatrix(problem.R, 'R');
  expectShape(R, m, m, 'R', 'symmetric positive definite input weight');
  symmetrise(R, 'R');
  // Rinv (m <= 2), checked positive definite.
  const Rinv = new Float64Array(4);
  if (m === 1) {
    if (!(R.data[0] > 0)) throw new RangeError(`R: expected a positive definite matrix, got [[${R.data[0]}]]`);
    Rinv[0] = 1 / R.data[0];
  } else {
    const [r11, r12, , r22] = R.data;
    const d = r11 * r22 - r12 * r12;
    if (!(r11 > 0 && d > 0)) throw new RangeError('R: expected a symmetric positive definite matrix (leading minors not positive)');
    Rinv[0] = r22 / d; Rinv[1] = -r12 / d; Rinv[2] = -r12 / d; Rinv[3] = r11 / d;
  }
  // RinvBt (m x 2), G = B RinvBt.
  const RinvBt = new Float64Array(2 * m);
  for (let i = 0; i < m; i++) for (let j = 0; j < 2; j++) {
    let s = 0;
    for (let k = 0; k < m; k++) s += Rinv[i * m + k] * B.data[j * m + k];
    RinvBt[i * 2 + j] = s;
  }
  const Gf = (i: number, j: number): number => { let s = 0; for (let k = 0; k < m; k++) s += B.data[i * m + k] * RinvBt[k * 2 + j]; return s; };
  const g = [Gf(0, 0), 0.5 * (Gf(0, 1) + Gf(1, 0)), Gf(1, 1)];
  const x = new Float64Array(3);
  const w = care2Work();
  const code = care2(A.data, g, [Q.data[0], Q.data[1], Q.data[3]], x, w);
  if (code !== CARE2_OK) {
    return {
      status: code === CARE2_NOT_CONVERGED ? 'not-converged' : 'no-stabilizing-solution',
      message: code === CARE2_NOT_CONVERGED ? `the sign iteration did not converge in ${MAX_ITER} iterations`
        : 'no stabilizing solution: the Hamiltonian has an eigenvalue on the imaginary axis, or (A, B) is not stabilizable',
      X: null, K: null, closedLoopEigenvalues: null, residual: NaN, relativeResidual: NaN, iterations: w.iterations, refinementSteps: 0,
    };
  }
  const X = [[x[0], x[1]], [x[1], x[2]]];
  const K: number[][] = [];
  for (let i = 0; i < m; i++) K.push([RinvBt[i * 2] * x[0] + RinvBt[i * 2 + 1] * x[1], RinvBt[i * 2] * x[1] + RinvBt[i * 2 + 1] * x[2]]);
  const ac11 = A.data[0] - (g[0] * x[0] + g[1] * x[1]), ac12 = A.data[1] - (g[0] * x[1] + g[1] * x[2]);
  const ac21 = A.data[2] - (g[1] * x[0] + g[2] * x[1]), ac22 = A.data[3] - (g[1] * x[1] + g[2] * x[2]);
  const tr = ac11 + ac22, det = ac11 * ac22 - ac12 * ac21, disc = 0.25 * tr * tr - det;
  const closedLoopEigenvalues = disc >= 0
    ? { re: [0.5 * tr + Math.sqrt(disc), 0.5 * tr - Math.sqrt(disc)], im: [0, 0] }
    : { re: [0.5 * tr, 0.5 * tr], im: [Math.sqrt(-disc), -Math.sqrt(-disc)] };
  return {
    status: 'ok', message: `stabilizing solution found (relative residual ${w.relativeResidual.toExponential(2)})`,
    X, K, closedLoopEigenvalues, residual: absResidual(A.data, g, Q.data, x), relativeResidual: w.relativeResidual,
    iterations: w.iterations, refinementSteps: 0,
  };
}

function absResidual(a: Float64Array, g: number[], q: Float64Array, x: Float64Array): number {
  const [a11, a12, a21, a22] = a;
  const [x11, x12, x22] = x;
  const gx11 = g[0] * x11 + g[1] * x12, gx12 = g[0] * x12 + g[1] * x22, gx21 = g[1] * x11 + g[2] * x12, gx22 = g[1] * x12 + g[2] * x22;
  const s11 = 2 * (a11 * x11 + a21 * x12) - (x11 * gx11 + x12 * gx21) + q[0];
  const s12 = a11 * x12 + a21 * x22 + x11 * a12 + x12 * a22 - (x11 * gx12 + x12 * gx22) + q[1];
  const s22 = 2 * (a12 * x12 + a22 * x22) - (x12 * gx12 + x22 * gx22) + q[3];
  return Math.sqrt(s11 * s11 + 2 * s12 * s12 + s22 * s22);
}
