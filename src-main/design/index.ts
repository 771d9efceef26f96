// Public face of src-main/design: the controller design document (types.ts), the supervisor that
// runs it, and (as they land) its validation and the level-hold designer.
export * from './types.ts';
export { controllerFromDesign, conditionHolds, wrapAngle } from './supervisor.ts';
export type { Supervisor, SupervisorOptions, StageSwitch } from './supervisor.ts';
export { compileDesignEnergy } from './energy.ts';
export { readDesign, DesignError, DESIGN_LIMITS } from './validate.ts';
