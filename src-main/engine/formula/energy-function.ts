// An energy H(q, v) written in our formula language as an EnergyFunction: H compiled to closures
// and its gradient [dH/dq, dH/dv] by symbolic differentiation (./differentiate.ts). Used wherever
// a controller must run on exactly the function a document states (designs, trial specs).
import type { Coordinate, EnergyFunction } from '../types.ts';
import { compileFormula } from './compile.ts';
import { differentiate } from './differentiate.ts';
import { parseFormula } from './parse.ts';

/** Formula errors are rethrown as TypeError prefixed with `where`. */
export function energyFromFormula(formula: string, coordinate: Coordinate, lambda: number, opts: { params?: Record<string, number>; where?: string } = {}): EnergyFunction {
  const where = opts.where ?? 'energy';
  if (typeof formula !== 'string') throw new TypeError(`${where}: expected a formula string in q and v, got ${typeof formula}`);
  if (!Number.isFinite(lambda)) throw new RangeError(`${where}: lambda must be a finite number, got ${lambda}`);
  const constants = opts.params ? { constants: opts.params } : {};
  let H, Hq, Hv;
  try {
    const ast = parseFormula(formula);
    const vars = ['q', 'v'];
    H = compileFormula(ast, vars, constants);
    Hq = compileFormula(differentiate(ast, 'q'), vars, constants);
    Hv = compileFormula(differentiate(ast, 'v'), vars, constants);
  } catch (e) {
    throw new TypeError(`${where}: ${(e as Error).message}`);
  }
  const x = new Float64Array(2);
  return {
    coordinate,
    lambda,
    H(q, v) { x[0] = q; x[1] = v; return H.eval(x); },
    grad(q, v, out) { x[0] = q; x[1] = v; out[0] = Hq.eval(x); out[1] = Hv.eval(x); },
  };
}
