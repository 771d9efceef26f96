// Shared test helpers for engine/control: one "close enough" check and a seeded generator.
import { expect } from 'vitest';
import { Matrix } from 'ml-matrix';

/** |actual - expected| <= tol * max(1, |expected|) (relative for large values, absolute near 0). */
export function expectClose(actual: number, expected: number, tol: number, what = ''): void {
  const err = Math.abs(actual - expected) / Math.max(1, Math.abs(expected));
  if (!(err <= tol)) expect.fail(`${what} ${actual} vs ${expected}: error ${err.toExponential(2)} > ${tol}`);
}

export function expectMatrixClose(actual: number[][] | null, expected: number[][], tol: number, what = ''): void {
  expect(actual, `${what}: no matrix`).not.toBeNull();
  for (let i = 0; i < expected.length; i++) for (let j = 0; j < expected[i].length; j++) expectClose(actual![i][j], expected[i][j], tol, `${what}[${i}][${j}]`);
}

/** Deterministic uniform [0, 1) generator (mulberry32; common practice). */
export function seeded(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (s + 0x6d2b79f5) >>> 0;
    let t = s;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

export function randomMatrix(rand: () => number, rows: number, cols: number, scale = 1): number[][] {
  return Array.from({ length: rows }, () => Array.from({ length: cols }, () => scale * (2 * rand() - 1)));
}

/** Independent residual A'X + XA - X B R^-1 B' X + Q (Frobenius norm, relative as in the brief). */
export function careResidual(A: number[][], B: number[][], Q: number[][], R: number[][], X: number[][]): number {
  const a = new Matrix(A), b = new Matrix(B), q = new Matrix(Q), r = new Matrix(R), x = new Matrix(X);
  const G = b.mmul(new Matrix(inverse(r))).mmul(b.transpose());
  const atx = a.transpose().mmul(x), xa = x.mmul(a), xgx = x.mmul(G).mmul(x);
  const res = atx.clone().add(xa).sub(xgx).add(q);
  return res.norm('frobenius') / (atx.norm('frobenius') + xa.norm('frobenius') + xgx.norm('frobenius') + q.norm('frobenius'));
}

function inverse(r: Matrix): number[][] {
  // Gauss-Jordan written here so the check does not share the solver's code paths.
  const n = r.rows;
  const m = r.to2DArray().map((row, i) => [...row, ...Array.from({ length: n }, (_, j) => (i === j ? 1 : 0))]);
  for (let c = 0; c < n; c++) {
    let p = c;
    for (let i = c + 1; i < n; i++) if (Math.abs(m[i][c]) > Math.abs(m[p][c])) p = i;
    [m[c], m[p]] = [m[p], m[c]];
    const d = m[c][c];
    for (let j = 0; j < 2 * n; j++) m[c][j] /= d;
    for (let i = 0; i < n; i++) if (i !== c) { const f = m[i][c]; for (let j = 0; j < 2 * n; j++) m[i][j] -= f * m[c][j]; }
  }
  return m.map((row) => row.slice(n));
}
