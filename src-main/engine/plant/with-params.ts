// A copy of a plant with some parameters scaled (parameter mismatch for Monte Carlo trials).
import { compilePlant, PlantSpecError } from './compile-plant.ts';
import type { Plant } from './types.ts';

/** Returns a new plant whose parameter p is plant.params[p] * scale[p]; the others are kept. */
export function withParams(plant: Plant, scale: Readonly<Record<string, number>>): Plant {
  if (typeof scale !== 'object' || scale === null || Array.isArray(scale)) {
    throw new PlantSpecError('scale', 'expected an object of parameter name: factor');
  }
  const names = Object.keys(plant.params);
  // Null prototype: a parameter called "__proto__" is a plain key here too.
  const params = Object.assign(Object.create(null) as Record<string, number>, plant.params);
  for (const [k, factor] of Object.entries(scale)) {
    if (!Object.prototype.hasOwnProperty.call(plant.params, k)) {
      throw new PlantSpecError(`scale.${k}`, `no such parameter; expected one of ${names.join(', ') || '(none)'}`);
    }
    if (typeof factor !== 'number' || !Number.isFinite(factor)) throw new PlantSpecError(`scale.${k}`, `expected a finite number, got ${String(factor)}`);
    params[k] = plant.params[k] * factor;
  }
  return compilePlant({ ...plant.spec, params });
}
