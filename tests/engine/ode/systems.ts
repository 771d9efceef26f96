// Right-hand sides and energies used by the ODE tests, written out inline (no dependence on the
// formula parser or the built-in plants). Energies take V = 0 at the deepest well (design.md §2).
import type { Rhs } from '../../../src-main/engine/types.ts';

/** A conservative one-degree-of-freedom system q'' = -V'(q) with its potential and derivatives. */
export interface Conservative {
  name: string;
  V: (q: number) => number;
  dV: (q: number) => number;
  d2V: (q: number) => number;
}

/** Pendulum with l = 0.42 m, g = 9.81 m/s^2 (references.md §5), V = (g/l)(1 - cos q) per unit m l^2. */
export const G = 9.81, L = 0.42, GL = G / L;
export const pendulum: Conservative = {
  name: 'pendulum (l = 0.42 m)',
  V: (q) => GL * (1 - Math.cos(q)),
  dV: (q) => GL * Math.sin(q),
  d2V: (q) => GL * Math.cos(q),
};

/** Double-well Duffing H = v^2/2 - a q^2/2 + b q^4/4 (references.md, Duffing section) with a = b = 1, shifted so V = 0 at the wells q = ±1. */
export const duffing: Conservative = {
  name: 'double-well Duffing (a = b = 1)',
  V: (q) => -0.5 * q * q + 0.25 * q ** 4 + 0.25,
  dV: (q) => -q + q ** 3,
  d2V: (q) => -1 + 3 * q * q,
};

export const energy = (s: Conservative, q: number, v: number): number => 0.5 * v * v + s.V(q);

/** First-order form y = (q, v) for the adaptive solvers. */
export const firstOrder = (s: Conservative): Rhs => (_t, y, d) => {
  d[0] = y[1];
  d[1] = -s.dV(y[0]);
};

export const rel = (a: number, b: number): number => Math.abs(a - b) / Math.abs(b);

/**
 * Period of a closed orbit released from rest at q0, by quadrature of T = 2 ∫ dq / sqrt(2 (E - V(q)))
 * between the turning points (elementary mechanics). With q = mid + half sin(s) the integrand becomes a
 * smooth function of sin(s) (the square-root end singularities cancel against dq = half cos(s) ds), so
 * the midpoint rule over s in (-pi/2, pi/2) converges spectrally (half of a full-period trapezoid
 * rule; common practice). Independent of the ODE solvers. The far turning point is found by bisection.
 */
export function orbitPeriod(s: Conservative, q0: number): number {
  const E = s.V(q0);
  // The other turning point: walk left from q0 until V rises back to E, then bisect.
  let lo = q0;
  const step = 1e-3 * Math.max(1, Math.abs(q0));
  let x = q0 - step;
  while (s.V(x) < E) { lo = x; x -= step; }
  let a = x, b = lo; // V(a) >= E > V(b)
  for (let i = 0; i < 200; i++) { const m = 0.5 * (a + b); if (s.V(m) >= E) a = m; else b = m; }
  const qLeft = 0.5 * (a + b);
  const mid = 0.5 * (q0 + qLeft), half = 0.5 * (q0 - qLeft);
  const N = 2000;
  let sum = 0;
  for (let j = 0; j < N; j++) {
    const sj = -Math.PI / 2 + (Math.PI * (j + 0.5)) / N;
    sum += (half * Math.cos(sj)) / Math.sqrt(2 * (E - s.V(mid + half * Math.sin(sj))));
  }
  return 2 * sum * (Math.PI / N);
}
