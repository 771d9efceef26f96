// `ergostat check`: imports CSV recordings and prints, per run, what the later steps will rely
// on — sampling, range, sensor noise, the Savitzky–Golay window for the velocity and the damping
// from the log decrement — with every fix and warning of the import.
import type { Io, Verb } from '../cli.ts';
import { UsageError, numberValue, optionalValue, parseArgs, requiredValue, type OptionSpec } from './args.ts';
import { DataError, importRecordings, type ColumnMapping, type ImportResult, type Notice, type RunStats } from '../recordings/index.ts';
import { analyseRun, type AnalyseRunOptions, type RunAnalysis } from '../engine/signal/index.ts';

const USAGE = 'usage: ergostat check REC.csv [...] --time COL --position COL [--run COL] [--input COL] [--angle] [--window N] [--order P]\n'
  + '  COL is a header name or a 1-based column number; --angle: the position is an angle in radians.\n'
  + '  --window N: Savitzky-Golay window length in samples (odd, >= 3); --order P: its polynomial order.\n'
  + '  Without them both are chosen per run from the noise level and the sample rate.';

const SPEC: Record<string, OptionSpec> = {
  time: { kind: 'value' },
  position: { kind: 'value' },
  run: { kind: 'value' },
  input: { kind: 'value' },
  angle: { kind: 'flag' },
  window: { kind: 'value' },
  order: { kind: 'value' },
  help: { kind: 'flag' },
};

function column(args: ReturnType<typeof parseArgs>, name: string, required: boolean): string | undefined {
  const v = required ? requiredValue(args, name) : optionalValue(args, name);
  if (v !== undefined && v.trim() === '') throw new UsageError(`option --${name} expects a column name or number, got an empty string`);
  return v;
}

function savgolOverride(args: ReturnType<typeof parseArgs>): AnalyseRunOptions['savgol'] {
  const window = numberValue(args, 'window');
  const order = numberValue(args, 'order');
  const out: NonNullable<AnalyseRunOptions['savgol']> = {};
  if (window !== undefined) {
    if (!Number.isInteger(window) || window < 3 || window % 2 === 0) throw new UsageError(`option --window expects an odd number of samples >= 3, got ${window}`);
    out.halfWindow = (window - 1) / 2;
  }
  if (order !== undefined) {
    if (!Number.isInteger(order) || order < 1 || order > 10) throw new UsageError(`option --order expects an integer from 1 to 10, got ${order}`);
    if (window !== undefined && window <= order) throw new UsageError(`option --window (${window}) must exceed --order (${order})`);
    out.order = order;
  }
  return window === undefined && order === undefined ? undefined : out;
}

const fmt = (x: number, digits = 4): string => (Number.isFinite(x) ? Number(x.toPrecision(digits)).toString() : String(x));

function describeRun(stats: RunStats, a: RunAnalysis, io: Io): void {
  const u = a.unit;
  io.out(`  samples      ${a.samples} at ${fmt(a.sampleRate, 6)} Hz, duration ${fmt(a.duration, 6)} s (lines ${stats.firstLine}-${stats.lastLine})`);
  io.out(`  position     ${fmt(a.min)} .. ${fmt(a.max)} ${u} (amplitude range ${fmt(a.max - a.min)} ${u})`);
  const quant = a.noise.quantStep > 0 ? `, quantization step ${fmt(a.noise.quantStep, 3)} ${u}` : '';
  io.out(`  noise        sigma ${fmt(a.noise.sigma, 3)} ${u} (${a.noise.method})${quant}`);
  const s = a.savgol;
  io.out(`  Savitzky-Golay window ${2 * s.halfWindow + 1} samples (half window ${s.halfWindow}), order ${s.order}; `
    + `estimated velocity error ${fmt(s.velocityRmsError, 3)} ${u}/s RMS`);
  io.out(`               ${s.reason}`);
  const ld = a.logDecrement;
  if (ld.status === 'ok') {
    io.out(`  damping      ratio ${fmt(ld.zeta)} (log decrement ${fmt(ld.delta)} from ${ld.peaks.length} peaks about ${fmt(ld.equilibrium)} ${u}, period ${fmt(ld.period)} s)`);
  } else {
    io.out(`  damping      not measured (${ld.status}): ${ld.message}`);
  }
}

function notices(title: string, list: Notice[], io: Io): void {
  io.out(`${title}: ${list.length === 0 ? 'none' : ''}`.trimEnd());
  for (const n of list) io.out(`  [${n.code}] ${n.run ?? n.file}: ${n.message}`);
}

export const run: Verb = async (argv, io) => {
  const args = parseArgs(argv, SPEC);
  if (args.flags.has('help')) {
    io.out(USAGE);
    return 0;
  }
  if (args.positional.length === 0) throw new UsageError(`no recording given\n${USAGE}`);
  const mapping: ColumnMapping = {
    time: column(args, 'time', true)!,
    position: column(args, 'position', true)!,
    angle: args.flags.has('angle'),
  };
  const runCol = column(args, 'run', false);
  const inputCol = column(args, 'input', false);
  if (runCol !== undefined) mapping.run = runCol;
  if (inputCol !== undefined) mapping.input = inputCol;
  const override = savgolOverride(args);

  let imported: ImportResult;
  try {
    imported = await importRecordings(args.positional, mapping);
  } catch (e) {
    if (e instanceof DataError) {
      io.err(`ergostat check: ${e.message}`);
      return 1;
    }
    throw e;
  }
  const { recording, stats, channels } = imported;
  io.out(`${recording.runs.length} run(s) from ${args.positional.length} file(s); `
    + `time "${channels.time}", position "${channels.position}" (${recording.coordinate === 'angle' ? 'angle, rad' : 'displacement, m'})`
    + (channels.input !== undefined ? `, input "${channels.input}"` : ''));
  recording.runs.forEach((r, i) => {
    io.out('');
    io.out(`${r.name}${r.u ? ' (with input)' : ''}`);
    let analysis: RunAnalysis;
    try {
      analysis = analyseRun(r, recording.coordinate, override ? { savgol: override } : {});
    } catch (e) {
      if (!(e instanceof RangeError || e instanceof TypeError)) throw e;
      const st = stats[i];
      io.out(`  samples      ${st.samples} at ${fmt(st.sampleRate, 6)} Hz, duration ${fmt(st.duration, 6)} s (lines ${st.firstLine}-${st.lastLine})`);
      io.out(`  analysis skipped: ${e.message}`);
      return;
    }
    describeRun(stats[i], analysis, io);
  });
  io.out('');
  notices('fixes', imported.fixes, io);
  notices('warnings', imported.warnings, io);
  return 0;
};
