// `ergostat trial`: runs a controller design (design.json) in closed loop — against the model's own
// equations of motion (design.model.acceleration) or a plant the user wrote (plant.json,
// docs/plant-format.md) — with the design's sample rate and delay, an optional quantized noisy
// position sensor and a velocity estimator, and scores it (engine/trial metrics) beside the
// baselines on the same metrics (LQR when the target is an equilibrium, the plain energy-pumping
// law with the same gain and limit, open loop). With --runs N: Monte Carlo over parameter mismatch
// on worker threads (src-main/trial-workers). Writes the nominal run's trace as trial.csv
// (t,q,v,u,H[,stage]) and prints ONE JSON line on stdout; warnings and progress go to stderr.
// Against the model, the mismatch scales three parameters of the plant
//   q'' = stiffness * F(q, v) + damping * lambda v + inputgain * g u,  F = design acceleration - lambda v - g u,
// (all 1 nominally). Staged designs (well hops) run their Monte Carlo in this thread: the worker
// pool runs single-stage laws only. Exit codes: 0 done (whatever the outcome), 1 data error, 2 usage.
import { writeFile } from 'node:fs/promises';
import type { Verb } from '../cli.ts';
import { UsageError, numberValue, optionalValue, parseArgs, requiredValue, type OptionSpec, type ParsedArgs } from './args.ts';
import { readJsonFile } from './design.ts';
import { ModelFileError } from '../design/read-model.ts';
import { DesignError, readDesign } from '../design/validate.ts';
import { controllerFromDesign } from '../design/supervisor.ts';
import { compileDesignEnergy } from '../design/energy.ts';
import type { ControllerDesign } from '../design/types.ts';
import { compilePlant, PlantSpecError, type PlantSpec } from '../engine/plant/index.ts';
import {
  simulate, trialMetrics, sensorSigmas, compareWithBaselines, traceCsv, monteCarloLine, mismatchFactors, noiseStream,
  type EstimatorOptions, type SensorOptions, type TrialMetrics, type TrialSpec, type TrialOutcome, type TrialPlant,
} from '../engine/trial/index.ts';
import { runMonteCarlo } from '../trial-workers/index.ts';
import { Pcg32 } from '../engine/signal/random.ts';
import type { EnergyFunction } from '../engine/types.ts';

const USAGE = [
  'usage: ergostat trial DESIGN.json [--plant PLANT.json] --q0 Q --v0 V --duration S [--runs N [--mismatch P] [--workers K]]',
  '         [--sensor-bits B [--sensor-range R]] [--noise SIGMA] [--estimator difference|observer] [--seed N] --out TRIAL.csv',
  '  Without --plant the design is tried on its own model (q\'\' derived from H). --runs N: Monte Carlo, every plant',
  '  parameter scaled by a factor uniform in [1 - P, 1 + P]. --sensor-bits B over R (default 2 pi for angles, the',
  '  recorded span for linear rigs), --noise SIGMA: position noise (unit of q). --estimator: how the controller gets',
  '  the velocity (default difference: filtered backward difference). --seed: noise and mismatch seed (default 0).',
].join('\n');

const SPEC: Record<string, OptionSpec> = {
  plant: { kind: 'value' }, q0: { kind: 'value' }, v0: { kind: 'value' }, duration: { kind: 'value' },
  runs: { kind: 'value' }, mismatch: { kind: 'value' }, workers: { kind: 'value' },
  'sensor-bits': { kind: 'value' }, 'sensor-range': { kind: 'value' }, noise: { kind: 'value' }, estimator: { kind: 'value' },
  seed: { kind: 'value' }, out: { kind: 'value' }, help: { kind: 'flag' },
};

/** Longest trial accepted (samples), a guard against runaway memory: 10 million controller samples. */
const MAX_SAMPLES = 10_000_000;

interface Settings {
  q0: number; v0: number; duration: number; runs: number | null; mismatch: number; workers: number;
  bits: number | null; range: number | null; noise: number; estimator: 'difference' | 'observer'; seed: number; out: string; plantPath: string | null;
}

