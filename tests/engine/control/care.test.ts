import { describe, it, expect } from 'vitest';
import { Matrix, EigenvalueDecomposition, determinant } from 'ml-matrix';
import { solveCare } from '../../../src-main/engine/control/care.ts';
import { carexCases, sortedPoles } from './carex-cases.ts';
import { careResidual, expectClose, expectMatrixClose, randomMatrix, seeded } from './helpers.ts';

describe('solveCare on the CAREX collection (references.md §3)', () => {
  for (const c of carexCases) {
    it(`${c.name}: X, residual${c.K ? ', K' : ''}${c.poles ? ', poles' : ''}`, () => {
      const r = solveCare(c);
      expect(r.status, r.message).toBe('ok');
      expectMatrixClose(r.X, c.X, c.tol, c.source); // source: c.source
      expect(r.relativeResidual).toBeLessThanOrEqual(1e-10);
      expect(careResidual(c.A, c.B, c.Q, c.R, r.X!)).toBeLessThanOrEqual(1e-10); // independent recomputation
      expect(r.X![0][1]).toBe(r.X![1][0]); // symmetrised
      if (c.K) expectMatrixClose(r.K, c.K, c.kTol!, `${c.source} K`);
      if (c.poles) {
        const got = sortedPoles(r.closedLoopEigenvalues!);
        c.poles.forEach((p, i) => { expectClose(got[i].re, p.re, c.poleTol!, 'pole re'); expectClose(got[i].im, p.im, c.poleTol!, 'pole im'); });
      }
    });
  }

  it('CAREX 1.1: closed-loop characteristic polynomial (s + 1)^2 to 1e-12 (references.md §3, CAREX 1.1)', () => {
    const c = carexCases[0];
    const r = solveCare(c);
    // A - BK = [[0, 1], [-k1, -k2]]: trace -2 and determinant 1 for a double pole at -1.
    const k = r.K![0];
    expectClose(-k[1], -2, 1e-12, 'trace');
    expectClose(k[0], 1, 1e-12, 'det');
  });

  it('CAREX 2.3: the general exact solution [[sqrt(1+2e)/e, 1], [1, sqrt(1+2e)]] at e = 0.5, 2 (references.md §3, CAREX 2.3 formula)', () => {
    for (const e of [0.5, 2]) {
      const r = solveCare({ A: [[0, e], [0, 0]], B: [[0], [1]], Q: [[1, 0], [0, 1]], R: [[1]] });
      expectMatrixClose(r.X, [[Math.sqrt(1 + 2 * e) / e, 1], [1, Math.sqrt(1 + 2 * e)]], 1e-12, `CAREX 2.3 e = ${e}`);
    }
  });

  it('scalar cases through the matrix solver (references.md §3 scalar rows, closed form from memory)', () => {
    const a = solveCare({ A: [[1]], B: [[1]], Q: [[1]], R: [[1]] });
    expectClose(a.X![0][0], 2.414213562373095, 1e-12, 'x');
    expectClose(a.K![0][0], 2.414213562373095, 1e-12, 'k');
    const b = solveCare({ A: [[-2]], B: [[0.5]], Q: [[3]], R: [[0.2]] });
    expectClose(b.X![0][0], 0.627105745132009, 1e-12, 'x');
    expectClose(b.K![0][0], 1.567764362830022, 1e-12, 'k');
    expectClose(b.closedLoopEigenvalues!.re[0], -2.783882181415011, 1e-12, 'pole');
  });

  it('reports an unstabilizable pair: A = diag(1, -1), B = [0; 1] (mode +1 uncontrollable; PBH test, common practice)', () => {
    const r = solveCare({ A: [[1, 0], [0, -1]], B: [[0], [1]], Q: [[1, 0], [0, 1]], R: [[1]] });
    expect(r.status).toBe('no-stabilizing-solution');
    expect(r.reason === 'not-stabilizable' || r.reason === 'closed-loop-unstable').toBe(true);
    expect(r.message).toMatch(/stabiliz/);
  });

  it('reports an undetectable pair on the imaginary axis: A = diag(0, -1), B = [1; 0], Q = diag(0, 1)', () => {
    // Mode 0 is unobservable through Q, so the Hamiltonian has the eigenvalue 0 (twice):
    // no stabilizing solution (Lancaster & Rodman 1995, Thm 7.2.4, from memory).
    const r = solveCare({ A: [[0, 0], [0, -1]], B: [[1], [0]], Q: [[0, 0], [0, 1]], R: [[1]] });
    expect(r.status).toBe('no-stabilizing-solution');
    expect(r.reason).toBe('imaginary-axis-eigenvalues');
    expect(r.message).toMatch(/imaginary axis/);
  });

  it('reports an uncontrollable, unobserved undamped oscillator (Hamiltonian eigenvalues +-i)', () => {
    // The oscillator block [[0, 1], [-1, 0]] is reached neither by B nor by Q: its poles +-i stay
    // in the Hamiltonian (PBH test, common practice), so no stabilizing solution exists.
    const r = solveCare({
      A: [[0, 1, 0], [-1, 0, 0], [0, 0, -1]], B: [[0], [0], [1]], Q: [[0, 0, 0], [0, 0, 0], [0, 0, 1]], R: [[1]],
    });
    expect(r.status).toBe('no-stabilizing-solution');
  });

  it('an unobservable but strictly unstable mode still has a stabilizing solution (only axis modes matter)', () => {
    // a = 1, b = 1, q = 0: 2x - x^2 = 0, the stabilizing root is x = 2 (closed loop -1); the
    // existence condition is stabilizability plus no Hamiltonian eigenvalue on the imaginary axis
    // (Lancaster & Rodman 1995, from memory).
    const r = solveCare({ A: [[1, 0], [0, -1]], B: [[1], [0]], Q: [[0, 0], [0, 1]], R: [[1]] });
    expect(r.status).toBe('ok');
    expectClose(r.X![0][0], 2, 1e-12, 'x11');
    expectClose(r.X![1][1], 0.5, 1e-12, 'x22 = q/(2|a|) for the uncontrolled stable mode');
    expect(Math.max(...r.closedLoopEigenvalues!.re)).toBeLessThan(0);
  });

  it('names bad options', () => {
    const p = { A: [[0, 1], [0, 0]], B: [[0], [1]], Q: [[1, 0], [0, 1]], R: [[1]] };
    expect(() => solveCare(p, { tol: -1 })).toThrow(/options\.tol/);
    expect(() => solveCare(p, { maxIterations: 1.5 })).toThrow(/options\.maxIterations/);
  });

  for (const [n, m, seed] of [[4, 1, 11], [4, 2, 12], [6, 2, 13], [6, 3, 14], [8, 3, 15]] as const) {
    it(`random ${n}x${n} problem with m = ${m} (seed ${seed}): residual <= 1e-10, closed loop stable, X symmetric psd`, () => {
      // Random problems with full B rows are generically stabilizable and, with Q = C'C + I/10 > 0,
      // detectable; the stabilizing solution is then unique and positive definite (common practice).
      const rand = seeded(seed);
      const A = randomMatrix(rand, n, n, 2);
      const B = randomMatrix(rand, n, m);
      const C = new Matrix(randomMatrix(rand, n, n));
      const Q = C.transpose().mmul(C).add(Matrix.eye(n).mul(0.1)).to2DArray();
      const D = new Matrix(randomMatrix(rand, m, m));
      const R = D.transpose().mmul(D).add(Matrix.eye(m)).to2DArray();
      for (let i = 0; i < n; i++) for (let j = 0; j < i; j++) Q[i][j] = Q[j][i]; // exact symmetry
      for (let i = 0; i < m; i++) for (let j = 0; j < i; j++) R[i][j] = R[j][i];
      const r = solveCare({ A, B, Q, R });
      expect(r.status, r.message).toBe('ok');
      expect(careResidual(A, B, Q, R, r.X!)).toBeLessThanOrEqual(1e-10);
      expect(Math.max(...r.closedLoopEigenvalues!.re)).toBeLessThan(0);
      // Independent: closed-loop poles of A - B K formed here from the returned K.
      const Acl = new Matrix(A).sub(new Matrix(B).mmul(new Matrix(r.K!)));
      expect(Math.max(...new EigenvalueDecomposition(Acl).realEigenvalues)).toBeLessThan(0);
      expect(new Matrix(r.X!).isSymmetric()).toBe(true);
      // X > 0: all leading principal minors positive (Sylvester's criterion).
      for (let k = 1; k <= n; k++) expect(determinant(new Matrix(r.X!).subMatrix(0, k - 1, 0, k - 1))).toBeGreaterThan(0);
    });
  }
});

