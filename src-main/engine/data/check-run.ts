// Validation and clean-up of one run as read from a file: enough samples, a regular time step
// (median step; deviations beyond the tolerance are errors, steps beyond gapFactor x the median
// are gaps that split the run), a moving position; warnings for clipping and heavy quantization;
// angle unwrapping. Every change to the data is reported as a fix.
import type { Run } from '../types.ts';
import { DataError, type ColumnRef } from './data-error.ts';
import type { ResolvedColumns } from './csv-header.ts';
import { findClipping } from './clipping.ts';
import { fmt, plural } from './format.ts';
import { selectInPlace } from './median.ts';
import type { ResolvedOptions } from './options.ts';
import { estimateQuantization } from './quantization.ts';
import type { Notice, RunStats } from './types.ts';
import { unwrapAngle } from './unwrap.ts';

const STEP_SAMPLE = 1 << 16;

/** A run as the parser collected it: one label of the run column (or the whole file). */
export interface RawRun {
  /** File as the caller named it, and its name in messages. */
  file: string;
  display: string;
  /** The run column's label, when there is a run column. */
  label?: string;
  /** Name for the recording, e.g. "swing-a.csv run 2". */
  name: string;
  t: Float64Array;
  q: Float64Array;
  u?: Float64Array;
  /** Line of the first sample. */
  firstLine: number;
  /** For each skipped blank line inside the run, the index of the sample after it (ascending). */
  blanks: number[];
}

export interface RunContext {
  columns: ResolvedColumns;
  angle: boolean;
  opts: ResolvedOptions;
}

export interface CheckedRun {
  runs: Run[];
  stats: RunStats[];
  warnings: Notice[];
  fixes: Notice[];
}

/** Line of sample i of the run, counting skipped blank lines. */
function lineOfSample(raw: RawRun, i: number): number {
  const b = raw.blanks;
  let lo = 0;
  let hi = b.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (b[mid] <= i) lo = mid + 1;
    else hi = mid;
  }
  return raw.firstLine + i + lo;
}

