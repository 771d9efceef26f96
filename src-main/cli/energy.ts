// `ergostat energy`: evaluates a learned energy model at given points.
// PTS.csv has a header with columns q and v (SI units, angles in radians; other columns ignored);
// OUT.csv repeats q, v and adds H. Exit: 0 done, 1 data error (model or points), 2 usage error.
import { readFile, writeFile } from 'node:fs/promises';
import type { Verb } from '../cli.ts';
import { UsageError, parseArgs, requiredValue, type OptionSpec } from './args.ts';
import { toEnergyFunction } from '../engine/learn/index.ts';
import { ModelFileError, readModelFile } from '../model/index.ts';

const USAGE = 'usage: ergostat energy model.json --points PTS.csv --out OUT.csv\n'
  + '  PTS.csv: a header naming columns q and v (SI units, angles in radians); OUT.csv: q, v, H.';
const SPEC: Record<string, OptionSpec> = { points: { kind: 'value' }, out: { kind: 'value' }, help: { kind: 'flag' } };
const MAX_BYTES = 256 * 1024 * 1024;

class PointsError extends Error {}

/** Parses the points file; errors name the file, line and column. */
export function parsePoints(text: string, file: string): { q: Float64Array; v: Float64Array } {
  const lines = text.split(/\r?\n/);
  while (lines.length && lines[lines.length - 1].trim() === '') lines.pop();
  if (lines.length === 0) throw new PointsError(`${file}: empty file; expected a header with columns q and v`);
  const header = lines[0].replace(/^\uFEFF/, '').split(',').map((h) => h.trim().replace(/^"(.*)"$/, '$1').toLowerCase());
  const iq = header.indexOf('q'), iv = header.indexOf('v');
  if (iq < 0 || iv < 0) throw new PointsError(`${file}: line 1: the header must name columns "q" and "v", got ${JSON.stringify(lines[0].slice(0, 80))}`);
  const q: number[] = [], v: number[] = [];
  for (let i = 1; i < lines.length; i++) {
    if (lines[i].trim() === '') continue;
    const cells = lines[i].split(',');
    const get = (k: number, name: string) => {
      const raw = (cells[k] ?? '').trim();
      const x = Number(raw);
      if (raw === '' || !Number.isFinite(x)) throw new PointsError(`${file}: line ${i + 1}, column "${name}": expected a finite number, got ${JSON.stringify(raw.slice(0, 40))}`);
      return x;
    };
    q.push(get(iq, 'q')); v.push(get(iv, 'v'));
  }
  if (q.length === 0) throw new PointsError(`${file}: no points after the header`);
  return { q: Float64Array.from(q), v: Float64Array.from(v) };
}

export const run: Verb = async (argv, io) => {
  const args = parseArgs(argv, SPEC);
  if (args.flags.has('help')) { io.out(USAGE); return 0; }
  if (args.positional.length !== 1) throw new UsageError(`expected exactly one model file, got ${args.positional.length}\n${USAGE}`);
  const pointsFile = requiredValue(args, 'points');
  const outFile = requiredValue(args, 'out');
  try {
    const model = await readModelFile(args.positional[0]);
    if (model.status !== 'ok') throw new PointsError(`${args.positional[0]}: the model holds no conserved energy (${model.verdict.code}: ${model.verdict.reason})`);
    const e = toEnergyFunction(model);
    let text: string;
    try { text = await readFile(pointsFile, 'utf8'); } catch (err) { throw new PointsError(`${pointsFile}: cannot be read: ${(err as Error).message}`); }
    if (text.length > MAX_BYTES) throw new PointsError(`${pointsFile}: larger than ${MAX_BYTES} bytes`);
    const { q, v } = parsePoints(text, pointsFile);
    const rows = ['q,v,H'];
    for (let i = 0; i < q.length; i++) rows.push(`${q[i]},${v[i]},${e.H(q[i], v[i])}`);
    await writeFile(outFile, rows.join('\n') + '\n', 'utf8');
    io.out(`${q.length} point(s) evaluated; H in ${model.units}; written to ${outFile}`);
    return 0;
  } catch (err) {
    if (err instanceof PointsError || err instanceof ModelFileError) { io.err(`ergostat energy: ${err.message}`); return 1; }
    throw err;
  }
};
