// `ergostat design`: reads an energy model (model.json from `ergostat learn`), designs a
// controller for it and writes the design document (design.json; docs/design-format.md).
// Level hold (SDRE energy level, src-main/design/level-hold.ts) by default; with --to-well, a
// well hop (src-main/design/hop.ts, loaded only when asked for). Prints a summary with the
// design's checks (failed ones as warnings) and the safety cautions, since the design arms a
// controller. Exit codes: 0 written, 1 data error (unreadable or invalid model, target refused),
// 2 usage error.
import { readFile, writeFile } from 'node:fs/promises';
import type { Io, Verb } from '../cli.ts';
import { UsageError, numberValue, optionalValue, parseArgs, requiredValue, type OptionSpec, type ParsedArgs } from './args.ts';
import type { EnergyModel } from '../engine/learn/index.ts';
import type { ControllerDesign } from '../design/types.ts';
import { designLevelHold, type LevelTargetRequest } from '../design/level-hold.ts';
import { readEnergyModel, ModelFileError } from '../design/read-model.ts';
import { DesignRefusal } from '../design/refusal.ts';
import { SAFETY_CAUTIONS, SAFETY_DEFERENCE } from '../safety.ts';

const USAGE = [
  'usage: ergostat design MODEL.json (--target-energy E | --target-amplitude A | --at-rest) [--well K]',
  '         [--weights Q,R] [--umax U] [--rate HZ] [--integral] [--mass KG | --input-gain G] --out DESIGN.json',
  '       ergostat design MODEL.json --to-well K [--from-well K] [--level E | --amplitude A | --at-rest] [--margin F] --umax U',
  '         [--rate HZ] [--mass KG | --input-gain G] --out DESIGN.json',
  '  --target-energy E: hold the energy E (in the model\'s unit, J once calibrated);',
  '  --target-amplitude A: hold a swing of amplitude A about the bottom of the well (H* = V(q_well + A));',
  '  --at-rest: bring the rig to rest at the bottom of the well; --well K: the well (default: nearest the centre of the recordings).',
  '  --weights Q,R: weights on (H - H*)^2 and u^2 (default: the law reaches u_max at 15% energy error);',
  '  --umax U: actuator limit |u| <= U; --rate HZ: controller sample rate (default 1000); --integral: integral action.',
  '  --mass KG (kg m^2 for an angle) or --input-gain G: needed when the model is per unit mass (the law computes u in the input\'s unit).',
  '  --to-well K: a staged hop into well K (stage 1 over the barrier, stage 2 to --level/--amplitude/--at-rest in well K);',
  '  --from-well K: the start well (needed with three or more wells); --margin F: raise to the barrier + F x its height (default 0.1).',
].join('\n');

/**
 * The option table. Options are grouped by what uses them, so a new design kind adds its own group
 * here and a branch in `run` without touching the others.
 */
const COMMON: Record<string, OptionSpec> = {
  out: { kind: 'value' }, umax: { kind: 'value' }, rate: { kind: 'value' },
  mass: { kind: 'value' }, 'input-gain': { kind: 'value' }, 'at-rest': { kind: 'flag' }, help: { kind: 'flag' },
};
const LEVEL_HOLD: Record<string, OptionSpec> = {
  'target-energy': { kind: 'value' }, 'target-amplitude': { kind: 'value' }, well: { kind: 'value' },
  weights: { kind: 'value' }, integral: { kind: 'flag' },
};
const WELL_HOP: Record<string, OptionSpec> = {
  'to-well': { kind: 'value' }, level: { kind: 'value' }, amplitude: { kind: 'value' }, margin: { kind: 'value' }, 'from-well': { kind: 'value' },
};
const SPEC: Record<string, OptionSpec> = { ...COMMON, ...LEVEL_HOLD, ...WELL_HOP };

const fmt = (x: number) => (Number.isFinite(x) ? Number(x.toPrecision(5)).toString() : String(x));

/** Reads and parses a JSON file; problems are data errors naming the file. */
export async function readJsonFile(path: string, what: string): Promise<unknown> {
  let text: string;
  try {
    text = await readFile(path, 'utf8');
  } catch (e) {
    throw new ModelFileError(`${path}: cannot read the ${what} (${(e as NodeJS.ErrnoException).code ?? (e as Error).message})`);
  }
  if (text.length > 64 * 1024 * 1024) throw new ModelFileError(`${path}: the ${what} is larger than 64 MB`);
  try {
    return JSON.parse(text.charCodeAt(0) === 0xfeff ? text.slice(1) : text);
  } catch (e) {
    throw new ModelFileError(`${path}: not valid JSON (${(e as Error).message})`);
  }
}