function settings(args: ParsedArgs): Settings {
  const req = (name: string) => { requiredValue(args, name); return numberValue(args, name)!; };
  const q0 = req('q0'), v0 = req('v0'), duration = req('duration');
  if (!(duration > 0)) throw new UsageError(`option --duration expects a positive number of seconds, got ${duration}`);
  const int = (name: string, lo: number, hi: number) => {
    const x = numberValue(args, name);
    if (x !== undefined && (!Number.isInteger(x) || x < lo || x > hi)) throw new UsageError(`option --${name} expects a whole number from ${lo} to ${hi}, got ${x}`);
    return x;
  };
  const runs = int('runs', 1, 100_000) ?? null;
  const mismatch = numberValue(args, 'mismatch');
  if (mismatch !== undefined && runs === null) throw new UsageError('option --mismatch needs --runs N');
  if (mismatch !== undefined && !(mismatch >= 0 && mismatch < 1)) throw new UsageError(`option --mismatch expects a fraction in [0, 1) (0.15 for +-15%), got ${mismatch}`);
  const workers = int('workers', 1, 64);
  if (workers !== undefined && runs === null) throw new UsageError('option --workers needs --runs N');
  const bits = int('sensor-bits', 1, 32) ?? null;
  const range = numberValue(args, 'sensor-range') ?? null;
  if (range !== null && !(range > 0)) throw new UsageError(`option --sensor-range expects a positive span, got ${range}`);
  if (range !== null && bits === null) throw new UsageError('option --sensor-range needs --sensor-bits B');
  const noise = numberValue(args, 'noise') ?? 0;
  if (!(noise >= 0)) throw new UsageError(`option --noise expects a standard deviation >= 0, got ${noise}`);
  const est = optionalValue(args, 'estimator') ?? 'difference';
  if (est !== 'difference' && est !== 'observer') throw new UsageError(`option --estimator expects "difference" or "observer", got "${est}"`);
  const seed = int('seed', 0, Number.MAX_SAFE_INTEGER) ?? 0;
  return { q0, v0, duration, runs, mismatch: mismatch ?? 0, workers: workers ?? 1, bits, range, noise, estimator: est, seed, out: requiredValue(args, 'out'), plantPath: optionalValue(args, 'plant') ?? null };
}

