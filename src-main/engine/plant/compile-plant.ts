// Validates a plant spec (from a plant.json or a built-in) and compiles its formulas once, with
// the parameters folded in as constants. Every error names the field (`plant.params.l`) and, for
// formulas, carries the column of the offending character.
import { compileFormula, differentiate, dependsOn, FormulaError, isReservedName, parseFormula, type Ast, type CompiledFormula } from '../formula/index.ts';
import type { Coordinate } from '../types.ts';
import type { Plant, PlantInput, PlantSpec } from './types.ts';

/** A plant spec that cannot be used; field is the dotted path, column is set for formula errors. */
export class PlantSpecError extends Error {
  override name = 'PlantSpecError';
  readonly field: string;
  readonly column?: number;
  constructor(field: string, detail: string, column?: number) {
    super(`${field}: ${detail}`);
    this.field = field;
    this.column = column;
  }
}

/** Names a plant's formulas read: position, velocity, input, time. */
export const STATE_NAMES: readonly string[] = ['q', 'v', 'u', 't'];
const FIELDS = ['name', 'coordinate', 'acceleration', 'params', 'energy'];
const NAME = /^[A-Za-z_][A-Za-z0-9_]*$/;

const show = (x: unknown): string => (typeof x === 'string' ? JSON.stringify(x) : x === null ? 'null' : Array.isArray(x) ? 'an array' : typeof x === 'object' ? 'an object' : String(x));

function formula(src: unknown, field: string, vars: readonly string[], params: Record<string, number>): { ast: Ast; f: CompiledFormula } {
  if (typeof src !== 'string') throw new PlantSpecError(field, `expected a formula (a string), got ${show(src)}`);
  try {
    const ast = parseFormula(src);
    return { ast, f: compileFormula(ast, vars, { constants: params }) };
  } catch (e) {
    if (e instanceof FormulaError) throw new PlantSpecError(field, e.message, e.column);
    throw e;
  }
}

/**
 * Checks spec field by field and compiles it. `where` prefixes every error (a file name, or
 * 'plant'). Throws PlantSpecError on the first problem found.
 */
export function compilePlant(spec: unknown, where = 'plant'): Plant {
  if (typeof spec !== 'object' || spec === null || Array.isArray(spec)) {
    throw new PlantSpecError(where, `expected an object with fields coordinate, acceleration, params, got ${show(spec)}`);
  }
  const s = spec as Record<string, unknown>;
  for (const key of Object.keys(s)) {
    if (!FIELDS.includes(key)) throw new PlantSpecError(`${where}.${key}`, `unknown field; expected one of ${FIELDS.join(', ')}`);
  }
  if (s.name !== undefined && typeof s.name !== 'string') throw new PlantSpecError(`${where}.name`, `expected a string, got ${show(s.name)}`);
  if (s.coordinate !== 'angle' && s.coordinate !== 'linear') {
    throw new PlantSpecError(`${where}.coordinate`, `expected "angle" or "linear", got ${show(s.coordinate)}`);
  }
  const coordinate: Coordinate = s.coordinate;
  const rawParams = s.params === undefined ? {} : s.params;
  if (typeof rawParams !== 'object' || rawParams === null || Array.isArray(rawParams)) {
    throw new PlantSpecError(`${where}.params`, `expected an object of name: number, got ${show(rawParams)}`);
  }
  // A null-prototype copy: parameter names such as "__proto__" stay plain keys.
  const params = Object.create(null) as Record<string, number>;
  for (const [k, value] of Object.entries(rawParams as Record<string, unknown>)) {
    const field = `${where}.params.${k}`;
    if (!NAME.test(k)) throw new PlantSpecError(field, 'expected a parameter name (a letter or _, then letters, digits or _)');
    if (STATE_NAMES.includes(k)) throw new PlantSpecError(field, `the name is reserved for ${{ q: 'the position', v: 'the velocity', u: 'the input', t: 'time' }[k as 'q']}`);
    if (isReservedName(k)) throw new PlantSpecError(field, 'the name is reserved (a function or constant of the formula language)');
    if (typeof value !== 'number' || !Number.isFinite(value)) throw new PlantSpecError(field, `expected a finite number, got ${show(value)}`);
    params[k] = value;
  }
  Object.freeze(params);

  const acc = formula(s.acceleration, `${where}.acceleration`, STATE_NAMES, params);
  const dAcc = differentiate(acc.ast, 'u');
  const gain = compileFormula(dAcc, STATE_NAMES, { constants: params });
  const controlAffine = !dependsOn(dAcc, 'u');

  const buf = new Float64Array(4);
  const f = acc.f, g = gain;
  const accel = (q: number, v: number, u: number, t: number): number => {
    buf[0] = q; buf[1] = v; buf[2] = u; buf[3] = t;
    return f.eval(buf);
  };
  const inputGain = (q: number, v: number, u: number, t: number): number => {
    buf[0] = q; buf[1] = v; buf[2] = u; buf[3] = t;
    return g.eval(buf);
  };

  const frozenSpec: PlantSpec = { coordinate, acceleration: s.acceleration as string, params: { ...params } };
  if (s.name !== undefined) frozenSpec.name = s.name as string;
  let energy: Plant['energy'];
  let energyGrad: Plant['energyGrad'];
  if (s.energy !== undefined) {
    const e = formula(s.energy, `${where}.energy`, ['q', 'v'], params);
    const dq = compileFormula(differentiate(e.ast, 'q'), ['q', 'v'], { constants: params });
    const dv = compileFormula(differentiate(e.ast, 'v'), ['q', 'v'], { constants: params });
    const eb = new Float64Array(2);
    energy = (q, v) => { eb[0] = q; eb[1] = v; return e.f.eval(eb); };
    energyGrad = (q, v, out) => { eb[0] = q; eb[1] = v; out[0] = dq.eval(eb); out[1] = dv.eval(eb); };
    frozenSpec.energy = s.energy as string;
  }
  Object.freeze(frozenSpec.params);
  Object.freeze(frozenSpec);

  const rhs = (u?: PlantInput) => (t: number, y: Float64Array, dydt: Float64Array): void => {
    const q = y[0], v = y[1];
    const uu = u ? u(t, y) : 0;
    dydt[0] = v;
    dydt[1] = accel(q, v, uu, t);
  };

  const plant: Plant = { spec: frozenSpec, coordinate, params, accel, inputGain, controlAffine, rhs, ...(energy ? { energy, energyGrad } : {}) };
  return Object.freeze(plant);
}
