// Stages and switching conditions of a well hop (design.md §2 "Wells and hops"). Per leg h
// (1-based) of the route:
//   stage 2h-1 "raise": target = highest crossed barrier + margin * (that barrier - start well bottom);
//   switch 2h-1 -> 2h once q is past the last crossed barrier by `switchFraction` of the way to
//     the target well's bottom, moving into the well (a q clause and the sign of v);
//   stage 2h "settle": the requested level (last leg) or the well bottom (intermediate legs);
//   for intermediate legs, switch 2h -> 2h+1 once captured: q between the well's barriers and
//     H below its lowest barrier by `captureBand` of the well's depth.
// Angles: the rig may leave its well over either barrier and may meet any copy of the target
// well, so hop conditions are stated on the wrapped angle (`wrapped: true`) and each raise stage
// has two switches, one entering the target well from each side. A wrapped interval that would
// straddle +-pi is cut there and the longer piece kept (the rig passes through both pieces).
// Rotation (angles): stage 1 holds the rotation energy; with `turns`, stage 2 brings the rig to
// rest once the unwrapped angle has gone `turns` revolutions either way from the start well.
import type { HopPlan, Landscape, PlanStage, PlanTransition } from './types.ts';
import { planRoute, type RouteOptions } from './route.ts';
import { resolveLevel, rotationTarget, topOfCircle, type LevelRequest } from './level.ts';
import { wellBounds } from './well-bounds.ts';

export interface HopPlanOptions extends RouteOptions {
  from: number;
  to: number;
  level?: LevelRequest;
  /** Raise to the barrier plus this fraction of its height above the start well. Default 0.1. */
  margin?: number;
  /** Switch this fraction of the way from the last barrier to the target well bottom. Default 0.1. */
  switchFraction?: number;
  /** Intermediate wells: captured once H is this fraction of the well depth below its lowest barrier. Default 0.1. */
  captureBand?: number;
  /** Settled: |H - H*| within this fraction of the target well's depth. Default 0.02. */
  settleFraction?: number;
}

export interface RotationPlanOptions {
  /** The well the rig starts in (1-based). */
  from: number;
  /** Speed over the top, rad/s. */
  speed: number;
  /** Revolutions before coming back to rest; null = keep rotating. */
  turns?: number | null;
  /** Settled band as a fraction of the energy above the start well bottom. Default 0.02. */
  settleFraction?: number;
}

const fmt = (x: number) => Number(x.toPrecision(6)).toString();
/** Positions to 1e-6 (rad or m): a barrier found at 5e-9 reads as 0. */
const fmtQ = (x: number) => Number(x.toFixed(6)).toString();
const TWO_PI = 2 * Math.PI;

/** {qAbove, qBelow} on the wrapped angle for the unwrapped interval (lo, hi), hi - lo < 2 pi. */
function wrappedInterval(lo: number, hi: number): { qAbove: number; qBelow: number } {
  const a = lo - TWO_PI * Math.floor((lo + Math.PI) / TWO_PI);
  const b = a + (hi - lo);
  if (b <= Math.PI) return { qAbove: a, qBelow: b };
  return Math.PI - a >= b - TWO_PI + Math.PI ? { qAbove: a, qBelow: Math.PI } : { qAbove: -Math.PI, qBelow: b - TWO_PI };
}

function fraction(x: unknown, name: string, def: number, lo: number, hi: number): number {
  if (x === undefined) return def;
  if (typeof x !== 'number' || !Number.isFinite(x) || !(x > lo) || !(x < hi)) throw new RangeError(`${name}: expected a number in (${lo}, ${hi}), got ${String(x)}`);
  return x;
}

