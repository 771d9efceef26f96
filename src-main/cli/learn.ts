// `ergostat learn`: imports free-swing (and optionally forced) recordings, learns the conserved
// energy (engine/learn), writes the model file and prints a summary.
// Exit codes: 0 energy found, 3 none found (the model file is still written with the diagnostics),
// 1 data error, 2 usage error.
import type { Io, Verb } from '../cli.ts';
import { UsageError, numberValue, optionalValue, parseArgs, requiredValue, type OptionSpec } from './args.ts';
import { DataError, importRecordings, type ColumnMapping } from '../recordings/index.ts';
import { learnEnergy, type EnergyModel, type LearnOptions } from '../engine/learn/index.ts';
import { writeModelFile } from '../model/index.ts';
import { userTerm } from '../engine/learn/userTerm.ts';

const USAGE = 'usage: ergostat learn REC.csv [...] --time COL --position COL [--run COL] [--input COL] [--angle]\n'
  + '                     [--mass KG] [--degree D] [--term FORMULA ...] [--odd-v] --out model.json\n'
  + '  COL is a header name or a 1-based column number; --angle: the position is an angle in radians.\n'
  + '  --mass: mass in kg (moment of inertia in kg m^2 for angles) to express H in joules;\n'
  + '  without it a forced run (non-zero --input column, in N or N m) calibrates the scale when present.\n'
  + '  --degree: largest library degree (default 6, angles 4); --term: an extra library term in q and v;\n'
  + '  --odd-v: also allow odd powers of v (rigs with gyroscopic forces).\n'
  + '  Exit: 0 energy found, 3 no conserved energy (model file still written), 1 data error, 2 usage error.';

const SPEC: Record<string, OptionSpec> = {
  time: { kind: 'value' }, position: { kind: 'value' }, run: { kind: 'value' }, input: { kind: 'value' },
  angle: { kind: 'flag' }, mass: { kind: 'value' }, degree: { kind: 'value' }, term: { kind: 'value', repeat: true },
  'odd-v': { kind: 'flag' }, out: { kind: 'value' }, help: { kind: 'flag' },
};

const fmt = (x: number | null | undefined, digits = 4): string => (x === null || x === undefined ? 'n/a' : Number.isFinite(x) ? Number(x.toPrecision(digits)).toString() : String(x));

function column(args: ReturnType<typeof parseArgs>, name: string, required: boolean): string | undefined {
  const v = required ? requiredValue(args, name) : optionalValue(args, name);
  if (v !== undefined && v.trim() === '') throw new UsageError(`option --${name} expects a column name or number, got an empty string`);
  return v;
}

