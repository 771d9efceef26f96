// One closed-loop trial of a controller design, as the `trial` verb and the app's Trials step run
// it: the design against its own model's equations of motion (design.model.acceleration) or a
// plant the user wrote (plant.json, docs/plant-format.md), at the design's sample rate and delay,
// with an optional quantized noisy position sensor and a velocity estimator; scored by the
// engine/trial metrics beside the baselines of design.md §2 on the same metrics (LQR when the
// target is an equilibrium, the plain energy-pumping law with the same gain and limit, open loop);
// optionally a Monte Carlo over parameter mismatch (worker threads for level holds, this thread
// for staged designs: the worker pool runs single-stage laws only).
// Against the model, the mismatch scales three parameters of the plant
//   q'' = stiffness * F(q, v) + damping * lambda v + inputgain * g u,  F = design acceleration - lambda v - g u,
// (all 1 nominally). Bad settings throw TrialSettingsError naming the setting; an unusable plant
// throws the plant's or the model's own error (PlantSpecError, ModelFileError).
import { controllerFromDesign, type StageSwitch } from './supervisor.ts';
import { compileDesignEnergy } from './energy.ts';
import { ModelFileError } from './read-model.ts';
import type { ControllerDesign } from './types.ts';
import { compilePlant, type PlantSpec } from '../engine/plant/index.ts';
import {
  simulate, trialMetrics, sensorSigmas, compareWithBaselines, monteCarloLine, mismatchFactors, noiseStream,
  type EstimatorOptions, type SensorOptions, type TrialMetrics, type TrialSpec, type TrialOutcome, type TrialPlant, type Trace,
} from '../engine/trial/index.ts';
import { runMonteCarlo } from '../trial-workers/index.ts';
import { Pcg32 } from '../engine/signal/random.ts';
import { checkTrialSettings, type TrialSettings } from './trial-settings.ts';
import { finalStage } from './final-stage.ts';

export { MAX_TRIAL_SAMPLES, TrialSettingsError, checkTrialSettings, type TrialSettings } from './trial-settings.ts';
export { finalStage } from './final-stage.ts';

export interface TrialProgress {
  phase: 'nominal' | 'baselines' | 'monte-carlo';
  /** Monte Carlo runs done / total (0 / 0 outside the Monte Carlo). */
  done: number;
  total: number;
  converged: number;
  message: string;
}

export interface RunTrialOptions {
  /** The user's plant document (plant.json); default: the design's own model. */
  plant?: unknown;
  /** Where the plant came from, for messages and the outcome's "plant" field (default "model"). */
  plantLabel?: string;
  /** The design's name or file, for the outcome's "design" field. */
  designLabel?: string;
  /** Aborts the Monte Carlo (the nominal run and the baselines are short and always finish). */
  signal?: AbortSignal;
  onProgress?: (p: TrialProgress) => void;
}

/** One Monte Carlo run, for the spread plots (per-run figures the summary line only quantiles). */
export interface MonteCarloRunFigures {
  index: number;
  converged: boolean;
  timeToBand: number | null;
  finalRelError: number | null;
  peakU: number | null;
}

export interface DesignTrialResult {
  /** The JSON object `ergostat trial` prints (non-finite numbers become null when stringified). */
  outcome: Record<string, unknown>;
  /** The nominal run's trace (t, q, v, u, H and, for staged designs, stage). */
  trace: Trace;
  switches: StageSwitch[];
  /** Per-run Monte Carlo figures (empty without runs). */
  monteCarloRuns: MonteCarloRunFigures[];
  /** Warnings about the design (its failed checks). */
  warnings: string[];
}

/** The plant spec: the user's plant.json, or the design's own model with three mismatch factors. */
export function trialPlantSpec(design: ControllerDesign, user: unknown, where: string): PlantSpec {
  if (user !== undefined) {
    const p = compilePlant(user, where); // validates, naming the field
    if (p.coordinate !== design.model.coordinate) throw new ModelFileError(`${where}: coordinate is "${p.coordinate}" but the design is for a${design.model.coordinate === 'angle' ? 'n angle' : ' linear'} coordinate`);
    if (!p.controlAffine) throw new ModelFileError(`${where}: acceleration is not affine in u; the level-hold law needs q'' = f + g u`);
    return { coordinate: p.coordinate, acceleration: p.spec.acceleration, params: { ...p.params } };
  }
  const a = design.model.acceleration;
  if (a === null) throw new ModelFileError('the design has no equations of motion (its energy is not of the form 1/2 M(q) v^2 + V(q)): give the rig as --plant PLANT.json');
  const lam = String(design.model.lambda), g = String(design.input.gain);
  return {
    coordinate: design.model.coordinate,
    acceleration: `stiffness*((${a}) - (${lam})*v - (${g})*u) + damping*(${lam})*v + inputgain*(${g})*u`,
    params: { stiffness: 1, damping: 1, inputgain: 1 },
  };
}

function estimatorOptions(kind: 'difference' | 'observer', model: TrialPlant): EstimatorOptions {
  return kind === 'observer' ? { kind: 'observer', model } : { kind: 'difference' };
}

