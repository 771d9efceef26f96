// A trial described as plain data (JSON-safe), so that it can cross a worker-thread boundary or
// be stored: the plant as plant.json (docs/plant-format.md, compiled by engine/plant), the model
// energy as a formula, the controller design, and the simulation settings.
// buildTrial() validates the description once, naming the field, and compiles it to the objects
// simulate() drives; runTrialSpec() runs it and scores it.
import type { LevelHoldDesign } from '../control/level-hold.ts';
import type { Coordinate, EnergyFunction } from '../types.ts';
import type { Controller, EstimatorOptions, TrialPlant } from './types.ts';
import { energyFromFormula } from '../formula/index.ts';
import { compilePlant, withParams, type PlantSpec } from '../plant/index.ts';
import { energyPump, openLoop } from './energy-pump.ts';
import { levelHoldController } from './level-hold-adapter.ts';
import { simulate, type SimulateOptions, type SimulateResult } from './simulate.ts';
import { trialMetrics, type TrialMetrics } from './metrics.ts';
import { sensorSigmas } from './energy-resolution.ts';
import { Pcg32 } from '../signal/random.ts';

export type { PlantSpec };

/** The model's energy H(q, v; params) as a formula, with its Koopman eigenvalue. */
export interface EnergySpec {
  H: string;
  params?: Record<string, number>;
  lambda?: number;
}

/** The level-hold design as plain data: LevelHoldDesign of engine/control without the energy (taken from trial.energy), with the target as a number. */
export type LevelHoldSpec = Omit<LevelHoldDesign, 'energy' | 'target'> & { kind: 'level-hold'; target: number };

export type ControllerSpec =
  | LevelHoldSpec
  | { kind: 'energy-pump'; target: number; gain: number; uMax?: number; inputGain?: number; eps?: number; integral?: number }
  | { kind: 'open-loop' };

/** The simulation settings are simulate()'s own (documented there); the rest is plain data. */
export interface TrialSpec extends Pick<SimulateOptions, 'q0' | 'v0' | 'duration' | 'rateHz' | 'innerSteps' | 'delaySamples' | 'sensor'> {
  plant: PlantSpec;
  energy: EnergySpec;
  controller: ControllerSpec;
  /** 'difference' (default, optional cutoffHz) or 'observer' on the nominal plant formula, or 'ideal'. */
  estimator?: { kind: 'difference'; cutoffHz?: number } | { kind: 'observer'; bandwidthHz?: number; zeta?: number } | { kind: 'ideal' };
  /** Seed of the sensor noise (PCG32, stream = noiseStream). Default 0. */
  noiseSeed?: number;
  noiseStream?: number;
  /** Metric settings: target energy and weights. */
  metrics: { target: number; Q?: number; R?: number; bandRelative?: number };
}

export interface BuiltTrial {
  plant: TrialPlant;
  /** The plant with its nominal parameters (for an observer on the model). */
  nominal: TrialPlant;
  energy: EnergyFunction;
  controller: Controller;
}

function isObject(x: unknown): x is Record<string, unknown> {
  return typeof x === 'object' && x !== null && !Array.isArray(x);
}

function finite(x: unknown, where: string): number {
  if (typeof x !== 'number' || !Number.isFinite(x)) throw new RangeError(`${where}: expected a finite number, got ${JSON.stringify(x)}`);
  return x;
}

function checkParams(p: unknown, where: string): Record<string, number> {
  if (p === undefined) return {};
  if (!isObject(p)) throw new TypeError(`${where}: expected an object of name: number`);
  for (const [k, v] of Object.entries(p)) finite(v, `${where}.${k}`);
  return p as Record<string, number>;
}

/** Compiles the model energy H(q, v) and its gradient (symbolic derivatives, formula/differentiate). */
export function compileEnergySpec(spec: EnergySpec, coordinate: Coordinate, where = 'energy'): EnergyFunction {
  if (!isObject(spec)) throw new TypeError(`${where}: expected an object {H, params, lambda}`);
  if (typeof spec.H !== 'string') throw new TypeError(`${where}.H: expected a formula string in q and v`);
  const params = checkParams(spec.params, `${where}.params`);
  const lambda = spec.lambda === undefined ? 0 : finite(spec.lambda, `${where}.lambda`);
  return energyFromFormula(spec.H, coordinate, lambda, { params, where: `${where}.H` });
}

