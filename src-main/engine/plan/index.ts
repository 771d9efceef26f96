// Public face of engine/plan: well-hop geometry, stage targets, switching conditions, multi-hop
// sequencing, rotation targets for angles, and the feasibility check and search (design.md §2).
export type { HopLeg, HopPlan, Landscape, PlanBarrier, PlanCondition, PlanStage, PlanTarget, PlanTransition, WellBounds } from './types.ts';
export { checkLandscape, wellBounds, wellAt, insideBasin } from './well-bounds.ts';
export { planRoute, type RouteOptions } from './route.ts';
export { resolveLevel, rotationTarget, topOfCircle, type LevelRequest } from './level.ts';
export { buildHopPlan, buildRotationPlan, type HopPlanOptions, type RotationPlanOptions } from './stages.ts';
export { startGrid, type StartState } from './start-grid.ts';
export { runClosedLoop, type LoopProblem, type LoopResult } from './closed-loop.ts';
export { judgePlan, type Judge, type RunOutcome, type RunStatus, type SwitchRecord } from './judge.ts';
export { checkCandidate, searchUMax, searchMargin, type Candidate, type FeasibilityProblem, type GridCheck, type SearchOptions, type SearchResult } from './feasibility.ts';
