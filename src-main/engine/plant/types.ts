// Plant shapes: a second-order rig q'' = a(q, q', u, t) written as a formula, and its compiled form.
import type { Coordinate, Rhs } from '../types.ts';

/** A plant as the user writes it (plant.json; docs/plant-format.md). */
export interface PlantSpec {
  /** Display name (optional). */
  name?: string;
  coordinate: Coordinate;
  /** q'' as a formula in q, v (= q'), u (the input), t and the parameter names. */
  acceleration: string;
  /** Parameter values by name (finite numbers); folded into the compiled formulas. */
  params: Record<string, number>;
  /** The true energy as a formula in q, v and the parameters (optional: tests and demos). */
  energy?: string;
}

/** The input u as a function of time and state y = [q, v]. */
export type PlantInput = (t: number, y: Float64Array) => number;

export interface Plant {
  /** The validated spec this plant was compiled from (a frozen copy). */
  readonly spec: Readonly<PlantSpec>;
  readonly coordinate: Coordinate;
  readonly params: Readonly<Record<string, number>>;
  /** q'' at (q, v) with input u at time t. */
  accel(q: number, v: number, u: number, t: number): number;
  /** d(q'')/du at (q, v, u, t): the input gain g of q'' = f(q, v, t) + g(q, v, t) u. */
  inputGain(q: number, v: number, u: number, t: number): number;
  /** True when q'' is affine in u (its u-derivative does not mention u). */
  readonly controlAffine: boolean;
  /** The true energy H(q, v), when the spec gives one. */
  readonly energy?: (q: number, v: number) => number;
  /** Writes [dH/dq, dH/dv] into out (when the spec gives an energy). */
  readonly energyGrad?: (q: number, v: number, out: Float64Array) => void;
  /** First-order right-hand side for y = [q, v]: y' = [v, accel(q, v, u(t, y), t)]; u defaults to 0. */
  rhs(u?: PlantInput): Rhs;
}
