// dH/dq and dH/dv of a learned model as formulas (for export and display), by symbolic
// differentiation of the model's formula with our formula package (formula/differentiate.ts).
import { differentiate, formatFormula, parseFormula } from '../formula/index.ts';
import type { EnergyModel } from './model.ts';

export function gradientFormulas(model: EnergyModel): { dHdq: string; dHdv: string } {
  if (model.status !== 'ok' || model.formula === '') throw new RangeError('gradientFormulas: the model has no conserved energy');
  const ast = parseFormula(model.formula);
  return { dHdq: formatFormula(differentiate(ast, 'q')), dHdv: formatFormula(differentiate(ast, 'v')) };
}