function sensorOptions(s: TrialSettings, design: ControllerDesign): SensorOptions {
  const o: SensorOptions = { noiseStd: s.noise };
  if (s.bits !== null) {
    o.bits = s.bits;
    o.range = s.range ?? (design.model.coordinate === 'angle' ? 2 * Math.PI : design.model.validRange.qMax - design.model.validRange.qMin);
  }
  return o;
}

/**
 * The well whose basin holds the middle of the final swing (linear rigs with wells: the basin of
 * well k runs between the barriers on either side of it); null for angles or without wells. The
 * energy metrics cannot tell wells of equal depth apart, so the outcome reports this beside them.
 */
export function finalWell(design: ControllerDesign, m: TrialMetrics | null): number | null {
  if (m === null || design.model.coordinate !== 'linear' || design.model.wells.length === 0) return null;
  const q = 0.5 * (m.qMin + m.qMax);
  for (const w of design.model.wells) {
    const left = design.model.barriers.filter((b) => b.q < w.q).reduce((a, b) => Math.max(a, b.q), -Infinity);
    const right = design.model.barriers.filter((b) => b.q > w.q).reduce((a, b) => Math.min(a, b.q), Infinity);
    if (q > left && q < right) return w.index;
  }
  return null;
}

function row(design: ControllerDesign, name: string, status: string, message: string, m: TrialMetrics | null) {
  return { name, status, message, converged: m?.converged ?? false, finalWell: finalWell(design, m), metrics: m };
}

const figures = (index: number, converged: boolean, m: TrialMetrics | null): MonteCarloRunFigures => ({
  index, converged, timeToBand: m?.timeToBand ?? null, finalRelError: m ? m.finalRelError : null, peakU: m ? m.peakU : null,
});

