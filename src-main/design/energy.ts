// The design's energy H(q, v) as an EnergyFunction: the formula of design.model.energy parsed by
// our formula language (docs/formula-language.md) and its gradient by symbolic differentiation
// (engine/formula/differentiate.ts), so the controller runs on exactly the function the design
// document states — no learned-model code is needed to arm it.
import type { Coordinate, EnergyFunction } from '../engine/types.ts';
import { compileFormula, differentiate, parseFormula } from '../engine/formula/index.ts';

/** Compiles H(q, v) and [dH/dq, dH/dv]; formula errors are rethrown as TypeError naming `where`. */
export function compileDesignEnergy(formula: string, coordinate: Coordinate, lambda: number, where = 'design.model.energy'): EnergyFunction {
  if (typeof formula !== 'string') throw new TypeError(`${where}: expected a formula string in q and v, got ${typeof formula}`);
  if (!Number.isFinite(lambda)) throw new RangeError(`${where}: lambda must be a finite number, got ${lambda}`);
  let H, Hq, Hv;
  try {
    const ast = parseFormula(formula);
    const vars = ['q', 'v'];
    H = compileFormula(ast, vars);
    Hq = compileFormula(differentiate(ast, 'q'), vars);
    Hv = compileFormula(differentiate(ast, 'v'), vars);
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