function positiveOption(args: ParsedArgs, name: string): number | undefined {
  const x = numberValue(args, name);
  if (x !== undefined && !(x > 0)) throw new UsageError(`option --${name} expects a positive number, got ${x}`);
  return x;
}

function intOption(args: ParsedArgs, name: string): number | undefined {
  const x = numberValue(args, name);
  if (x !== undefined && (!Number.isInteger(x) || x < 1)) throw new UsageError(`option --${name} expects a whole number >= 1, got ${x}`);
  return x;
}

/** --mass / --input-gain: at most one. */
function calibration(args: ParsedArgs): { mass?: number; inputGain?: number } {
  const mass = positiveOption(args, 'mass');
  const inputGain = numberValue(args, 'input-gain');
  if (mass !== undefined && inputGain !== undefined) throw new UsageError('give --mass or --input-gain, not both');
  if (inputGain !== undefined && inputGain === 0) throw new UsageError('option --input-gain expects a non-zero number, got 0');
  return { mass, inputGain };
}

function levelHoldTarget(args: ParsedArgs): LevelTargetRequest {
  const e = numberValue(args, 'target-energy');
  const a = numberValue(args, 'target-amplitude');
  const rest = args.flags.has('at-rest');
  const given = (e !== undefined ? 1 : 0) + (a !== undefined ? 1 : 0) + (rest ? 1 : 0);
  if (given !== 1) throw new UsageError(`give exactly one target: --target-energy E, --target-amplitude A or --at-rest${given > 1 ? ' (several were given)' : ''}\n${USAGE}`);
  const well = intOption(args, 'well');
  if (e !== undefined) return { kind: 'energy', energy: e, well };
  if (a !== undefined) {
    if (a === 0) throw new UsageError('option --target-amplitude expects a non-zero amplitude (use --at-rest for rest)');
    return { kind: 'amplitude', amplitude: a, well };
  }
  return { kind: 'at-rest', well };
}

function weights(args: ParsedArgs): { Q: number; R: number } | undefined {
  const raw = optionalValue(args, 'weights');
  if (raw === undefined) return undefined;
  const parts = raw.split(',');
  const nums = parts.map((p) => Number(p));
  if (parts.length !== 2 || parts.some((p) => p.trim() === '') || !nums.every((x) => Number.isFinite(x) && x > 0)) {
    throw new UsageError(`option --weights expects two positive numbers Q,R (e.g. --weights 100,1), got "${raw}"`);
  }
  return { Q: nums[0], R: nums[1] };
}

/** A copy of the model calibrated by the user's mass or input gain, for designers that read model.scale (well hops). */
function calibratedModel(model: EnergyModel, cal: { mass?: number; inputGain?: number }): EnergyModel {
  const m = structuredClone(model);
  if (cal.mass !== undefined) {
    const f = model.units === 'J' && model.scale.mass ? cal.mass / model.scale.mass : cal.mass;
    m.coefficients = m.coefficients.map((c) => c * f);
    m.offset *= f;
    if (m.landscape) {
      m.landscape.wells = m.landscape.wells.map((w) => ({ ...w, V: w.V * f }));
      m.landscape.barriers = m.landscape.barriers.map((b) => ({ ...b, V: b.V * f }));
    }
    m.units = 'J';
    m.scale = { ...m.scale, mass: cal.mass, massSource: 'given', inputGain: 1 / cal.mass, joulesPerModelUnit: cal.mass };
  } else if (cal.inputGain !== undefined) {
    m.scale = { ...m.scale, inputGain: cal.inputGain };
  }
  return m;
}

async function wellHop(model: EnergyModel, args: ParsedArgs, source: string): Promise<ControllerDesign> {
  for (const name of Object.keys(LEVEL_HOLD)) {
    if (args.values.has(name) || args.flags.has(name)) throw new UsageError(`option --${name} is for level-hold designs, not with --to-well`);
  }
  let hop: typeof import('../design/hop.ts');
  try {
    hop = await import('../design/hop.ts');
  } catch (e) {
    throw new UsageError(`well hops are not available in this build (${(e as Error).message.split('\n')[0]})`);
  }
  const toWell = intOption(args, 'to-well')!;
  const e = numberValue(args, 'level'), a = numberValue(args, 'amplitude');
  const rest = args.flags.has('at-rest');
  if ((e !== undefined ? 1 : 0) + (a !== undefined ? 1 : 0) + (rest ? 1 : 0) > 1) throw new UsageError('give at most one of --level E, --amplitude A, --at-rest');
  const level = e !== undefined ? { kind: 'energy' as const, energy: e } : a !== undefined ? { kind: 'amplitude' as const, amplitude: a } : { kind: 'at-rest' as const };
  const uMax = positiveOption(args, 'umax');
  if (uMax === undefined) throw new UsageError('a well hop needs the actuator limit --umax U');
  const cal = calibration(args);
  if (model.units !== 'J' && cal.mass === undefined && cal.inputGain === undefined && !(model.scale.inputGain && model.scale.inputGain > 0)) {
    throw new DesignRefusal('the model is not calibrated (energy per unit mass, no mass given, no forced run), and the law computes u in the input\'s physical unit: give --mass or --input-gain');
  }
  try {
    return hop.designWellHop(calibratedModel(model, cal), {
      toWell, fromWell: intOption(args, 'from-well'), level, uMax, margin: numberValue(args, 'margin'), sampleRateHz: positiveOption(args, 'rate'), source,
    });
  } catch (err) {
    if (err instanceof RangeError || err instanceof TypeError) throw new DesignRefusal(err.message);
    throw err;
  }
}

