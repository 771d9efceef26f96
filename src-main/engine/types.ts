// Shared data shapes of the engine. Plain data only: no behaviour, no I/O.

/** 'angle': q is an angle in radians (periodic, may arrive wrapped to [-pi, pi)); 'linear': a displacement in metres. */
export type Coordinate = 'angle' | 'linear';

/** One continuous recording segment: uniform sampling, no gaps. Arrays share one length. */
export interface Run {
  /** Readable name, e.g. "swing-a.csv run 2" or "swing-a.csv [12.0 s..30.5 s]". */
  name: string;
  /** File the samples came from ('' for simulated data). */
  source: string;
  /** Time in seconds, strictly increasing. */
  t: Float64Array;
  /** Position: radians (unwrapped once imported) or metres. */
  q: Float64Array;
  /** Input channel (force, torque or drive signal) if recorded. */
  u?: Float64Array;
}

/** A set of runs of one rig with one coordinate. */
export interface Recording {
  coordinate: Coordinate;
  runs: Run[];
}

/** Right-hand side of dy/dt = f(t, y); writes f into dydt (length n) and must not keep references. */
export type Rhs = (t: number, y: Float64Array, dydt: Float64Array) => void;

/**
 * A conserved-energy function H(q, v) with its Koopman eigenvalue, as the controller sees it
 * (learned from data or written down analytically).
 */
export interface EnergyFunction {
  coordinate: Coordinate;
  /** H(q, v): joules when the model is calibrated, otherwise model units. */
  H(q: number, v: number): number;
  /** Writes [dH/dq, dH/dv] into out[0], out[1]. */
  grad(q: number, v: number, out: Float64Array): void;
  /** Koopman eigenvalue (1/s): 0 for a conservative system, slightly negative with light damping. */
  lambda: number;
}