describe('solveCare argument checks', () => {
  const ok = { A: [[0, 1], [0, 0]], B: [[0], [1]], Q: [[1, 0], [0, 1]], R: [[1]] };
  it('names the bad argument', () => {
    expect(() => solveCare({ ...ok, A: [[0, 1]] })).toThrow(/^A: expected 1x1|A: expected/);
    expect(() => solveCare({ ...ok, B: [[0], [1], [2]] })).toThrow(/B: expected 2 rows/);
    expect(() => solveCare({ ...ok, Q: [[1, 0.5], [0, 1]] })).toThrow(/Q: expected a symmetric matrix/);
    expect(() => solveCare({ ...ok, R: [[0]] })).toThrow(/R: expected a symmetric positive definite/);
    expect(() => solveCare({ ...ok, R: [[-1]] })).toThrow(/R: /);
    expect(() => solveCare({ ...ok, Q: [[1, 0], [0, NaN]] })).toThrow(/Q\[1\]\[1\]: expected a finite number/);
    expect(() => solveCare({ ...ok, A: [[0, 1], [0]] })).toThrow(/A: row 1 has 1 entries/);
    const big = Array.from({ length: 9 }, (_, i) => Array.from({ length: 9 }, (_, j) => (i === j ? 1 : 0)));
    expect(() => solveCare({ A: big, B: big.map((r) => [r[0]]), Q: big, R: [[1]] })).toThrow(/n <= 8/);
  });

  it('accepts ml-matrix inputs and does not mutate its arguments', () => {
    const A = new Matrix([[0, 1], [0, 0]]);
    const Q = [[1, 0], [0, 2]];
    const r = solveCare({ A, B: [[0], [1]], Q, R: new Matrix([[1]]) });
    expectMatrixClose(r.X, [[2, 1], [1, 2]], 1e-12, 'CAREX 1.1');
    expect(A.to2DArray()).toEqual([[0, 1], [0, 0]]);
    expect(Q).toEqual([[1, 0], [0, 2]]);
  });
});
