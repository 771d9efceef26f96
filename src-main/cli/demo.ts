// `ergostat demo [--out DIR] [--project FILE.ergostat]`: writes the recordings of the two
// invented demo rigs and runs the whole pipeline on them with the same verbs a user would type —
// check, learn, design, trial, export — echoing each command before its output. With --project
// it also gathers everything (recordings, models, designs, trials with traces) into one project
// file that opens in the app.
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { basename, join, relative, resolve } from 'node:path';
import type { Verb } from '../cli.ts';
import { optionalValue, parseArgs, UsageError } from './args.ts';
import { demoRecording, type DemoRecording, type DemoRig } from '../demo/rigs.ts';
import { Workspace } from '../api/workspace.ts';
import { parseCsvText } from '../recordings/index.ts';
import { traceFromCsv } from '../export/csv.ts';

interface Step {
  argv: string[];
  /** What the step produces for the project file. */
  yields?: { kind: 'model' | 'design' | 'trial'; file: string; name: string };
}

/** The pipeline for one rig: what an engineer would type for it. */
function stepsFor(rig: DemoRig, d: DemoRecording, file: string, out: string): Step[] {
  const m = d.mapping;
  const columns = ['--time', m.time, '--position', m.position, '--run', m.run, '--input', m.input, ...(m.angle ? ['--angle'] : [])];
  const p = (name: string) => join(out, `${rig}-${name}`);
  const common: Step[] = [
    { argv: ['check', file, ...columns] },
    { argv: ['learn', file, ...columns, '--out', p('model.json')], yields: { kind: 'model', file: p('model.json'), name: `${d.title} energy` } },
  ];
  if (rig === 'pendulum') {
    return [
      ...common,
      // Hold a 1.2 rad (69 degree) swing with at most 0.4 N m from the torque motor.
      { argv: ['design', p('model.json'), '--target-amplitude', '1.2', '--umax', '0.4', '--rate', '500', '--out', p('hold-design.json')], yields: { kind: 'design', file: p('hold-design.json'), name: 'hold a 1.2 rad swing' } },
      // From near rest, with the rig's 12-bit encoder and a model-based velocity observer.
      { argv: ['trial', p('hold-design.json'), '--q0', '0.05', '--v0', '0', '--duration', '30', '--sensor-bits', '12', '--noise', '0.0005', '--estimator', 'observer', '--out', p('hold-trial.csv')], yields: { kind: 'trial', file: p('hold-trial.csv'), name: 'swing-up to 1.2 rad' } },
      // The same under +-15 % parameter mismatch, 40 runs on worker threads.
      { argv: ['trial', p('hold-design.json'), '--q0', '0.05', '--v0', '0', '--duration', '20', '--sensor-bits', '12', '--noise', '0.0005', '--estimator', 'observer', '--runs', '40', '--mismatch', '0.15', '--out', p('hold-montecarlo.csv')] },
      { argv: ['export', p('hold-design.json'), '--c', p('c'), '--name', 'larkspur_hold', '--report', p('report.html'), '--model', p('model.json'), '--trial', p('hold-trial.csv'), '--plots', p('plots'), '--json', p('json')] },
    ];
  }
  return [
    ...common,
    // Snap the strip from the left well into the right one and bring it to rest there.
    { argv: ['design', p('model.json'), '--to-well', '2', '--from-well', '1', '--at-rest', '--umax', '0.5', '--rate', '1000', '--out', p('hop-design.json')], yields: { kind: 'design', file: p('hop-design.json'), name: 'hop from well 1 to well 2' } },
    { argv: ['trial', p('hop-design.json'), '--q0', '-0.004', '--v0', '0', '--duration', '6', '--sensor-bits', '14', '--sensor-range', '0.02', '--noise', '0.000008', '--estimator', 'observer', '--out', p('hop-trial.csv')], yields: { kind: 'trial', file: p('hop-trial.csv'), name: 'hop 1 -> 2' } },
    { argv: ['export', p('hop-design.json'), '--c', p('c'), '--name', 'tamsin_hop', '--report', p('report.html'), '--model', p('model.json'), '--trial', p('hop-trial.csv'), '--plots', p('plots'), '--json', p('json')] },
  ];
}

