// The ergostat command line: one verb per module in ./cli/, dispatched from this table.
// Exit codes: 0 success, 1 data error, 2 usage error, 3 no conserved energy found (learn).
import { UsageError } from './cli/args.ts';

export interface Io {
  out: (line: string) => void;
  err: (line: string) => void;
}

export type Verb = (argv: string[], io: Io) => Promise<number>;

const verbs: Record<string, { summary: string; load: () => Promise<Verb> }> = {
  demo: { summary: 'write the demo rigs\' recordings and run the pipeline on them', load: async () => (await import('./cli/demo.ts')).run },
  check: { summary: 'import CSV recordings and report sampling, noise, Savitzky-Golay window and damping per run', load: async () => (await import('./cli/check.ts')).run },
  design: { summary: 'design an energy-level controller (level hold, or a well hop with --to-well) from an energy model', load: async () => (await import('./cli/design.ts')).run },
  trial: { summary: 'simulate a controller design in closed loop (model or plant.json, sensor, Monte Carlo mismatch) with baselines; write trial.csv', load: async () => (await import('./cli/trial.ts')).run },
  learn: { summary: 'learn the conserved energy H(q, v), its damping and landscape from recordings; write a model file', load: async () => (await import('./cli/learn.ts')).run },
  energy: { summary: 'evaluate a learned energy model at points (q, v) from a CSV file', load: async () => (await import('./cli/energy.ts')).run },
  export: { summary: 'write a controller design as C99 with a check program, a printable HTML report, plots (SVG, PNG) and JSON', load: async () => (await import('./cli/export.ts')).run },
};

function usage(): string {
  const lines = ['usage: ergostat <verb> [arguments]', '', 'verbs:'];
  for (const [name, v] of Object.entries(verbs)) lines.push(`  ${name.padEnd(8)} ${v.summary}`);
  return lines.join('\n');
}

export async function main(argv: string[], io: Io = { out: (l) => console.log(l), err: (l) => console.error(l) }): Promise<number> {
  const [verb, ...rest] = argv;
  if (!verb || verb === '--help' || verb === '-h' || verb === 'help') {
    io.out(usage());
    return verb ? 0 : 2;
  }
  const entry = verbs[verb];
  if (!entry) {
    io.err(`ergostat: unknown verb "${verb}"\n${usage()}`);
    return 2;
  }
  try {
    return await (await entry.load())(rest, io);
  } catch (e) {
    if (e instanceof UsageError) {
      io.err(`ergostat ${verb}: ${e.message}`);
      return 2;
    }
    throw e;
  }
}
