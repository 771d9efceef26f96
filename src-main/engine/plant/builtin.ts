// The built-in plants, written in our own formula language. Convention for the linear ones:
// the stiffness coefficients a, b are per unit mass (q'' = ... - a q - b q^3, units 1/s^2 and
// 1/(m^2 s^2)), c is the viscous damping per unit mass (1/s), the input u is a force (N) and
// enters as u/m, and the energy is in joules: H = m v^2/2 + m V(q) with V the potential per
// unit mass. The pendulum's input is a torque (N m) about the pivot.
//
// pendulum     q'' = -(g/l) sin q - c q' + u/(m l^2),  H = m l^2 v^2/2 - m g l cos q
// duffing      q'' = -a q - b q^3 - c q' + u/m,        H = m v^2/2 + m a q^2/2 + m b q^4/4   (hardening)
// double-well  q'' =  a q - b q^3 - c q' + u/m,        H = m v^2/2 - m a q^2/2 + m b q^4/4   (wells at +-sqrt(a/b))
// quartic      q'' = -b q^3 - c q' + u/m,              H = m v^2/2 + m b q^4/4
import { compilePlant, PlantSpecError } from './compile-plant.ts';
import type { Plant, PlantSpec } from './types.ts';

export type BuiltinPlantName = 'pendulum' | 'duffing' | 'double-well' | 'quartic';

const SPECS = new Map<string, PlantSpec>([
  ['pendulum', {
    name: 'pendulum',
    coordinate: 'angle',
    acceleration: '-(g/l)*sin(q) - c*v + u/(m*l^2)',
    energy: 'm*l^2*v^2/2 - m*g*l*cos(q)',
    params: { m: 0.5, l: 0.42, g: 9.81, c: 0.05 },
  }],
  ['duffing', {
    name: 'duffing',
    coordinate: 'linear',
    acceleration: '-a*q - b*q^3 - c*v + u/m',
    energy: 'm*v^2/2 + m*a*q^2/2 + m*b*q^4/4',
    params: { m: 1, a: 1, b: 1, c: 0.02 },
  }],
  ['double-well', {
    name: 'double-well',
    coordinate: 'linear',
    acceleration: 'a*q - b*q^3 - c*v + u/m',
    energy: 'm*v^2/2 - m*a*q^2/2 + m*b*q^4/4',
    params: { m: 1, a: 1, b: 1, c: 0.02 },
  }],
  ['quartic', {
    name: 'quartic',
    coordinate: 'linear',
    acceleration: '-b*q^3 - c*v + u/m',
    energy: 'm*v^2/2 + m*b*q^4/4',
    params: { m: 1, b: 1, c: 0.02 },
  }],
]);

export const BUILTIN_PLANT_NAMES: readonly BuiltinPlantName[] = [...SPECS.keys()] as BuiltinPlantName[];

/** The spec of a built-in plant (a fresh copy), with some parameters replaced. */
export function builtinPlantSpec(name: string, params: Readonly<Record<string, number>> = {}): PlantSpec {
  const base = typeof name === 'string' ? SPECS.get(name) : undefined;
  if (!base) throw new PlantSpecError('name', `${JSON.stringify(name)} is not a built-in plant; expected one of ${BUILTIN_PLANT_NAMES.join(', ')}`);
  if (typeof params !== 'object' || params === null || Array.isArray(params)) throw new PlantSpecError(`${name}.params`, 'expected an object of name: number');
  const merged: Record<string, number> = { ...base.params };
  for (const [k, v] of Object.entries(params)) {
    if (!Object.prototype.hasOwnProperty.call(base.params, k)) {
      throw new PlantSpecError(`${name}.params.${k}`, `no such parameter; expected one of ${Object.keys(base.params).join(', ')}`);
    }
    merged[k] = v; // value checked by compilePlant
  }
  return { ...base, params: merged };
}

/** A built-in plant compiled, e.g. builtinPlant('pendulum', { c: 0 }). */
export function builtinPlant(name: BuiltinPlantName | string, params: Readonly<Record<string, number>> = {}): Plant {
  return compilePlant(builtinPlantSpec(name, params), String(name));
}