export function summary(m: EnergyModel, io: Io): void {
  const x = m.metrics;
  io.out(`data        ${x.runs} run(s), ${x.freeRuns} free, ${x.forcedRuns} forced; ${x.samples} samples at ${fmt(1 / x.dt, 6)} Hz; noise ${fmt(x.noiseSigma, 3)}, signal/noise ${fmt(x.signalToNoise, 3)}`);
  if (m.status !== 'ok') {
    io.out(`verdict     NO CONSERVED ENERGY (${m.verdict.code}): ${m.verdict.reason}`);
    io.out(`what to try ${m.verdict.advice}`);
    return;
  }
  io.out(`energy      H(q, v) = ${m.formula}   [${m.units}]`);
  io.out(`method      weak form, Savitzky-Golay window ${2 * x.halfWindow + 1} samples (${fmt(x.windowSeconds)} s, order ${x.savgolOrder}), lags ${x.lagsSeconds.map((l) => fmt(l)).join(', ')} s, degree ${m.library.degree}`);
  io.out(`conserved   non-conservation ${fmt(x.mu1, 3)} (held out ${fmt(x.heldOut, 3)}), spectral gap ${fmt(x.gap, 3)}, near-conserved functions ${x.nullSpaceDimension}, sparsity threshold ${x.sparsityThreshold}`);
  if (x.derivativeForm) io.out(`cross-check derivative form: lambda ${fmt(x.derivativeForm.lambda)} 1/s, agreement ${fmt(x.derivativeForm.agreement, 6)}`);
  const d = m.damping;
  io.out(`damping     lambda ${fmt(d.lambda)} 1/s; zeta ${fmt(d.zetaFromLambda)} from lambda (omega_n ${fmt(d.omegaN)} rad/s, period ${fmt(d.period)} s), ${fmt(d.zetaLogDecrement)} from the log decrement`);
  const s = m.scale;
  io.out(`scale       ${s.mass !== null ? `mass ${fmt(s.mass)} (${s.massSource})` : 'per unit mass (no --mass, no forced run)'}${s.inputGain !== null ? `; input gain ${fmt(s.inputGain)} from forced runs (R^2 ${fmt(s.forcedRunR2)})` : ''}`);
  if (m.landscape) {
    for (const w of m.landscape.wells) io.out(`well ${w.index}      q = ${fmt(w.q, 6)}, V = ${fmt(w.V, 6)}`);
    for (const b of m.landscape.barriers) io.out(`barrier     q = ${fmt(b.q, 6)}, V = ${fmt(b.V, 6)} between wells ${b.between[0]} and ${b.between[1]}`);
    if (m.coverage) io.out(`recorded    H from ${fmt(m.coverage.energyMin)} to ${fmt(m.coverage.energyMax)} (0.5th-99.5th percentile per free run), q ${fmt(m.coverage.qMin)} .. ${fmt(m.coverage.qMax)}, |v| up to ${fmt(m.coverage.vMaxAbs)}: designs refuse targets above this range`);
  }
  if (m.structure.separable) {
    io.out(`structure   H = 1/2 M(q) v^2 + V(q), M(q) = ${m.structure.massFormula}`);
    const worst = m.replay.reduce((a, r) => Math.max(a, r.relativeError), 0);
    io.out(`replay      ${m.replay.length} run(s) from their initial states, worst RMS error ${fmt(100 * worst, 3)} % of the run's range`);
  } else {
    io.out(`structure   not of the form 1/2 M(q) v^2 + V(q) (share ${fmt(m.structure.nonSeparableShare, 3)}); no equations of motion derived`);
  }
}

export const run: Verb = async (argv, io) => {
  const args = parseArgs(argv, SPEC);
  if (args.flags.has('help')) { io.out(USAGE); return 0; }
  if (args.positional.length === 0) throw new UsageError(`no recording given\n${USAGE}`);
  const out = requiredValue(args, 'out');
  const mapping: ColumnMapping = { time: column(args, 'time', true)!, position: column(args, 'position', true)!, angle: args.flags.has('angle') };
  const runCol = column(args, 'run', false), inputCol = column(args, 'input', false);
  if (runCol !== undefined) mapping.run = runCol;
  if (inputCol !== undefined) mapping.input = inputCol;
  const opts: LearnOptions = {};
  const mass = numberValue(args, 'mass');
  if (mass !== undefined) {
    if (!(mass > 0)) throw new UsageError(`option --mass expects a positive number (kg), got ${mass}`);
    opts.mass = mass;
  }
  const degree = numberValue(args, 'degree');
  if (degree !== undefined) {
    if (!Number.isInteger(degree) || degree < 1 || degree > 12) throw new UsageError(`option --degree expects an integer from 1 to 12, got ${degree}`);
    opts.maxDegree = degree;
  }
  if (args.flags.has('odd-v')) opts.oddV = true;
  const terms = args.values.get('term') ?? [];
  for (const t of terms) {
    try { userTerm(t); } catch (e) { throw new UsageError(`option --term: "${t}" is not a formula in q and v: ${(e as Error).message}`); }
  }
  if (terms.length) opts.userTerms = terms;

  let model: EnergyModel;
  try {
    const imported = await importRecordings(args.positional, mapping);
    for (const w of imported.warnings) io.err(`warning [${w.code}] ${w.run ?? w.file}: ${w.message}`);
    model = learnEnergy(imported.recording, opts);
  } catch (e) {
    if (e instanceof DataError || e instanceof RangeError) { io.err(`ergostat learn: ${e.message}`); return 1; }
    throw e;
  }
  summary(model, io);
  try {
    await writeModelFile(out, model);
  } catch (e) {
    io.err(`ergostat learn: cannot write ${out}: ${(e as Error).message}`);
    return 1;
  }
  io.out(`model       written to ${out}`);
  return model.status === 'ok' ? 0 : 3;
};
