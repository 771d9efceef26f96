// The design's energy H(q, v) as an EnergyFunction: the formula of design.model.energy through
// our formula language, with its gradient by symbolic differentiation
// (engine/formula/energy-function.ts), so the controller runs on exactly the function the design
// document states — no learned-model code is needed to arm it.
import type { Coordinate, EnergyFunction } from '../engine/types.ts';
import { energyFromFormula } from '../engine/formula/index.ts';

/** Compiles H(q, v) and [dH/dq, dH/dv]; formula errors are rethrown as TypeError naming `where`. */
export function compileDesignEnergy(formula: string, coordinate: Coordinate, lambda: number, where = 'design.model.energy'): EnergyFunction {
  return energyFromFormula(formula, coordinate, lambda, { where });
}
