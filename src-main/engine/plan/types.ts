// Shapes of the well-hop planner (design.md §2 "Wells and hops"): hop legs in an unwrapped
// coordinate, stages and transitions as plain data. The stage, target and condition shapes are
// structurally the same as the design document's (src-main/design/types.ts), so a plan drops into
// a ControllerDesign unchanged; the engine does not import the design folder.
import type { Landscape } from '../learn/model.ts';

export type { Landscape };

/** The energy a stage drives toward, and what the user asked for. */
export type PlanTarget =
  | { kind: 'energy'; energy: number }
  | { kind: 'amplitude'; amplitude: number; energy: number }
  | { kind: 'at-rest'; well: number; energy: number }
  | { kind: 'rotation'; speed: number; energy: number };

/** All present clauses must hold (strict inequalities); q compared unwrapped unless `wrapped`. */
export interface PlanCondition {
  qAbove?: number;
  qBelow?: number;
  vSign?: 1 | -1;
  energyAbove?: number;
  energyBelow?: number;
  wrapped?: boolean;
}

export interface PlanStage {
  /** 1-based, in order. */
  index: number;
  name: string;
  target: PlanTarget;
}

export interface PlanTransition {
  from: number;
  to: number;
  when: PlanCondition;
  reason: string;
}

/** A barrier in the plan's unwrapped coordinate. */
export interface PlanBarrier { q: number; V: number }

/** A well in the plan's unwrapped coordinate, with the barriers that bound it (null: an open end). */
export interface WellBounds {
  index: number;
  /** Bottom of the well (unwrapped copy). */
  q: number;
  V: number;
  left: PlanBarrier | null;
  right: PlanBarrier | null;
  /** Lowest bounding barrier energy (Infinity when both ends are open). */
  rim: number;
}

/**
 * One hop: from the bottom region of well `from` over the barriers `crossed` (in crossing order)
 * into well `to`. Positions are unwrapped: the start well of the whole plan sits at its
 * landscape position (for angles the principal copy in [-pi, pi)).
 */
export interface HopLeg {
  from: number;
  to: number;
  direction: 1 | -1;
  start: WellBounds;
  target: WellBounds;
  crossed: PlanBarrier[];
  /** Highest crossed barrier energy. */
  highest: number;
}

/** A whole plan: the stages and transitions, and the geometry the checks need. */
export interface HopPlan {
  kind: 'hop' | 'rotation';
  /** Angle coordinate: hop conditions are on the wrapped angle, so every periodic copy of a well counts. */
  periodic: boolean;
  stages: PlanStage[];
  transitions: PlanTransition[];
  initialStage: number;
  legs: HopLeg[];
  /** Stage index (1-based) that is active once leg h's switch has fired: 2h + 2 - 1 = 2(h + 1). */
  entryStages: number[];
  /** Final target energy and the band counted as settled (absolute energy units). */
  finalEnergy: number;
  settleBand: number;
  /** Rotation plans: start well bounds, the rotation level and the revolutions before stopping (null = keep rotating). */
  rotation: { start: WellBounds; energy: number; speed: number; turns: number | null; top: PlanBarrier } | null;
}
