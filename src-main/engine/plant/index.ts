// Plants: second-order rigs written as an acceleration formula (docs/plant-format.md), compiled
// to fast functions and a first-order right-hand side for the ODE solvers.
export type { Plant, PlantInput, PlantSpec } from './types.ts';
export { compilePlant, PlantSpecError, STATE_NAMES } from './compile-plant.ts';
export { withParams } from './with-params.ts';
export { builtinPlant, builtinPlantSpec, BUILTIN_PLANT_NAMES, type BuiltinPlantName } from './builtin.ts';
