// The learned model as the controller's EnergyFunction (src-main/engine/types.ts).
import type { EnergyFunction } from '../types.ts';
import { modelEvaluator, type EnergyModel } from './model.ts';

export function toEnergyFunction(model: EnergyModel): EnergyFunction {
  if (model.status !== 'ok') throw new RangeError(`toEnergyFunction: the model has no conserved energy (${model.verdict.reason})`);
  const e = modelEvaluator(model);
  return { coordinate: model.coordinate, H: e.H, grad: e.grad, lambda: model.lambda };
}
