// Bounds of a potential well (design.md §2 "Wells and hops"): the barriers on either side of a
// well of the landscape V(q) = H(q, 0), stated in an unwrapped coordinate. Non-periodic
// landscapes: the outermost wells have an open end (V rises to the edge of the data's range).
// Periodic landscapes (angles): the neighbours wrap around, and positions are shifted by whole
// turns so that left.q < q < right.q around the chosen copy of the well.
import type { Landscape, WellBounds } from './types.ts';

const TWO_PI = 2 * Math.PI;

/** Checks a landscape once: wells numbered 1..n in order of q, barriers naming existing wells. */
export function checkLandscape(land: Landscape, where = 'landscape'): void {
  if (land === null || typeof land !== 'object') throw new TypeError(`${where}: expected a landscape {qMin, qMax, periodic, wells, barriers}, got ${String(land)}`);
  if (!Array.isArray(land.wells) || land.wells.length === 0) throw new RangeError(`${where}.wells: expected at least one well`);
  if (!Array.isArray(land.barriers)) throw new TypeError(`${where}.barriers: expected an array`);
  land.wells.forEach((w, i) => {
    if (w.index !== i + 1) throw new RangeError(`${where}.wells[${i}].index: expected ${i + 1} (wells numbered from the most negative q), got ${w.index}`);
    if (!Number.isFinite(w.q) || !Number.isFinite(w.V)) throw new RangeError(`${where}.wells[${i}]: q and V must be finite numbers`);
    if (i > 0 && !(w.q > land.wells[i - 1].q)) throw new RangeError(`${where}.wells[${i}].q: expected wells in increasing q, got ${w.q} after ${land.wells[i - 1].q}`);
  });
  const n = land.wells.length;
  land.barriers.forEach((b, i) => {
    if (!Number.isFinite(b.q) || !Number.isFinite(b.V)) throw new RangeError(`${where}.barriers[${i}]: q and V must be finite numbers`);
    const [a, c] = b.between ?? [];
    if (!Number.isInteger(a) || !Number.isInteger(c) || a < 1 || a > n || c < 1 || c > n) {
      throw new RangeError(`${where}.barriers[${i}].between: expected two well indices 1..${n}, got ${JSON.stringify(b.between)}`);
    }
  });
}

/** The barrier between well `a` and its right neighbour (`a` then `b` in the landscape's order). */
function barrierRightOf(land: Landscape, a: number): { q: number; V: number } | null {
  const n = land.wells.length;
  const b = land.periodic ? (a % n) + 1 : a + 1;
  if (!land.periodic && a === n) return null;
  const found = land.barriers.find((x) => x.between[0] === a && x.between[1] === b);
  return found ? { q: found.q, V: found.V } : null;
}

/**
 * Bounds of well `index` around the copy of the well nearest to `near` (default: its landscape
 * position). Throws when the index is not a well of the landscape.
 */
export function wellBounds(land: Landscape, index: number, near?: number): WellBounds {
  const n = land.wells.length;
  if (!Number.isInteger(index) || index < 1 || index > n) throw new RangeError(`well: expected a well number 1..${n}, got ${index}`);
  const w = land.wells[index - 1];
  let q = w.q;
  if (land.periodic && near !== undefined) q += TWO_PI * Math.round((near - w.q) / TWO_PI);
  const shift = q - w.q;
  const rightRaw = barrierRightOf(land, index);
  const leftIdx = land.periodic ? ((index + n - 2) % n) + 1 : index - 1;
  const leftRaw = leftIdx >= 1 ? barrierRightOf(land, leftIdx) : null;
  const place = (bq: number, side: 1 | -1): number => {
    let x = bq + shift;
    if (land.periodic) {
      // Bring the barrier to the correct side of the well, within one turn.
      while (side > 0 && x <= q) x += TWO_PI;
      while (side > 0 && x - TWO_PI > q) x -= TWO_PI;
      while (side < 0 && x >= q) x -= TWO_PI;
      while (side < 0 && x + TWO_PI < q) x += TWO_PI;
    }
    return x;
  };
  const right = rightRaw ? { q: place(rightRaw.q, 1), V: rightRaw.V } : null;
  const left = leftRaw ? { q: place(leftRaw.q, -1), V: leftRaw.V } : null;
  const rim = Math.min(left ? left.V : Infinity, right ? right.V : Infinity);
  return { index, q, V: w.V, left, right, rim };
}

/** Number of the well whose basin (between its barriers) contains q; for angles any copy counts. */
export function wellAt(land: Landscape, q: number): number {
  for (const w of land.wells) {
    const b = wellBounds(land, w.index, q);
    if ((b.left === null || q >= b.left.q) && (b.right === null || q < b.right.q)) return w.index;
  }
  // Periodic rounding corner (q exactly on a barrier): the nearest well bottom.
  let best = 1, d = Infinity;
  for (const w of land.wells) {
    const b = wellBounds(land, w.index, q);
    if (Math.abs(b.q - q) < d) { d = Math.abs(b.q - q); best = w.index; }
  }
  return best;
}

/** True when q lies strictly inside the basin described by `b` (between its barriers). */
export function insideBasin(b: WellBounds, q: number): boolean {
  return (b.left === null || q > b.left.q) && (b.right === null || q < b.right.q);
}
