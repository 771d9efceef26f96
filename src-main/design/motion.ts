// Equations of motion from the energy (design.md §2, "A model to simulate from H"): for
// H = 1/2 M(q) v^2 + V(q) the Euler-Lagrange equation of L = 1/2 M v^2 - V is
// M v' + 1/2 M'(q) v^2 + V'(q) = -c v + u (Goldstein, "Classical Mechanics", §1.4, from memory).
// Since dH/dq (at fixed v) = 1/2 M' v^2 + V' and d2H/dv2 = M, this is v' = -(dH/dq) / (d2H/dv2),
// written here symbolically from the formula (engine/formula/differentiate.ts). Damping and input
// follow the learn engine's convention (engine/learn/structure.ts): c = -lambda M, so the losses
// add lambda v, and the input adds g u (v' = f + g u, design.input.gain).
import { compileFormula, dependsOn, differentiate, formatFormula, parseFormula } from '../engine/formula/index.ts';

export interface MotionFromEnergy {
  /** q'' = -(dH/dq)/(d2H/dv2) + lambda v + g u, a formula in q, v, u (and t, unused). */
  acceleration: string;
  /** The undamped, unforced acceleration -(dH/dq)/(d2H/dv2), compiled. */
  undamped: (q: number, v: number) => number;
  /** M(q) = d2H/dv2, compiled. */
  mass: (q: number) => number;
}

/**
 * Derives the equations of motion; returns a reason string instead when H is not of the form
 * 1/2 M(q) v^2 + V(q) on the sampled positions `qs` (checked at v = +-1 to 1e-9 relative) or M <= 0 there.
 */
export function motionFromEnergy(energy: string, lambda: number, inputGain: number, qs: readonly number[]): MotionFromEnergy | string {
  const ast = parseFormula(energy);
  const hq = differentiate(ast, 'q');
  const hvv = differentiate(differentiate(ast, 'v'), 'v');
  if (dependsOn(hvv, 'v')) return 'H is not of the form 1/2 M(q) v^2 + V(q): its second derivative in v depends on v';
  const vars = ['q', 'v'];
  const H = compileFormula(ast, vars), M = compileFormula(hvv, vars), Hq = compileFormula(hq, vars);
  const x = new Float64Array(2);
  const ev = (f: typeof H, q: number, v: number) => { x[0] = q; x[1] = v; return f.eval(x); };
  for (const q of qs) {
    const m = ev(M, q, 0);
    if (!(m > 0)) return `the kinetic coefficient M(q) = d2H/dv2 is ${m} at q = ${q}, not positive`;
    const h0 = ev(H, q, 0);
    for (const v of [1, -1]) {
      const rest = ev(H, q, v) - h0 - 0.5 * m * v * v;
      if (Math.abs(rest) > 1e-9 * (Math.abs(h0) + 0.5 * m + 1e-300)) return `H is not of the form 1/2 M(q) v^2 + V(q) (at q = ${q}, v = ${v} the remainder is ${rest})`;
    }
  }
  const text = `-(${formatFormula(hq)})/(${formatFormula(hvv)}) + (${lambda})*v + (${inputGain})*u`;
  const acceleration = formatFormula(parseFormula(text));
  compileFormula(acceleration, ['q', 'v', 'u', 't']); // must compile for trials
  return {
    acceleration,
    undamped: (q, v) => -ev(Hq, q, v) / ev(M, q, v),
    mass: (q) => ev(M, q, 0),
  };
}