/** Checks one run. Takes ownership of raw's arrays (an angle is unwrapped in place). */
export function checkRun(raw: RawRun, ctx: RunContext): CheckedRun {
  const { t, q, u, file, display } = raw;
  const { columns, opts } = ctx;
  const n = t.length;
  const lineOf = (i: number): number => lineOfSample(raw, i);
  const fail = (problem: string, line: number, column: ColumnRef): DataError => new DataError(file, problem, line, column, display);
  const what = raw.label !== undefined ? `run "${raw.label}"` : 'the recording';
  const span = n > 0 ? `lines ${raw.firstLine}–${lineOf(n - 1)}` : 'no lines';

  if (n < opts.minSamples) {
    throw fail(`${what} has ${plural(n, 'sample')} (${span}); at least ${opts.minSamples} are needed`, raw.firstLine, columns.run ?? columns.time);
  }

  // Median time step (steps are strictly positive: the parser has checked the order); on long
  // runs, the median of STEP_SAMPLE evenly spaced steps, which is as good for a regular clock.
  const m = n - 1;
  const stride = Math.max(1, Math.ceil(m / STEP_SAMPLE));
  const steps = new Float64Array(Math.ceil(m / stride));
  for (let i = 0, k = 0; i < m; i += stride, k++) steps[k] = t[i + 1] - t[i];
  const h = selectInPlace(steps, steps.length >> 1);
  const tol = opts.irregularTolerance;
  const lo = h * (1 - tol);
  const hi = h * (1 + tol);
  const gapAbove = h * opts.gapFactor;
  const cuts: number[] = [];
  for (let i = 1; i < n; i++) {
    const d = t[i] - t[i - 1];
    if (d >= lo && d <= hi) continue;
    if (d > gapAbove) { cuts.push(i); continue; }
    const off = (100 * Math.abs(d - h)) / h;
    throw fail(
      `irregular sampling: the step from t = ${fmt(t[i - 1])} s (line ${lineOf(i - 1)}) to t = ${fmt(t[i])} s is ${fmt(d, 4)} s, ` +
        `${fmt(off, 3)}% off the median step ${fmt(h, 4)} s of ${what} (tolerance ${fmt(100 * tol)}%; steps over ${fmt(opts.gapFactor)}x the median are gaps and split the run). ` +
        'If the time column is rounded, export it with more decimals',
      lineOf(i), columns.time);
  }

  let qmin = Infinity;
  let qmax = -Infinity;
  for (let i = 0; i < n; i++) {
    const v = q[i];
    if (v < qmin) qmin = v;
    if (v > qmax) qmax = v;
  }
  if (qmin === qmax) {
    throw fail(`the position is constant (${qmin}) over all ${n} samples of ${what} (${span}); a free-swing recording must move`, raw.firstLine, columns.position);
  }

  const unit = ctx.angle ? 'rad' : 'm';
  const pos = `position "${columns.position.name}"`;
  const warnings: Notice[] = [];
  const fixes: Notice[] = [];
  const notice = (code: string, message: string): Notice => ({ code, file, run: raw.name, message });
  const subject = raw.label !== undefined ? `${display} run "${raw.label}"` : display;

  // Warnings on the channel as recorded (before unwrapping, which would break the ADC's grid).
  const clip = findClipping(q, opts.clipSamples, { min: qmin, max: qmax });
  for (const [sideName, s] of [['minimum', clip.min], ['maximum', clip.max]] as const) {
    if (s.stretches === 0) continue;
    const a = s.longestStart;
    const more = s.stretches > 1 ? `; ${s.stretches} such stretches, ${s.samples} samples in all` : '';
    warnings.push(notice('clipping',
      `${subject}: ${pos} sits at its ${sideName} ${fmt(s.value)} ${unit} for ${s.longestLength} consecutive samples ` +
        `(lines ${lineOf(a)}–${lineOf(a + s.longestLength - 1)})${more}; the sensor may be clipping`));
  }
  const quant = estimateQuantization(q, { min: qmin, max: qmax });
  if (quant !== undefined && quant.levels < opts.quantLevels) {
    warnings.push(notice('quantization',
      `${subject}: ${pos} is heavily quantized: step ${fmt(quant.step, 4)} ${unit}, ${quant.levels} levels over its range ` +
        `(${quant.bits.toFixed(1)} bits, fewer than ${fmt(opts.quantLevels)} levels); velocity estimates will need strong smoothing`));
  }

  // Gaps split the run; pieces too short to be runs are dropped, each reported.
  for (const c of cuts) {
    const d = t[c] - t[c - 1];
    fixes.push(notice('gap-split',
      `split ${what} of ${display} at t = ${fmt(t[c])} s (line ${lineOf(c)}): gap of ${fmt(d, 4)} s after t = ${fmt(t[c - 1])} s, ` +
        `about ${plural(Math.max(1, Math.round(d / h) - 1), 'missing sample')}`));
  }
  const bounds = [0, ...cuts, n];
  const runs: Run[] = [];
  const stats: RunStats[] = [];
  let wraps = 0;
  for (let k = 0; k + 1 < bounds.length; k++) {
    const a = bounds[k];
    const b = bounds[k + 1];
    const whole = a === 0 && b === n;
    if (b - a < opts.minSamples) {
      fixes.push(notice('short-piece-dropped',
        `dropped ${plural(b - a, 'sample')} of ${what} of ${display} (t = ${fmt(t[a])}..${fmt(t[b - 1])} s, lines ${lineOf(a)}–${lineOf(b - 1)}): ` +
          `a stretch between gaps shorter than the ${opts.minSamples} samples a run needs`));
      continue;
    }
    const name = whole ? raw.name : `${raw.name} [${fmt(t[a])}..${fmt(t[b - 1])} s]`;
    const pq = whole ? q : q.slice(a, b);
    if (ctx.angle) wraps += unwrapAngle(pq, pq).wraps; // in place: pq is ours
    const run: Run = { name, source: file, t: whole ? t : t.slice(a, b), q: pq };
    if (u !== undefined) run.u = whole ? u : u.slice(a, b);
    runs.push(run);
    let mn = Infinity;
    let mx = -Infinity;
    for (let i = 0; i < pq.length; i++) {
      const v = pq[i];
      if (v < mn) mn = v;
      if (v > mx) mx = v;
    }
    const st: RunStats = {
      name, file, samples: b - a, sampleRate: 1 / h, duration: t[b - 1] - t[a], min: mn, max: mx,
      firstLine: lineOf(a), lastLine: lineOf(b - 1),
    };
    if (quant !== undefined) st.quantStep = quant.step;
    stats.push(st);
  }
  if (wraps > 0) {
    fixes.push(notice('unwrapped',
      `unwrapped the angle of ${what} of ${display}: removed ${plural(wraps, 'wrap')} of 2π (jumps of more than π between samples)`));
  }
  return { runs, stats, warnings, fixes };
}