/** The plant spec: the user's plant.json, or the design's own model with three mismatch factors. */
function plantSpec(design: ControllerDesign, user: unknown, where: string): PlantSpec {
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

/** The stage the design ends in: the last stage no transition leaves (the last stage if every one is left). */
function finalStage(d: ControllerDesign) {
  for (let i = d.stages.length - 1; i >= 0; i--) if (!d.transitions.some((t) => t.from === d.stages[i].index)) return d.stages[i];
  return d.stages[d.stages.length - 1];
}

function estimatorOptions(kind: 'difference' | 'observer', model: TrialPlant): EstimatorOptions {
  return kind === 'observer' ? { kind: 'observer', model } : { kind: 'difference' };
}

function sensorOptions(s: Settings, design: ControllerDesign): SensorOptions {
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
 * energy metrics cannot tell wells of equal depth apart, so the JSON line reports this beside them.
 */
function finalWell(design: ControllerDesign, m: TrialMetrics | null): number | null {
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

export const run: Verb = async (argv, io) => {
  const args = parseArgs(argv, SPEC);
  if (args.flags.has('help')) { io.out(USAGE); return 0; }
  if (args.positional.length !== 1) throw new UsageError(`expected one design file, got ${args.positional.length}\n${USAGE}`);
  const s = settings(args);
  const designPath = args.positional[0];
  let design: ControllerDesign, spec: PlantSpec, energy: EnergyFunction;
  try {
    design = readDesign(await readJsonFile(designPath, 'controller design'), designPath);
    spec = plantSpec(design, s.plantPath === null ? undefined : await readJsonFile(s.plantPath, 'plant'), s.plantPath ?? 'model');
    energy = compileDesignEnergy(design.model.energy, design.model.coordinate, design.model.lambda);
  } catch (e) {
    if (e instanceof ModelFileError || e instanceof DesignError || e instanceof PlantSpecError) { io.err(`ergostat trial: ${e.message}`); return 1; }
    throw e;
  }
  if (s.duration * design.sampleRateHz > MAX_SAMPLES) throw new UsageError(`--duration ${s.duration} s at ${design.sampleRateHz} Hz is more than ${MAX_SAMPLES} controller samples`);
  for (const c of design.checks) if (!c.ok) io.err(`warning: design check ${c.name}: ${c.detail}`);

  const nominal = compilePlant(spec, s.plantPath ?? 'model');
  const modelPlant: TrialPlant = design.model.acceleration !== null ? compilePlant(plantSpec(design, undefined, 'model'), 'model') : nominal;
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
  const controller = controllerFromDesign(design, { energy });
  // The stage column only for staged designs (a level hold is one stage).
  const staged = design.stages.length > 1 || design.transitions.length > 0;
  const run1 = staged ? controller : { reset: () => controller.reset(), step: (q: number, v: number, t: number, dt: number) => controller.step(q, v, t, dt) };
  const r = simulate({ ...sim, controller: run1, random: rng() });
  const sigmas = sensorSigmas(r.diagnostics.sensorStep, s.noise, T, estimator);
  const metricsOpt = { target: target.energy, Q: law.Q, R: law.R, energy, sensor: sigmas };
  const metrics = r.trace.t.length >= 2 ? trialMetrics(r.trace, metricsOpt) : null;
  try {
    await writeFile(s.out, traceCsv(r.trace));
  } catch (e) {
    io.err(`ergostat trial: cannot write ${s.out} (${(e as NodeJS.ErrnoException).code ?? (e as Error).message})`);
    return 1;
  }
  const switches = controller.switches();

  // Baselines on the same setup and metrics.
  const restWell = target.kind === 'at-rest' ? design.model.wells[target.well - 1] : undefined;
  const baselines = compareWithBaselines({
    sim, makeRandom: rng, metrics: metricsOpt, gain: Math.sqrt(law.Q / law.R), uMax: law.uMax ?? undefined,
    inputGain: design.input.gain, eps: law.eps, equilibrium: restWell?.q, model: modelPlant,
  }).map((b) => row(design, b.name, b.status, b.message, b.metrics));

  // Monte Carlo.
  let monteCarlo: unknown = null;
  if (s.runs !== null) {
    const progress = (done: number, total: number, conv: number) => {
      if (done === total || done % Math.max(1, Math.floor(total / 10)) === 0) io.err(`monte carlo: ${done} of ${total} runs, ${conv} converged`);
    };
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
      const ac = new AbortController();
      const onSig = () => ac.abort();
      process.once('SIGINT', onSig);
      try {
        const mc = await runMonteCarlo({ trial, runs: s.runs, mismatch: s.mismatch, seed: s.seed }, {
          workers: s.workers, signal: ac.signal, onProgress: (p) => progress(p.completed, p.total, p.converged),
        });
        monteCarlo = { ...JSON.parse(monteCarloLine({
          status: mc.status, message: mc.message, runs: s.runs, mismatch: s.mismatch, seed: s.seed,
          metrics: mc.runs.map((x) => x.outcome.metrics), converged: mc.runs.map((x) => x.outcome.converged),
        })), workers: mc.diagnostics.workers, wallMs: mc.diagnostics.wallMs };
      } finally {
        process.removeListener('SIGINT', onSig);
      }
    } else {
      // In this thread, with the same per-run draws as the pool (engine/trial/mismatch.ts).
      const t0 = performance.now();
      const outs: TrialOutcome[] = [];
      let conv = 0;
      for (let i = 0; i < s.runs; i++) {
        const factors = mismatchFactors(Object.keys(spec.params), s.mismatch, s.seed, i);
        const plant = compilePlant({ ...spec, params: Object.fromEntries(Object.entries(spec.params).map(([k, v]) => [k, v * factors[k]])) }, 'model');
        const noise = new Pcg32(s.seed, noiseStream(i));
        const ri = simulate({ ...sim, plant, controller: controllerFromDesign(design, { energy }), random: () => noise.uniform() });
        const m = ri.trace.t.length >= 2 ? trialMetrics(ri.trace, metricsOpt) : null;
        const converged = ri.status === 'ok' && m !== null && m.converged;
        if (converged) conv++;
        outs.push({ status: ri.status, message: ri.message, converged, metrics: m });
        progress(i + 1, s.runs, conv);
      }
      monteCarlo = { ...JSON.parse(monteCarloLine({
        status: 'ok', message: `${conv} of ${s.runs} runs converged`, runs: s.runs, mismatch: s.mismatch, seed: s.seed,
        metrics: outs.map((o) => o.metrics), converged: outs.map((o) => o.converged),
      })), workers: 0, wallMs: performance.now() - t0 };
    }
  }

  io.out(JSON.stringify({
    kind: 'trial', design: designPath, plant: s.plantPath ?? 'model', status: r.status, message: r.message,
    target: { kind: target.kind, energy: target.energy, well: target.kind === 'at-rest' ? target.well : undefined },
    converged: metrics?.converged ?? false, finalWell: finalWell(design, metrics), metrics,
    switches: design.transitions.length > 0 ? switches : undefined,
    baselines, monteCarlo,
  }));
  return 0;
};
