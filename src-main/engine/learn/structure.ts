// Structure check H = 1/2 M(q) v^2 + V(q) and the equations of motion it implies
// (design.md §2, "A model to simulate from H"): with the Lagrangian L = 1/2 M v^2 - V, the
// Euler–Lagrange equation is M v' + 1/2 M'(q) v^2 + V'(q) = -c v + u (Goldstein, "Classical
// Mechanics", §1.4, from memory). The viscous term is taken as c = -lambda M(q), which makes a
// harmonic oscillator's energy decay at exactly the learned rate (its mean kinetic energy is
// half its energy: the virial theorem, Goldstein §3.4).
import { rk4Step, rk4Work } from '../ode/rk4.ts';
import { termGrad, termValue, vPower, type Term } from './library.ts';

export interface Separable {
  M: (q: number) => number;
  dM: (q: number) => number;
  V: (q: number) => number;
  dV: (q: number) => number;
}

/** Share of H's spread over the samples carried by terms that are neither v^0 nor v^2 (0 for a separable H). */
export function nonSeparableShare(terms: Term[], coef: ArrayLike<number>, q: Float64Array, v: Float64Array): number {
  let s = 0, s2 = 0, o2 = 0;
  const n = q.length;
  for (let i = 0; i < n; i++) {
    let h = 0, o = 0;
    for (let j = 0; j < terms.length; j++) {
      if (coef[j] === 0) continue;
      const val = coef[j] * termValue(terms[j], q[i], v[i]);
      h += val;
      const b = vPower(terms[j]);
      if (b !== 0 && b !== 2) o += val;
    }
    s += h; s2 += h * h; o2 += o * o;
  }
  const varH = s2 / n - (s / n) ** 2;
  return varH > 0 ? Math.sqrt(o2 / n / varH) : Infinity;
}

/** M(q), V(q) and their derivatives from the v^2 and v^0 terms. */
export function separableParts(terms: Term[], coef: ArrayLike<number>): Separable {
  const g = new Float64Array(2);
  const pick = (b: number) => terms.map((t, j) => ({ t, c: coef[j] })).filter((x) => x.c !== 0 && vPower(x.t) === b);
  const two = pick(2), zero = pick(0);
  return {
    M: (q) => { let s = 0; for (const x of two) s += x.c * termValue(x.t, q, 1); return 2 * s; },
    dM: (q) => { let s = 0; for (const x of two) { termGrad(x.t, q, 1, g); s += x.c * g[0]; } return 2 * s; },
    V: (q) => { let s = 0; for (const x of zero) s += x.c * termValue(x.t, q, 0); return s; },
    dV: (q) => { let s = 0; for (const x of zero) { termGrad(x.t, q, 0, g); s += x.c * g[0]; } return s; },
  };
}

/** Right-hand side of (q, v)' for the separable model; u(t) in the model's force units (default 0). */
export function equationsOfMotion(s: Separable, lambda: number, u?: (t: number) => number) {
  return (t: number, y: Float64Array, d: Float64Array) => {
    const q = y[0], v = y[1];
    d[0] = v;
    d[1] = (-0.5 * s.dM(q) * v * v - s.dV(q) + (u ? u(t) : 0)) / s.M(q) + lambda * v;
  };
}

/** Replays from (q0, v0) for `steps` samples of step dt (two RK4 substeps per sample) and compares with qRef[i0 + k]. */
export function replayError(s: Separable, lambda: number, q0: number, v0: number, dt: number, qRef: Float64Array, i0: number, steps: number): { rms: number; relative: number } {
  const rhs = equationsOfMotion(s, lambda);
  const w = rk4Work(2);
  const y = Float64Array.from([q0, v0]);
  let ss = 0, lo = Infinity, hi = -Infinity;
  for (let k = 1; k <= steps; k++) {
    rk4Step(rhs, 0, y, dt / 2, y, w);
    rk4Step(rhs, 0, y, dt / 2, y, w);
    if (!Number.isFinite(y[0])) return { rms: Infinity, relative: Infinity };
    const r = qRef[i0 + k];
    ss += (y[0] - r) ** 2;
    lo = Math.min(lo, r); hi = Math.max(hi, r);
  }
  const rms = Math.sqrt(ss / Math.max(1, steps));
  return { rms, relative: hi > lo ? rms / (hi - lo) : Infinity };
}
