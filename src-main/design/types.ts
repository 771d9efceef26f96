// The controller design document (design.json; docs/design-format.md): everything a controller
// needs to run without the model file — the energy as a formula in our language, the law's
// parameters and limits, and the supervisor's stages and switching conditions. The simulator,
// the C export and the report all read this one shape. Plain JSON data only.
import type { Coordinate } from '../engine/types.ts';
import type { PlanCondition, PlanTarget } from '../engine/plan/types.ts';

export const DESIGN_FORMAT = 'ergostat-controller-design';
export const DESIGN_VERSION = 1;

/** What the user asked for, and the energy it resolves to (the planner's shape, engine/plan/types.ts). */
export type TargetSpec = PlanTarget;

/** One supervisor stage: a level-hold law toward its own target energy. */
export interface Stage {
  /** 1-based, as recorded in trials (the `stage` column). */
  index: number;
  name: string;
  target: TargetSpec;
  /** <b^2> over one period of the orbit at the target (for loss compensation); null when not computed. */
  meanB2: number | null;
}

/**
 * A switching condition, all present clauses must hold (AND): q above/below a value (for angles
 * compared on the unwrapped angle unless `wrapped` is true), v > 0 (vSign 1) or v < 0 (vSign -1),
 * the energy above/below a value. Conditions are evaluated once per controller sample, in order;
 * the first that holds fires. Declared once, by the planner (engine/plan/types.ts).
 */
export type SwitchCondition = PlanCondition;

export interface Transition {
  from: number;
  to: number;
  when: SwitchCondition;
  /** Why this switch exists, for people ("past the barrier at q = 0, heading into well 2"). */
  reason: string;
}

export interface LawParameters {
  /** Weight on z^2 = (H - H*)^2. */
  Q: number;
  /** Weight on u^2. */
  R: number;
  /** Sign regularisation width in units of b (0 = none). */
  eps: number;
  /** Koopman eigenvalue used by the law (1/s). */
  lambda: number;
  /** |u| <= uMax (input unit); Infinity is written as null in JSON. */
  uMax: number | null;
  /** |du/dt| <= rateMax (input unit per second); null = none. */
  rateMax: number | null;
  /** Integral action (2x2 SDRE per sample). */
  integral: { Qw: number; antiWindup: 'conditional' | 'none' } | null;
  /** Add the loss compensation -lambda H* b / <b^2>. */
  lossCompensation: boolean;
}

export interface ControllerDesign {
  format: typeof DESIGN_FORMAT;
  version: typeof DESIGN_VERSION;
  kind: 'level-hold' | 'well-hop';
  /** Ergostat version that wrote it. */
  app: string;
  /** Free text: where the model came from. */
  source: string;
  model: {
    coordinate: Coordinate;
    /** H(q, v) in our formula language (docs/formula-language.md), in `units`. */
    energy: string;
    units: 'J' | 'J/kg';
    lambda: number;
    /** The rig's equations of motion derived from H (for trials against the model): q'' as a formula in q, v, u, t. */
    acceleration: string | null;
    /** The range the recordings covered: targets outside it are refused. */
    validRange: { qMin: number; qMax: number; energyMin: number; energyMax: number };
    wells: { index: number; q: number; energy: number }[];
    barriers: { q: number; energy: number; between: [number, number] }[];
  };
  input: {
    /** g in v' = f + g u. */
    gain: number;
    /** 'N' (linear) or 'N m' (angle); '' when the model is uncalibrated per unit mass and g = 1. */
    unit: string;
  };
  law: LawParameters;
  /** Controller sample rate (Hz) and delay in whole samples. */
  sampleRateHz: number;
  delaySamples: number;
  stages: Stage[];
  transitions: Transition[];
  /** Stage the controller starts in (1-based). */
  initialStage: number;
  /** Safety cautions shown wherever this design is armed or exported. */
  cautions: string[];
  /** Checks made when designing (feasibility, u_max vs losses, ...), for the report. */
  checks: { name: string; ok: boolean; detail: string }[];
}