function summary(d: ControllerDesign, out: string, io: Io): void {
  const u = d.input.unit || 'model input unit';
  io.out(`design: ${d.kind}, ${d.stages.length} stage${d.stages.length > 1 ? 's' : ''}, written to ${out}`);
  for (const s of d.stages) {
    const t = s.target;
    const what = t.kind === 'amplitude' ? `swing amplitude ${fmt(t.amplitude)}` : t.kind === 'at-rest' ? `at rest in well ${t.well}` : t.kind === 'rotation' ? `rotation at ${fmt(t.speed)} rad/s` : 'energy';
    io.out(`  stage ${s.index} (${s.name}): ${what}, H* = ${fmt(t.energy)} ${d.model.units}${s.meanB2 !== null ? `, <b^2> = ${fmt(s.meanB2)}` : ''}`);
  }
  for (const tr of d.transitions) io.out(`  switch ${tr.from} -> ${tr.to}: ${tr.reason}`);
  const l = d.law;
  io.out(`  law: SDRE energy level, Q = ${fmt(l.Q)}, R = ${fmt(l.R)}, eps = ${fmt(l.eps)}, lambda = ${fmt(l.lambda)} 1/s, `
    + `u_max = ${l.uMax === null ? 'none' : `${fmt(l.uMax)} ${u}`}, rate limit ${l.rateMax === null ? 'none' : fmt(l.rateMax)}, `
    + `integral ${l.integral ? `on (Qw = ${fmt(l.integral.Qw)})` : 'off'}, loss compensation ${l.lossCompensation ? 'on' : 'off'}`);
  io.out(`  input: g = ${fmt(d.input.gain)} (u in ${u}); controller at ${fmt(d.sampleRateHz)} Hz`);
  io.out('checks:');
  for (const c of d.checks) io.out(`  [${c.ok ? 'ok' : 'WARNING'}] ${c.name}: ${c.detail}`);
  for (const c of d.checks) if (!c.ok) io.err(`warning: ${c.name}: ${c.detail}`);
  io.out('safety: this design arms a controller that puts energy into hardware.');
  for (const c of SAFETY_CAUTIONS) io.out(`  - ${c}`);
  io.out(`  ${SAFETY_DEFERENCE}`);
}

export const run: Verb = async (argv, io) => {
  const args = parseArgs(argv, SPEC);
  if (args.flags.has('help')) { io.out(USAGE); return 0; }
  if (args.positional.length !== 1) throw new UsageError(`expected one model file, got ${args.positional.length}\n${USAGE}`);
  const modelPath = args.positional[0];
  const out = requiredValue(args, 'out');
  const hop = args.values.has('to-well');
  if (!hop) {
    for (const name of Object.keys(WELL_HOP)) if (args.values.has(name)) throw new UsageError(`option --${name} needs --to-well K`);
  }
  // Usage is checked before any file is read.
  const target = hop ? null : levelHoldTarget(args);
  const w = hop ? undefined : weights(args);
  const cal = calibration(args);
  const uMax = positiveOption(args, 'umax');
  const rateHz = positiveOption(args, 'rate');
  try {
    const model = readEnergyModel(await readJsonFile(modelPath, 'energy model'), modelPath);
    const source = `energy model ${modelPath}`;
    const design = hop ? await wellHop(model, args, source)
      : designLevelHold(model, { target: target!, weights: w, uMax: uMax ?? null, rateHz, integral: args.flags.has('integral'), ...cal, source });
    try {
      await writeFile(out, `${JSON.stringify(design, null, 2)}\n`);
    } catch (e) {
      io.err(`ergostat design: cannot write ${out} (${(e as NodeJS.ErrnoException).code ?? (e as Error).message})`);
      return 1;
    }
    summary(design, out, io);
    return 0;
  } catch (e) {
    if (e instanceof ModelFileError) { io.err(`ergostat design: ${e.message}`); return 1; }
    if (e instanceof DesignRefusal) { io.err(`ergostat design: refused: ${e.message}`); return 1; }
    throw e;
  }
};
