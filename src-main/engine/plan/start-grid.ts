// Grid of initial states inside a well, for the feasibility check (design.md §2 "Wells and
// hops"): for each of a few energy levels between the well bottom and its lowest barrier, the
// two turning points (v = 0) and the bottom crossed in either direction. The exact bottom at
// rest is left out: there b = g dH/dv = 0 and no energy law can act (Astrom & Furuta 2000,
// references.md §6, remark). Turning points by bisection on V(q) = E, bottom speeds by
// bisection on H(q_w, v) = E (H grows with |v|: design.md §2).
import type { WellBounds } from './types.ts';

export interface StartState { q: number; v: number; energy: number }

function bisect(f: (x: number) => number, a: number, b: number): number {
  let fa = f(a);
  for (let k = 0; k < 200; k++) {
    const m = 0.5 * (a + b);
    if (m === a || m === b) break;
    const fm = f(m);
    if ((fm < 0) === (fa < 0)) { a = m; fa = fm; } else b = m;
  }
  return 0.5 * (a + b);
}

/**
 * 4 states per level: turning points left and right, bottom with v > 0 and v < 0. `levels` are
 * fractions of the well depth (rim - bottom) in (0, 1); default [0.1, 0.45, 0.8].
 */
export function startGrid(well: WellBounds, H: (q: number, v: number) => number, levels: number[] = [0.1, 0.45, 0.8]): StartState[] {
  if (!Number.isFinite(well.rim)) throw new RangeError(`startGrid: well ${well.index} has no barrier; nothing bounds its energy`);
  if (!Array.isArray(levels) || levels.length === 0) throw new RangeError('levels: expected a non-empty array of fractions in (0, 1)');
  const depth = well.rim - well.V;
  const out: StartState[] = [];
  for (const f of levels) {
    if (!(f > 0 && f < 1)) throw new RangeError(`levels: expected fractions in (0, 1), got ${f}`);
    const E = well.V + f * depth;
    const V = (q: number) => H(q, 0) - E;
    // Sides: up to the bounding barrier, or far enough out on an open side (V rises there).
    const reach = (side: 1 | -1): number => {
      const b = side > 0 ? well.right : well.left;
      if (b) return bisect(V, well.q, b.q);
      let d = 1;
      for (let k = 0; k < 60 && V(well.q + side * d) < 0; k++) d *= 2;
      return bisect(V, well.q, well.q + side * d);
    };
    let lo = 0, hi = 1;
    for (let k = 0; k < 200 && H(well.q, hi) < E; k++) { lo = hi; hi *= 2; }
    const v = bisect((x) => H(well.q, x) - E, lo, hi);
    out.push({ q: reach(-1), v: 0, energy: E }, { q: reach(1), v: 0, energy: E }, { q: well.q, v, energy: E }, { q: well.q, v: -v, energy: E });
  }
  return out;
}
