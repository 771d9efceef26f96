// State estimation from position samples: Savitzky–Golay smoothed position, velocity and
// acceleration (Savitzky & Golay, Anal. Chem. 36 (1964) 1627) with one window for all three.
import { savgolFilter } from '../signal/savgol.ts';

export interface StateEstimate { q: Float64Array; v: Float64Array; a?: Float64Array }

/** Smoothed q and its first (and optionally second) derivative; the input is not modified. */
export function estimateStates(q: Float64Array, dt: number, halfWindow: number, order = 4, withAcceleration = false): StateEstimate {
  const o = Math.min(order, 2 * halfWindow);
  const qs = savgolFilter(q, dt, { halfWindow, order: o, derivative: 0 });
  const v = savgolFilter(q, dt, { halfWindow, order: o, derivative: 1 });
  const a = withAcceleration ? savgolFilter(q, dt, { halfWindow, order: Math.max(o, 2), derivative: 2 }) : undefined;
  return { q: qs, v, a };
}

/** Savitzky–Golay first derivative alone (order 4, or less for tiny windows). */
export function velocityOnly(q: Float64Array, dt: number, halfWindow: number): Float64Array {
  return savgolFilter(q, dt, { halfWindow, order: Math.min(4, 2 * halfWindow), derivative: 1 });
}