export function buildController(spec: ControllerSpec, energy: EnergyFunction, where = 'controller'): Controller {
  if (typeof spec !== 'object' || spec === null) throw new TypeError(`${where}: expected an object with a kind`);
  if (spec.kind === 'open-loop') return openLoop();
  if (spec.kind === 'level-hold') {
    // Field errors come from makeLevelHold as "design.<field>", i.e. <where>.<field>.
    return levelHoldController({
      energy, target: spec.target, inputGain: spec.inputGain, Q: spec.Q, R: spec.R, eps: spec.eps, lambda: spec.lambda,
      uMax: spec.uMax, rateMax: spec.rateMax, meanB2: spec.meanB2, integral: spec.integral,
    });
  }
  if (spec.kind === 'energy-pump') {
    return energyPump({ energy, target: finite(spec.target, `${where}.target`), gain: finite(spec.gain, `${where}.gain`), uMax: spec.uMax, inputGain: spec.inputGain, eps: spec.eps, integral: spec.integral });
  }
  throw new TypeError(`${where}.kind: expected "level-hold", "energy-pump" or "open-loop", got ${JSON.stringify((spec as { kind: unknown }).kind)}`);
}

/** Validates and compiles a trial; `scale` multiplies plant parameters by factors (mismatch, engine/plant withParams). */
export function buildTrial(spec: TrialSpec, scale?: Record<string, number>): BuiltTrial {
  if (!isObject(spec)) throw new TypeError('trial: expected an object');
  const nominal = compilePlant(spec.plant, 'trial.plant');
  const plant = scale ? withParams(nominal, scale) : nominal;
  const energy = compileEnergySpec(spec.energy, nominal.coordinate, 'trial.energy');
  const controller = buildController(spec.controller, energy, 'trial.controller');
  return { plant, nominal, energy, controller };
}

/** Share of the final cycles at the input limit above which a failed trial is blamed on uMax. */
export const SATURATED_HINT = 0.5;

export interface TrialOutcome {
  status: SimulateResult['status'];
  message: string;
  converged: boolean;
  metrics: TrialMetrics | null;
}

/** Runs one described trial (optionally with plant parameters scaled by factors) and scores it. */
export function runTrialSpec(spec: TrialSpec, scale?: Record<string, number>): { outcome: TrialOutcome; result: SimulateResult } {
  const built = buildTrial(spec, scale);
  if (!isObject(spec.metrics)) throw new TypeError('trial.metrics: expected an object {target, Q, R}');
  const target = finite(spec.metrics.target, 'trial.metrics.target');
  const rng = new Pcg32(spec.noiseSeed ?? 0, spec.noiseStream ?? 0);
  let estimator: EstimatorOptions;
  const e = spec.estimator ?? { kind: 'difference' };
  if (e.kind === 'observer') estimator = { kind: 'observer', model: built.nominal, bandwidthHz: e.bandwidthHz, zeta: e.zeta };
  else if (e.kind === 'difference' || e.kind === 'ideal') estimator = e;
  else throw new TypeError(`trial.estimator.kind: expected "difference", "observer" or "ideal", got ${JSON.stringify((e as { kind: unknown }).kind)}`);
  const result = simulate({
    plant: built.plant, energy: built.energy, controller: built.controller,
    q0: spec.q0, v0: spec.v0, duration: spec.duration, rateHz: spec.rateHz, innerSteps: spec.innerSteps,
    delaySamples: spec.delaySamples, sensor: spec.sensor, estimator, random: () => rng.uniform(),
  });
  const T = result.diagnostics.T;
  const uMax = spec.controller.kind !== 'open-loop' && spec.controller.uMax !== undefined && Number.isFinite(spec.controller.uMax) ? spec.controller.uMax : undefined;
  const metrics = result.trace.t.length >= 2
    ? trialMetrics(result.trace, { ...spec.metrics, target, uMax, energy: built.energy, sensor: sensorSigmas(result.diagnostics.sensorStep, spec.sensor?.noiseStd ?? 0, T, estimator) })
    : null;
  const converged = result.status === 'ok' && metrics !== null && metrics.converged;
  let message = result.message;
  if (result.status === 'ok' && metrics && !converged && metrics.saturatedShare !== null && metrics.saturatedShare > SATURATED_HINT) {
    // Reported, not hidden: the limit, not the law, is what stops the energy from reaching the band.
    message = `not converged: |u| sat at uMax = ${uMax} for ${(100 * metrics.saturatedShare).toFixed(0)}% of the last cycles; uMax may be too small to reach or hold H* = ${target} against the losses`;
  }
  return { outcome: { status: result.status, message, converged, metrics }, result };
}