/** The stages, transitions and geometry of a hop from well `from` to well `to`. */
export function buildHopPlan(land: Landscape, H: (q: number, v: number) => number, o: HopPlanOptions): HopPlan {
  const margin = fraction(o.margin, 'margin', 0.1, 0, 10);
  const sw = fraction(o.switchFraction, 'switchFraction', 0.1, 0, 1);
  const band = fraction(o.captureBand, 'captureBand', 0.1, 0, 1);
  const settle = fraction(o.settleFraction, 'settleFraction', 0.02, 0, 1);
  const legs = planRoute(land, o.from, o.to, o);
  const stages: PlanStage[] = [];
  const transitions: PlanTransition[] = [];
  const entryStages: number[] = [];
  const last = legs[legs.length - 1];
  const final = resolveLevel(o.level ?? { kind: 'at-rest' }, last.target, H);
  legs.forEach((leg, h) => {
    const raise = 2 * h + 1, settleStage = 2 * h + 2;
    const raiseTo = leg.highest + margin * (leg.highest - leg.start.V);
    stages.push({ index: raise, name: `raise over the barrier into well ${leg.to}`, target: { kind: 'energy', energy: raiseTo } });
    const b = leg.crossed[leg.crossed.length - 1];
    const t = leg.target;
    if (!land.periodic) {
      const qs = b.q + sw * (t.q - b.q);
      transitions.push({
        from: raise, to: settleStage,
        when: leg.direction > 0 ? { qAbove: qs, vSign: 1 } : { qBelow: qs, vSign: -1 },
        reason: `past the barrier at q = ${fmtQ(b.q)} (H = ${fmt(b.V)}), heading into well ${leg.to}`,
      });
    } else {
      // Both sides, the planned one first: entering over the left barrier moving +q, over the right one moving -q.
      const sides = leg.direction > 0 ? [1, -1] as const : [-1, 1] as const;
      for (const side of sides) {
        const edge = side > 0 ? t.left! : t.right!;
        const qs = edge.q + sw * (t.q - edge.q);
        const range = side > 0 ? wrappedInterval(qs, t.q) : wrappedInterval(t.q, qs);
        transitions.push({
          from: raise, to: settleStage, when: { ...range, vSign: side, wrapped: true },
          reason: `past the barrier at q = ${fmtQ(edge.q)} (H = ${fmt(edge.V)}, wrapped angle), heading into well ${leg.to} ${side > 0 ? 'in +q' : 'in -q'}`,
        });
      }
    }
    entryStages.push(settleStage);
    const isLast = h === legs.length - 1;
    stages.push({
      index: settleStage,
      name: isLast ? `settle in well ${leg.to}` : `settle in well ${leg.to} (intermediate)`,
      target: isLast ? final : { kind: 'at-rest', well: leg.to, energy: leg.target.V },
    });
    if (!isLast) {
      const when: PlanTransition['when'] = { energyBelow: t.rim - band * (t.rim - t.V) };
      if (land.periodic) Object.assign(when, wrappedInterval(t.left!.q, t.right!.q), { wrapped: true });
      else {
        if (t.left) when.qAbove = t.left.q;
        if (t.right) when.qBelow = t.right.q;
      }
      transitions.push({ from: settleStage, to: settleStage + 1, when, reason: `captured in well ${leg.to} (energy below its lowest barrier ${fmt(t.rim)} by ${band * 100}% of its depth)` });
    }
  });
  const depth = Number.isFinite(last.target.rim) ? last.target.rim - last.target.V : last.highest - last.target.V;
  return {
    kind: 'hop', periodic: land.periodic, stages, transitions, initialStage: 1, legs, entryStages,
    finalEnergy: final.energy, settleBand: settle * depth, rotation: null,
  };
}

/** Rotation at a given speed over the top from well `from` (angles), optionally back to rest after `turns`. */
export function buildRotationPlan(land: Landscape, H: (q: number, v: number) => number, o: RotationPlanOptions): HopPlan {
  const settle = fraction(o.settleFraction, 'settleFraction', 0.02, 0, 1);
  const top = topOfCircle(land);
  const start = wellBounds(land, o.from);
  const target = rotationTarget(land, o.speed, H);
  const turns = o.turns ?? null;
  if (turns !== null && (!Number.isInteger(turns) || turns < 1)) throw new RangeError(`rotation.turns: expected a whole number of revolutions >= 1, got ${String(turns)}`);
  const stages: PlanStage[] = [{ index: 1, name: `rotate (${fmt(o.speed)} rad/s over the top)`, target }];
  const transitions: PlanTransition[] = [];
  if (turns !== null) {
    stages.push({ index: 2, name: `back to rest in well ${start.index}`, target: { kind: 'at-rest', well: start.index, energy: start.V } });
    const span = 2 * Math.PI * turns;
    transitions.push({ from: 1, to: 2, when: { qAbove: start.q + span, vSign: 1 }, reason: `${turns} revolution(s) done in +q` });
    transitions.push({ from: 1, to: 2, when: { qBelow: start.q - span, vSign: -1 }, reason: `${turns} revolution(s) done in -q` });
  }
  const finalEnergy = turns === null ? target.energy : start.V;
  const scale = turns === null ? target.energy - start.V : top.V - start.V;
  return {
    kind: 'rotation', periodic: true, stages, transitions, initialStage: 1, legs: [], entryStages: [],
    finalEnergy, settleBand: settle * scale,
    rotation: { start, energy: target.energy, speed: o.speed, turns, top },
  };
}