export async function runDesignTrial(design: ControllerDesign, s: TrialSettings, opts: RunTrialOptions = {}): Promise<DesignTrialResult> {
  checkTrialSettings(s, design);
  const plantLabel = opts.plantLabel ?? 'model';
  const spec = trialPlantSpec(design, opts.plant, plantLabel);
  const energy = compileDesignEnergy(design.model.energy, design.model.coordinate, design.model.lambda);
  const warnings = design.checks.filter((c) => !c.ok).map((c) => `design check ${c.name}: ${c.detail}`);
  const report = (p: TrialProgress) => opts.onProgress?.(p);

  const nominal = compilePlant(spec, plantLabel);
  const modelPlant: TrialPlant = design.model.acceleration !== null ? compilePlant(trialPlantSpec(design, undefined, 'model'), 'model') : nominal;
  const sensor = sensorOptions(s, design);
  const estimator = estimatorOptions(s.estimator, modelPlant);
  const target = finalStage(design).target;
  const law = design.law;
  const T = 1 / design.sampleRateHz;
  const rng = () => { const r = new Pcg32(s.seed, 0); return () => r.uniform(); };
  const sim = {
    plant: nominal, energy, q0: s.q0, v0: s.v0, duration: s.duration, rateHz: design.sampleRateHz,
    delaySamples: design.delaySamples, sensor, estimator,
  };

  // The nominal run of the design, traced.
  report({ phase: 'nominal', done: 0, total: 0, converged: 0, message: 'simulating the design' });
  const controller = controllerFromDesign(design, { energy });
  // The stage column only for staged designs (a level hold is one stage).
  const staged = design.stages.length > 1 || design.transitions.length > 0;
  const run1 = staged ? controller : { reset: () => controller.reset(), step: (q: number, v: number, t: number, dt: number) => controller.step(q, v, t, dt) };
  const r = simulate({ ...sim, controller: run1, random: rng() });
  const sigmas = sensorSigmas(r.diagnostics.sensorStep, s.noise, T, estimator);
  const metricsOpt = { target: target.energy, Q: law.Q, R: law.R, energy, sensor: sigmas, bandFloor: restBandFloor(design, target) };
  const metrics = r.trace.t.length >= 2 ? trialMetrics(r.trace, metricsOpt) : null;
  const switches = controller.switches();

  // Baselines on the same setup and metrics.
  report({ phase: 'baselines', done: 0, total: 0, converged: 0, message: 'simulating the baselines' });
  const restWell = target.kind === 'at-rest' ? design.model.wells[target.well - 1] : undefined;
  const baselines = compareWithBaselines({
    sim, makeRandom: rng, metrics: metricsOpt, gain: Math.sqrt(law.Q / law.R), uMax: law.uMax ?? undefined,
    inputGain: design.input.gain, eps: law.eps, equilibrium: restWell?.q, model: modelPlant,
  }).map((b) => row(design, b.name, b.status, b.message, b.metrics));

  // Monte Carlo.
  let monteCarlo: unknown = null;
  const monteCarloRuns: MonteCarloRunFigures[] = [];
  if (s.runs !== null) {
    const runs = s.runs;
    const progress = (done: number, conv: number) =>
      report({ phase: 'monte-carlo', done, total: runs, converged: conv, message: `monte carlo: ${done} of ${runs} runs, ${conv} converged` });
    if (!staged) {
      const st = design.stages[0];
      const trial: TrialSpec = {
        plant: spec,
        energy: { H: design.model.energy, lambda: design.model.lambda },
        controller: {
          kind: 'level-hold', target: st.target.energy, inputGain: design.input.gain, Q: law.Q, R: law.R, eps: law.eps, lambda: law.lambda,
          uMax: law.uMax ?? undefined, rateMax: law.rateMax ?? undefined, meanB2: law.lossCompensation && st.meanB2 !== null ? st.meanB2 : undefined,
          integral: law.integral ? { Qw: law.integral.Qw, antiWindup: law.integral.antiWindup } : undefined,
        },
        q0: s.q0, v0: s.v0, duration: s.duration, rateHz: design.sampleRateHz, delaySamples: design.delaySamples, sensor,
        estimator: s.estimator === 'observer' ? { kind: 'observer' } : { kind: 'difference' },
        metrics: { target: target.energy, Q: law.Q, R: law.R },
      };
      const mc = await runMonteCarlo({ trial, runs, mismatch: s.mismatch, seed: s.seed }, {
        workers: s.workers, signal: opts.signal, onProgress: (p) => progress(p.completed, p.converged),
      });
      for (const x of mc.runs) monteCarloRuns.push(figures(x.index, x.outcome.converged, x.outcome.metrics));
      monteCarlo = { ...JSON.parse(monteCarloLine({
        status: mc.status, message: mc.message, runs, mismatch: s.mismatch, seed: s.seed,
        metrics: mc.runs.map((x) => x.outcome.metrics), converged: mc.runs.map((x) => x.outcome.converged),
      })), workers: mc.diagnostics.workers, wallMs: mc.diagnostics.wallMs };
    } else {
      // In this thread, with the same per-run draws as the pool (engine/trial/mismatch.ts).
      const t0 = performance.now();
      const outs: TrialOutcome[] = [];
      let conv = 0;
      for (let i = 0; i < runs; i++) {
        if (opts.signal?.aborted) break;
        const factors = mismatchFactors(Object.keys(spec.params), s.mismatch, s.seed, i);
        const plant = compilePlant({ ...spec, params: Object.fromEntries(Object.entries(spec.params).map(([k, v]) => [k, v * factors[k]])) }, 'model');
        const noise = new Pcg32(s.seed, noiseStream(i));
        const ri = simulate({ ...sim, plant, controller: controllerFromDesign(design, { energy }), random: () => noise.uniform() });
        const m = ri.trace.t.length >= 2 ? trialMetrics(ri.trace, metricsOpt) : null;
        const converged = ri.status === 'ok' && m !== null && m.converged;
        if (converged) conv++;
        outs.push({ status: ri.status, message: ri.message, converged, metrics: m });
        monteCarloRuns.push(figures(i, converged, m));
        progress(i + 1, conv);
        // Let an abort (and other messages) through between runs.
        if (opts.signal) await new Promise<void>((res) => setImmediate(res));
      }
      const cancelled = outs.length < runs;
      monteCarlo = { ...JSON.parse(monteCarloLine({
        status: cancelled ? 'cancelled' : 'ok',
        message: cancelled ? `cancelled after ${outs.length} of ${runs} runs (${conv} converged)` : `${conv} of ${runs} runs converged`,
        runs, mismatch: s.mismatch, seed: s.seed,
        metrics: outs.map((o) => o.metrics), converged: outs.map((o) => o.converged),
      })), workers: 0, wallMs: performance.now() - t0 };
    }
  }

  const outcome: Record<string, unknown> = {
    kind: 'trial', design: opts.designLabel ?? '', plant: plantLabel, status: r.status, message: r.message,
    target: { kind: target.kind, energy: target.energy, well: target.kind === 'at-rest' ? target.well : undefined },
    converged: metrics?.converged ?? false, finalWell: finalWell(design, metrics), metrics,
    switches: design.transitions.length > 0 ? switches : undefined,
    baselines, monteCarlo,
  };
  return { outcome, trace: r.trace, switches, monteCarloRuns, warnings };
}

/**
 * The band floor for a target at rest in a well: the energy of a swing whose amplitude is 2 % of
 * the way from the well bottom to its nearest barrier. Near the bottom the energy grows with the
 * square of the amplitude, so this is 0.02^2 of the well's depth (common practice for "at rest":
 * a small residual swing, not a fraction of a zero energy). Undefined for other targets.
 */
export function restBandFloor(design: ControllerDesign, target: { kind: string; energy: number; well?: number }): number | undefined {
  if (target.kind !== 'at-rest' || target.well === undefined) return undefined;
  const well = design.model.wells.find((w) => w.index === target.well);
  if (!well) return undefined;
  let depth = Infinity;
  for (const b of design.model.barriers) if (b.between.includes(well.index)) depth = Math.min(depth, b.energy - well.energy);
  if (!Number.isFinite(depth) || !(depth > 0)) return undefined;
  return 0.02 * 0.02 * depth;
}
