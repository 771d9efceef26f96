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
// The trial itself is design/run-trial.ts (shared with the app); this file reads files and options.
import { writeFile } from 'node:fs/promises';
import type { Verb } from '../cli.ts';
import { UsageError, numberValue, optionalValue, parseArgs, requiredValue, type OptionSpec, type ParsedArgs } from './args.ts';
import { readJsonFile } from './design.ts';
import { ModelFileError } from '../design/read-model.ts';
import { DesignError, readDesign } from '../design/validate.ts';
import type { ControllerDesign } from '../design/types.ts';
import { PlantSpecError } from '../engine/plant/index.ts';
import { traceToCsv } from '../export/csv.ts';
import { MAX_TRIAL_SAMPLES, runDesignTrial, type DesignTrialResult, type TrialSettings } from '../design/run-trial.ts';

const USAGE = [
  'usage: ergostat trial DESIGN.json [--plant PLANT.json] --q0 Q --v0 V --duration S [--runs N [--mismatch P] [--workers K]]',
  '         [--sensor-bits B [--sensor-range R]] [--noise SIGMA] [--estimator difference|observer] [--seed N] --out TRIAL.csv',
  '  Without --plant the design is tried on its own model (q\'\' derived from H). --runs N: Monte Carlo, every plant',
  '  parameter scaled by a factor uniform in [1 - P, 1 + P]. --sensor-bits B over R (default 2 pi for angles, the',
  '  recorded span for linear rigs), --noise SIGMA: position noise (unit of q). --estimator: how the controller gets',
  '  the velocity: observer (default: on the design\'s learned model, as a rig with a good model would) or',
  '  difference (filtered backward difference, model-free; it lags, see docs/trial-format.md).',
  '  --seed: noise and mismatch seed (default 0).',
].join('\n');

const SPEC: Record<string, OptionSpec> = {
  plant: { kind: 'value' }, q0: { kind: 'value' }, v0: { kind: 'value' }, duration: { kind: 'value' },
  runs: { kind: 'value' }, mismatch: { kind: 'value' }, workers: { kind: 'value' },
  'sensor-bits': { kind: 'value' }, 'sensor-range': { kind: 'value' }, noise: { kind: 'value' }, estimator: { kind: 'value' },
  seed: { kind: 'value' }, out: { kind: 'value' }, help: { kind: 'flag' },
};

interface Settings extends TrialSettings { out: string; plantPath: string | null }

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
  // The observer by default: the filtered difference lags, and a stiff energy law then chases a
  // phantom energy error at twice the swing frequency (measured in docs/trial-format.md).
  const est = optionalValue(args, 'estimator') ?? 'observer';
  if (est !== 'difference' && est !== 'observer') throw new UsageError(`option --estimator expects "difference" or "observer", got "${est}"`);
  const seed = int('seed', 0, Number.MAX_SAFE_INTEGER) ?? 0;
  return { q0, v0, duration, runs, mismatch: mismatch ?? 0, workers: workers ?? 1, bits, range, noise, estimator: est, seed, out: requiredValue(args, 'out'), plantPath: optionalValue(args, 'plant') ?? null };
}

export const run: Verb = async (argv, io) => {
  const args = parseArgs(argv, SPEC);
  if (args.flags.has('help')) { io.out(USAGE); return 0; }
  if (args.positional.length !== 1) throw new UsageError(`expected one design file, got ${args.positional.length}\n${USAGE}`);
  const s = settings(args);
  const designPath = args.positional[0];
  let design: ControllerDesign, plant: unknown;
  try {
    design = readDesign(await readJsonFile(designPath, 'controller design'), designPath);
    plant = s.plantPath === null ? undefined : await readJsonFile(s.plantPath, 'plant');
  } catch (e) {
    if (e instanceof ModelFileError || e instanceof DesignError || e instanceof PlantSpecError) { io.err(`ergostat trial: ${e.message}`); return 1; }
    throw e;
  }
  if (s.duration * design.sampleRateHz > MAX_TRIAL_SAMPLES) throw new UsageError(`--duration ${s.duration} s at ${design.sampleRateHz} Hz is more than ${MAX_TRIAL_SAMPLES} controller samples`);
  for (const c of design.checks) if (!c.ok) io.err(`warning: design check ${c.name}: ${c.detail}`);

  // Ctrl-C stops the Monte Carlo; what finished is still reported.
  const ac = new AbortController();
  const onSig = () => ac.abort();
  process.once('SIGINT', onSig);
  let r: DesignTrialResult;
  try {
    r = await runDesignTrial(design, s, {
      plant, plantLabel: s.plantPath ?? 'model', designLabel: designPath, signal: ac.signal,
      onProgress: (p) => {
        if (p.phase === 'monte-carlo' && (p.done === p.total || p.done % Math.max(1, Math.floor(p.total / 10)) === 0)) io.err(p.message);
      },
    });
  } catch (e) {
    if (e instanceof ModelFileError || e instanceof DesignError || e instanceof PlantSpecError) { io.err(`ergostat trial: ${e.message}`); return 1; }
    throw e;
  } finally {
    process.removeListener('SIGINT', onSig);
  }
  try {
    await writeFile(s.out, traceToCsv(r.trace));
  } catch (e) {
    io.err(`ergostat trial: cannot write ${s.out} (${(e as NodeJS.ErrnoException).code ?? (e as Error).message})`);
    return 1;
  }
  io.out(JSON.stringify(r.outcome));
  return 0;
};