export const run: Verb = async (argv, io) => {
  const args = parseArgs(argv, { out: { kind: 'value' }, project: { kind: 'value' }, 'data-only': { kind: 'flag' } });
  if (args.positional.length > 0) throw new UsageError(`unexpected argument "${args.positional[0]}"`);
  const projectPath = optionalValue(args, 'project');
  if (projectPath !== undefined && !projectPath.endsWith('.ergostat')) throw new UsageError(`option --project expects a file name ending in .ergostat, got "${projectPath}"`);
  const out = resolve(optionalValue(args, 'out') ?? 'demo-output');
  mkdirSync(out, { recursive: true });
  const { main } = await import('../cli.ts');
  const show = (p: string) => relative(process.cwd(), p) || '.';
  const ws = new Workspace();
  let failures = 0;

  for (const rig of ['pendulum', 'strip'] as DemoRig[]) {
    const d = demoRecording(rig);
    const file = join(out, d.file.name);
    writeFileSync(file, d.file.text);
    io.out(`# ${d.title}: ${d.description}`);
    io.out(`wrote ${show(file)}`);
    const recordingName = ws.addImport(parseCsvText(d.file.text, d.file.name, d.mapping), [d.file.name], d.mapping).name;
    if (args.flags.has('data-only')) continue;
    let modelName = '';
    let designName = '';
    for (const step of stepsFor(rig, d, file, out)) {
      io.out('');
      io.out(`$ ergostat ${step.argv.map((s) => (s.startsWith(out) ? show(s) : s)).join(' ')}`);
      const captured: string[] = [];
      const code = await main(step.argv, { out: (l) => { captured.push(l); io.out(l); }, err: io.err });
      if (code === 3) {
        io.out(`(no conserved energy for the ${d.title}: the steps that need one are skipped)`);
        failures++;
        break;
      }
      if (code !== 0) {
        io.err(`ergostat demo: step "${step.argv[0]}" ended with exit code ${code}`);
        return code;
      }
      const y = step.yields;
      if (!y) continue;
      const body = y.kind === 'trial' ? null : JSON.parse(readFileSync(y.file, 'utf8'));
      if (y.kind === 'model') {
        modelName = y.name;
        ws.store.models.put({ name: y.name, kind: 'energy-model', body: { recording: recordingName, model: body } });
      } else if (y.kind === 'design') {
        designName = y.name;
        ws.store.designs.put({ name: y.name, kind: body.kind, body: { model: modelName, design: body } });
      } else {
        const trace = traceFromCsv(readFileSync(y.file, 'utf8'), basename(y.file));
        const line = captured.find((l) => l.startsWith('{'));
        const columns = Object.entries(trace).filter(([, a]) => a instanceof Float64Array) as [string, Float64Array][];
        ws.store.trials.put({
          name: y.name,
          kind: 'closed-loop',
          settings: { design: designName, command: step.argv.slice(1).map((s) => (s.startsWith(out) ? basename(s) : s)).join(' ') },
          metrics: line ? JSON.parse(line) : {},
          traces: columns.map(([name, data]) => ({ name, unit: '', data })),
        });
      }
    }
    io.out('');
  }
  if (projectPath !== undefined) {
    const target = resolve(projectPath);
    ws.save(target);
    const s = ws.summary();
    io.out(`project ${show(target)}: ${s.recordings.length} recordings, ${s.models.length} models, ${s.designs.length} designs, ${s.trials.length} trials — open it in the app`);
  }
  if (failures > 0) io.out(`${failures} rig(s) had no conserved energy; see the learn step above.`);
  return 0;
};
