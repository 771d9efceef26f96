// Public face of engine/control: the CARE solvers and the level-hold (SDRE energy) law.
export { solveCare } from './care.ts';
export type { CareProblem, CareOptions, CareResult, CareStatus, CareFailure, Eigenvalues } from './care.ts';
export { care2, care2Work, solveCare2, CARE2_OK, CARE2_NO_STABILIZING_SOLUTION, CARE2_NOT_CONVERGED } from './care2.ts';
export type { Care2Work } from './care2.ts';
export { solveCareScalar } from './care-scalar.ts';
export type { ScalarCareResult } from './care-scalar.ts';
export { levelHoldGain } from './energy-gain.ts';
export { meanSquareInputGain } from './orbit-average.ts';
export type { OrbitAverageProblem, OrbitAverageOptions, OrbitAverageResult } from './orbit-average.ts';
export { targetFromEnergy, targetFromAmplitude, targetAtRest } from './targets.ts';
export type { LevelTarget } from './targets.ts';
export { makeLevelHold } from './level-hold.ts';
export type { LevelHold, LevelHoldDesign, LevelHoldOutput, LevelHoldState } from './level-hold.ts';
export type { MatrixInput } from './matrix-input.ts';
