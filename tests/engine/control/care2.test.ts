import { describe, it, expect } from 'vitest';
import { care2, care2Work, solveCare2, CARE2_OK } from '../../../src-main/engine/control/care2.ts';
import { solveCare } from '../../../src-main/engine/control/care.ts';
import { carexCases, sortedPoles } from './carex-cases.ts';
import { careResidual, expectClose, expectMatrixClose, randomMatrix, seeded } from './helpers.ts';

describe('2x2 fast path on the CAREX collection (references.md §3)', () => {
  for (const c of carexCases) {
    it(`${c.name}`, () => {
      const r = solveCare2(c);
      expect(r.status, r.message).toBe('ok');
      expectMatrixClose(r.X, c.X, c.tol, c.source); // source: c.source
      expect(careResidual(c.A, c.B, c.Q, c.R, r.X!)).toBeLessThanOrEqual(1e-10);
      expect(r.relativeResidual).toBeLessThanOrEqual(1e-10);
      if (c.K) expectMatrixClose(r.K, c.K, c.kTol!, `${c.source} K`);
      if (c.poles) {
        const got = sortedPoles(r.closedLoopEigenvalues!);
        c.poles.forEach((p, i) => { expectClose(got[i].re, p.re, c.poleTol!, 'pole re'); expectClose(got[i].im, p.im, c.poleTol!, 'pole im'); });
      }
    });
  }

  it('reports the unstabilizable pair A = diag(1, -1), B = [0; 1] and the undetectable A = diag(0, -1), Q = diag(0, 1)', () => {
    expect(solveCare2({ A: [[1, 0], [0, -1]], B: [[0], [1]], Q: [[1, 0], [0, 1]], R: [[1]] }).status).toBe('no-stabilizing-solution');
    expect(solveCare2({ A: [[0, 0], [0, -1]], B: [[1], [0]], Q: [[0, 0], [0, 1]], R: [[1]] }).status).toBe('no-stabilizing-solution');
  });
});

describe('2x2 fast path agrees with the general solver (independent code: ml-matrix LU/QR/EVD)', () => {
  it('on 200 random stabilizable problems, single and double input, some with indefinite Q', () => {
    const rand = seeded(2024);
    let compared = 0;
    for (let k = 0; k < 200; k++) {
      const m = k % 3 === 0 ? 2 : 1;
      const A = randomMatrix(rand, 2, 2, 3);
      const B = randomMatrix(rand, 2, m);
      const c = randomMatrix(rand, 2, 2);
      const indefinite = k % 5 === 0;
      const Q = [[c[0][0] * c[0][0] + c[1][0] * c[1][0] + 0.1, c[0][0] * c[0][1] + c[1][0] * c[1][1]], [0, c[0][1] * c[0][1] + c[1][1] * c[1][1] + 0.1]];
      Q[1][0] = Q[0][1];
      if (indefinite) { Q[0][0] -= 0.3; Q[1][1] -= 0.05; }
      const R = m === 1 ? [[0.1 + rand()]] : [[1 + rand(), 0.2], [0.2, 0.5 + rand()]];
      const general = solveCare({ A, B, Q, R });
      const fast = solveCare2({ A, B, Q, R });
      expect(fast.status, `problem ${k}: ${general.status} / ${fast.status}`).toBe(general.status);
      if (general.status !== 'ok') continue;
      // Both are stabilizing solutions with tiny residuals, hence the same (uniqueness; common practice).
      expect(careResidual(A, B, Q, R, fast.X!)).toBeLessThanOrEqual(1e-10);
      expect(Math.max(...fast.closedLoopEigenvalues!.re)).toBeLessThan(0);
      const scale = Math.max(...general.X!.flat().map(Math.abs));
      // Entry-wise agreement is limited by the conditioning of X: some random draws are nearly
      // unstabilizable (||X|| up to 1e6), where residuals of 1e-12 allow 1e-7 differences. Compare
      // entries where ||X||_max <= 1e3.
      if (scale > 1e3) continue;
      compared++;
      for (let i = 0; i < 2; i++) for (let j = 0; j < 2; j++) expect(Math.abs(fast.X![i][j] - general.X![i][j]) / scale).toBeLessThan(1e-11);
    }
    expect(compared).toBeGreaterThan(120);
  });

  it('on the integral-action SDRE matrices A = [[lambda, 0], [1, 0]], B = [b; 0] over a range of b', () => {
    const w = care2Work();
    const x = new Float64Array(3);
    for (const lambda of [0, -0.05, -1]) {
      for (const b of [3, 1, 0.1, 1e-3]) {
        const Qz = 2, Qw = 0.5, R = 0.7;
        expect(care2([lambda, 0, 1, 0], [b * b / R, 0, 0], [Qz, 0, Qw], x, w)).toBe(CARE2_OK);
        const g = solveCare({ A: [[lambda, 0], [1, 0]], B: [[b], [0]], Q: [[Qz, 0], [0, Qw]], R: [[R]] });
        expect(g.status).toBe('ok');
        expectClose(x[0], g.X![0][0], 1e-9, `x11 lambda=${lambda} b=${b}`);
        expectClose(x[1], g.X![0][1], 1e-9, `x12 lambda=${lambda} b=${b}`);
        expectClose(x[2], g.X![1][1], 1e-9, `x22 lambda=${lambda} b=${b}`);
      }
    }
  });

  it('integral SDRE at lambda = 0 matches the double-integrator LQR gains in closed form', () => {
    // With w'' = z' = b u the problem is a double integrator with input b u; the LQR gains for
    // position weight Qw, velocity weight Qz and input weight R/b^2 are k_w = |b| sqrt(Qw/R),
    // k_z = sqrt(Qz b^2/R + 2 k_w) (derived by hand from the 2x2 CARE; same structure as CAREX 1.1).
    const w = care2Work(), x = new Float64Array(3);
    for (const b of [2, 0.3, -1.5]) {
      const Qz = 1.3, Qw = 0.4, R = 0.5;
      expect(care2([0, 0, 1, 0], [b * b / R, 0, 0], [Qz, 0, Qw], x, w)).toBe(CARE2_OK);
      const kz = (b * x[0]) / R, kw = (b * x[1]) / R; // u = -(kz z + kw w)
      expectClose(kw * b, Math.abs(b) * Math.sqrt(Qw / R), 1e-12, 'k_w');
      expectClose(kz * b, Math.sqrt((Qz * b * b) / R + 2 * Math.abs(b) * Math.sqrt(Qw / R)), 1e-12, 'k_z');
    }
  });

  it('reports no stabilizing solution for the integral SDRE at b = 0 (w uncontrollable)', () => {
    const w = care2Work(), x = new Float64Array(3);
    expect(care2([-0.1, 0, 1, 0], [0, 0, 0], [1, 0, 1], x, w)).not.toBe(CARE2_OK);
    expect(Number.isNaN(x[0])).toBe(true);
  });

  it('checks its arguments at the door of solveCare2', () => {
    expect(() => solveCare2({ A: [[1, 0, 0], [0, 1, 0], [0, 0, 1]], B: [[1], [0], [0]], Q: [[1]], R: [[1]] })).toThrow(/A: expected 2x2/);
    expect(() => solveCare2({ A: [[0, 1], [0, 0]], B: [[0], [1]], Q: [[1, 0], [0, 1]], R: [[-1]] })).toThrow(/R: expected a positive definite/);
    expect(() => solveCare2({ A: [[0, 1], [0, 0]], B: [[0], [1]], Q: [[1, 2], [0, 1]], R: [[1]] })).toThrow(/Q: expected a symmetric/);
  });
});
