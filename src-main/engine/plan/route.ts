// Route of a well-to-well move (design.md §2 "Wells and hops"): the wells passed and the
// barriers crossed, in an unwrapped coordinate. 'stepwise' makes one hop per neighbouring pair
// (a multi-hop move is a sequence of single hops); 'direct' makes one hop over every barrier on
// the way (stage 1 then targets the highest of them). For angles the move may go either way
// round; 'auto' takes the way with fewer barriers, then the lower highest barrier, then +q.
import type { HopLeg, Landscape, PlanBarrier, WellBounds } from './types.ts';
import { checkLandscape, wellBounds } from './well-bounds.ts';

const TWO_PI = 2 * Math.PI;

export interface RouteOptions {
  mode?: 'stepwise' | 'direct';
  /** Angles only: +1 (increasing q), -1, or 'auto' (default). */
  direction?: 1 | -1 | 'auto';
}

/** The copy of well `index` first met beyond position x going in `direction`. */
function nextCopy(land: Landscape, index: number, x: number, direction: 1 | -1): WellBounds {
  const w = land.wells[index - 1];
  let q = w.q;
  if (land.periodic) {
    q += TWO_PI * Math.floor((x - q) / TWO_PI);
    while ((q - x) * direction <= 0) q += TWO_PI * direction;
    while ((q - TWO_PI * direction - x) * direction > 0) q -= TWO_PI * direction;
  }
  return wellBounds(land, index, q);
}

function walk(land: Landscape, from: number, steps: number, direction: 1 | -1): { wells: WellBounds[]; barriers: PlanBarrier[] } {
  const n = land.wells.length;
  const wells = [wellBounds(land, from)];
  const barriers: PlanBarrier[] = [];
  let cur = wells[0];
  for (let s = 0; s < steps; s++) {
    const b = direction > 0 ? cur.right : cur.left;
    if (b === null) throw new RangeError(`route: well ${cur.index} has no barrier on its ${direction > 0 ? 'right' : 'left'} side`);
    const nextIndex = land.periodic ? ((cur.index - 1 + direction + n) % n) + 1 : cur.index + direction;
    const next = nextCopy(land, nextIndex, b.q, direction);
    barriers.push(b);
    wells.push(next);
    cur = next;
  }
  return { wells, barriers };
}

/** Legs of the move from well `from` to well `to` (1-based, numbered from the most negative q). */
export function planRoute(land: Landscape, from: number, to: number, options: RouteOptions = {}): HopLeg[] {
  checkLandscape(land);
  const n = land.wells.length;
  for (const [name, k] of [['from', from], ['to', to]] as const) {
    if (!Number.isInteger(k) || k < 1 || k > n) throw new RangeError(`${name}: expected a well number 1..${n}, got ${k}`);
  }
  if (from === to) throw new RangeError(`to: the move starts in well ${to} already; a level change inside one well is a level-hold design (for angles, use a rotation target to go round)`);
  const mode = options.mode ?? 'stepwise';
  if (mode !== 'stepwise' && mode !== 'direct') throw new RangeError(`mode: expected 'stepwise' or 'direct', got ${String(mode)}`);
  const dirOpt = options.direction ?? 'auto';
  if (dirOpt !== 1 && dirOpt !== -1 && dirOpt !== 'auto') throw new RangeError(`direction: expected 1, -1 or 'auto', got ${String(dirOpt)}`);
  let path: { wells: WellBounds[]; barriers: PlanBarrier[] };
  if (!land.periodic) {
    const d: 1 | -1 = to > from ? 1 : -1;
    if (dirOpt !== 'auto' && dirOpt !== d) throw new RangeError(`direction: well ${to} lies on the ${d > 0 ? '+q' : '-q'} side of well ${from} and the coordinate is not periodic`);
    path = walk(land, from, Math.abs(to - from), d);
  } else {
    const up = (to - from + n) % n, down = n - up;
    const a = walk(land, from, up, 1), b = walk(land, from, down, -1);
    const top = (p: typeof a) => Math.max(...p.barriers.map((x) => x.V));
    path = dirOpt === 1 ? a : dirOpt === -1 ? b
      : up < down ? a : down < up ? b : top(b) < top(a) ? b : a;
  }
  const d: 1 | -1 = path.wells[1].q > path.wells[0].q ? 1 : -1;
  const legs: HopLeg[] = [];
  if (mode === 'direct') {
    legs.push({ from, to, direction: d, start: path.wells[0], target: path.wells[path.wells.length - 1], crossed: path.barriers, highest: Math.max(...path.barriers.map((x) => x.V)) });
  } else {
    for (let s = 0; s < path.barriers.length; s++) {
      legs.push({ from: path.wells[s].index, to: path.wells[s + 1].index, direction: d, start: path.wells[s], target: path.wells[s + 1], crossed: [path.barriers[s]], highest: path.barriers[s].V });
    }
  }
  return legs;
}
