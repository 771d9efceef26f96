// Public face of engine/trial: closed-loop trials, their metrics, the baselines, trial specs.
export type { TrialPlant, Controller, SensorOptions, EstimatorOptions, Trace } from './types.ts';
export { simulate, type SimulateOptions, type SimulateResult } from './simulate.ts';
export { makeSensor, sensorStep, wrapAngle, type Sensor } from './sensor.ts';
export { makeVelocityEstimator, DEFAULT_CUTOFF_HZ, DEFAULT_OBSERVER_HZ, DEFAULT_OBSERVER_ZETA, type VelocityEstimator } from './velocity-estimator.ts';
export { gaussianSource, type UniformSource } from './gaussian.ts';
export { cycleAverages, DEFAULT_MAX_WINDOW, type CycleAverages } from './cycle-average.ts';
export { timeToBand } from './band-entry.ts';
export { energyResolution, sensorSigmas, type SensorSigmas } from './energy-resolution.ts';
export { trialMetrics, type MetricsOptions, type TrialMetrics } from './metrics.ts';
export { energyPump, openLoop, type EnergyPumpOptions } from './energy-pump.ts';
export { levelHoldController, type LevelHoldController } from './level-hold-adapter.ts';
export { lqrBaseline, type LqrBaselineOptions, type LqrBaselineResult } from './lqr-baseline.ts';
export { compareWithBaselines, type BaselineSetup, type BaselineRow } from './baselines.ts';
export { mismatchFactors, noiseStream } from './mismatch.ts';
export {
  buildTrial, buildController, compileEnergySpec, runTrialSpec,
  type TrialSpec, type PlantSpec, type EnergySpec, type ControllerSpec, type LevelHoldSpec, type BuiltTrial, type TrialOutcome,
} from './trial-spec.ts';
export { metricsLine, monteCarloLine, type MonteCarloSummaryInput } from './report.ts';
