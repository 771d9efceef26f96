// Target levels inside a well (design.md §2 "Wells and hops"): an energy, a swing amplitude
// (H* = V(q_well + A), the turning-point energy, with V(q) = H(q, 0)), or at rest (the well
// bottom). A level must lie strictly between the well bottom and its lowest bounding barrier,
// or the rig would not stay in the well. Rotation targets (angles): the energy at which the
// rig passes the top of the circle at the given speed, H* = H(q_top, speed).
import type { Landscape, PlanBarrier, PlanTarget, WellBounds } from './types.ts';
import { insideBasin } from './well-bounds.ts';

/** What the user asks for inside the target well. */
export type LevelRequest =
  | { kind: 'energy'; energy: number }
  | { kind: 'amplitude'; amplitude: number }
  | { kind: 'at-rest' };

/** Resolves a level request in well `well` to a stage target; throws naming `where` when it does not fit the well. */
export function resolveLevel(req: LevelRequest, well: WellBounds, H: (q: number, v: number) => number, where = 'level'): PlanTarget {
  if (req === null || typeof req !== 'object') throw new TypeError(`${where}: expected {kind: 'energy' | 'amplitude' | 'at-rest', ...}`);
  const rimText = Number.isFinite(well.rim) ? `its lowest barrier ${well.rim.toPrecision(6)}` : 'no barrier';
  if (req.kind === 'at-rest') return { kind: 'at-rest', well: well.index, energy: well.V };
  if (req.kind === 'energy') {
    const E = req.energy;
    if (typeof E !== 'number' || !Number.isFinite(E)) throw new RangeError(`${where}.energy: expected a finite energy, got ${String(E)}`);
    if (!(E >= well.V && E < well.rim)) {
      throw new RangeError(`${where}.energy: ${E} is not inside well ${well.index} (bottom ${well.V.toPrecision(6)}, ${rimText}); expected bottom <= E < barrier`);
    }
    return { kind: 'energy', energy: E };
  }
  if (req.kind === 'amplitude') {
    const A = req.amplitude;
    if (typeof A !== 'number' || !Number.isFinite(A)) throw new RangeError(`${where}.amplitude: expected a finite swing amplitude, got ${String(A)}`);
    const qt = well.q + A;
    if (!insideBasin(well, qt)) throw new RangeError(`${where}.amplitude: the turning point q = ${qt.toPrecision(6)} (well ${well.index} bottom ${well.q.toPrecision(6)} + ${A}) lies beyond the well's barriers`);
    const E = H(qt, 0);
    if (!(E < well.rim)) throw new RangeError(`${where}.amplitude: V(${qt.toPrecision(6)}) = ${E.toPrecision(6)} is not below ${rimText} of well ${well.index}`);
    return { kind: 'amplitude', amplitude: A, energy: E };
  }
  throw new RangeError(`${where}.kind: expected 'energy', 'amplitude' or 'at-rest', got ${String((req as { kind: unknown }).kind)}`);
}

/** The top of the circle: the highest barrier of a periodic landscape. */
export function topOfCircle(land: Landscape): PlanBarrier {
  if (!land.periodic) throw new RangeError('rotation: the coordinate is not an angle (the landscape is not periodic)');
  if (land.barriers.length === 0) throw new RangeError('rotation: the landscape has no barrier on the circle');
  let top = land.barriers[0];
  for (const b of land.barriers) if (b.V > top.V) top = b;
  return { q: top.q, V: top.V };
}

/** Rotation target: H* = H(q_top, speed), the energy at which the rig crosses the top at `speed`. */
export function rotationTarget(land: Landscape, speed: number, H: (q: number, v: number) => number): PlanTarget {
  if (typeof speed !== 'number' || !Number.isFinite(speed) || !(speed > 0)) throw new RangeError(`rotation.speed: expected a positive speed over the top (rad/s), got ${String(speed)}`);
  const top = topOfCircle(land);
  const E = H(top.q, speed);
  if (!(E > top.V)) throw new RangeError(`rotation.speed: H(q_top, ${speed}) = ${E} is not above the top's energy ${top.V}; the energy must grow with |v|`);
  return { kind: 'rotation', speed, energy: E };
}
