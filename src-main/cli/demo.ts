// `ergostat demo [--out DIR]`: writes the recordings of the two invented demo rigs and runs the
// pipeline on them with the same verbs a user would type, echoing each command before its output.
import { mkdirSync, writeFileSync } from 'node:fs';
import { join, relative, resolve } from 'node:path';
import type { Io, Verb } from '../cli.ts';
import { optionalValue, parseArgs } from './args.ts';
import { demoRecording, type DemoRig } from '../demo/rigs.ts';

export const run: Verb = async (argv, io) => {
  const args = parseArgs(argv, { out: { kind: 'value' }, 'data-only': { kind: 'flag' } });
  if (args.positional.length > 0) throw new (await import('./args.ts')).UsageError(`unexpected argument "${args.positional[0]}"`);
  const out = resolve(optionalValue(args, 'out') ?? 'demo-output');
  mkdirSync(out, { recursive: true });
  const { main } = await import('../cli.ts');
  const show = (p: string) => relative(process.cwd(), p) || '.';

  for (const rig of ['pendulum', 'strip'] as DemoRig[]) {
    const d = demoRecording(rig);
    const file = join(out, d.file.name);
    writeFileSync(file, d.file.text);
    io.out(`# ${d.title}: ${d.description}`);
    io.out(`wrote ${show(file)}`);
    if (args.flags.has('data-only')) continue;
    const m = d.mapping;
    const columns = ['--time', m.time, '--position', m.position, '--run', m.run, '--input', m.input, ...(m.angle ? ['--angle'] : [])];
    const model = join(out, `${rig}-model.json`);
    const steps: string[][] = [
      ['check', file, ...columns],
      ['learn', file, ...columns, '--out', model],
    ];
    for (const step of steps) {
      io.out('');
      io.out(`$ ergostat ${step.map((s) => (s.includes(out) ? show(s) : s)).join(' ')}`);
      const code = await main(step, io as Io);
      if (code === 3) {
        io.out(`(no conserved energy for the ${d.title}: the steps that need one are skipped)`);
        break;
      }
      if (code !== 0) {
        io.err(`ergostat demo: step "${step[0]}" ended with exit code ${code}`);
        return code;
      }
    }
    io.out('');
  }
  return 0;
};
