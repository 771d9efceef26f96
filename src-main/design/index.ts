// Public face of src-main/design: the controller design document (types.ts), the supervisor that
// runs it, its validation, the model-file reader and the level-hold designer.
export * from './types.ts';
export { controllerFromDesign, conditionHolds, wrapAngle } from './supervisor.ts';
export type { Supervisor, SupervisorOptions, StageSwitch } from './supervisor.ts';
export { compileDesignEnergy } from './energy.ts';
export { readDesign, DesignError, DESIGN_LIMITS } from './validate.ts';
export { readEnergyModel, ModelFileError } from './read-model.ts';
export { designLevelHold, energyFormula, SATURATION_BAND } from './level-hold.ts';
export type { LevelHoldOptions, LevelTargetRequest } from './level-hold.ts';
export { motionFromEnergy } from './motion.ts';
export type { MotionFromEnergy } from './motion.ts';
export { DesignRefusal } from './refusal.ts';
