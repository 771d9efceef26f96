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
