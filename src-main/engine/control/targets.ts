// Energy targets H* for the level-hold law (design.md §2 "Wells and hops": a swing amplitude A
// means the turning-point energy H* = V(A), V(q) = H(q, 0)).
import type { EnergyFunction } from '../types.ts';

export interface LevelTarget {
  kind: 'energy' | 'amplitude' | 'rest';
  /** H*, in the energy function's units. */
  energy: number;
  /** Swing amplitude (kind 'amplitude'). */
  amplitude?: number;
}

export function targetFromEnergy(E: number): LevelTarget {
  if (!Number.isFinite(E)) throw new RangeError(`E: expected a finite energy, got ${E}`);
  return { kind: 'energy', energy: E };
}

/** H* = V(A) with V(q) = H(q, 0); V may be given as a function or as the EnergyFunction. */
export function targetFromAmplitude(A: number, V: ((q: number) => number) | EnergyFunction): LevelTarget {
  if (!Number.isFinite(A)) throw new RangeError(`A: expected a finite amplitude, got ${A}`);
  const e = typeof V === 'function' ? V(A) : V !== null && typeof V === 'object' && typeof V.H === 'function' ? V.H(A, 0) : NaN;
  if (typeof V !== 'function' && (V === null || typeof V !== 'object' || typeof V.H !== 'function')) {
    throw new TypeError('V: expected the potential V(q) as a function, or an EnergyFunction');
  }
  if (!Number.isFinite(e)) throw new RangeError(`V: V(${A}) = ${e} is not a finite energy`);
  return { kind: 'amplitude', energy: e, amplitude: A };
}

/** Bring the rig to rest: H* = the energy at the bottom of the well. */
export function targetAtRest(wellBottomEnergy: number): LevelTarget {
  if (!Number.isFinite(wellBottomEnergy)) throw new RangeError(`wellBottomEnergy: expected a finite energy, got ${wellBottomEnergy}`);
  return { kind: 'rest', energy: wellBottomEnergy };
}
