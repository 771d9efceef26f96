// `ergostat export`: writes what a controller design (design.json) hands to the rig and to
// people: portable C99 with its check program (--c), a self-contained HTML report (--report),
// plots as SVG and PNG (--plots), pretty JSON of the design and model (--json). Inputs from files
// are checked before use: the design by readDesign, the model by parseModel, trials by the CSV
// reader of export/csv.ts. Prints every file written, then the safety cautions.
// Exit codes: 0 written, 1 a bad input file (named, with its line or field), 2 usage error.
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { basename, join } from 'node:path';
import type { Verb } from '../cli.ts';
import { UsageError, optionalValue, parseArgs, type OptionSpec } from './args.ts';
import { readDesign } from '../design/validate.ts';
import type { ControllerDesign } from '../design/types.ts';
import { compileDesignEnergy } from '../design/energy.ts';
import { parseModel } from '../model/index.ts';
import type { EnergyModel } from '../engine/learn/model.ts';
import { trialMetrics } from '../engine/trial/metrics.ts';
import { SAFETY_CAUTIONS, SAFETY_DEFERENCE } from '../safety.ts';
import { exportC, checkCName } from '../export/c/index.ts';
import { traceFromCsv } from '../export/csv.ts';
import { prettyJson } from '../export/json.ts';
import { buildReport, type ReportTrial } from '../export/report.ts';
import { energyPlot, inputPlot, landscapePlot, phasePlot, svgToPng } from '../export/plots/index.ts';

const USAGE = 'usage: ergostat export design.json [--c DIR] [--name NAME] [--report FILE.html] [--model model.json]\n'
  + '                      [--trial trial.csv ...] [--plots DIR] [--json DIR]\n'
  + '  --c DIR: NAME.h, NAME.c and NAME_check.c (C99; build and run the check with\n'
  + '           cc -std=c99 -O2 -Wall -Wextra -Werror NAME.c NAME_check.c -lm). NAME: a C identifier, default "controller".\n'
  + '  --report FILE.html: a self-contained report (print it to PDF from a browser).\n'
  + '  --model: the energy model file, for the report; --trial: trial traces (CSV t,q,v,u,H[,stage]) for the report and plots.\n'
  + '  --plots DIR: landscape, and per trial energy, input and phase portrait, as SVG and PNG.\n'
  + '  --json DIR: design.json (and model.json) as pretty JSON.\n'
  + '  At least one of --c, --report, --plots, --json. Exit: 0 written, 1 bad input file, 2 usage error.';

const SPEC: Record<string, OptionSpec> = {
  c: { kind: 'value' }, name: { kind: 'value' }, report: { kind: 'value' }, model: { kind: 'value' },
  trial: { kind: 'value', repeat: true }, plots: { kind: 'value' }, json: { kind: 'value' }, help: { kind: 'flag' },
};

/** An input file could not be used: message names the file and the place. */
class InputError extends Error {}

function readText(path: string, what: string): string {
  try { return readFileSync(path, 'utf8'); } catch (e) { throw new InputError(`${path}: cannot read the ${what}: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`); }
}

function loadDesign(path: string): ControllerDesign {
  const text = readText(path, 'design file');
  let json: unknown;
  try { json = JSON.parse(text); } catch (e) { throw new InputError(`${path}: not valid JSON: ${(e as Error).message}`); }
  try { return readDesign(json, path); } catch (e) { throw new InputError((e as Error).message); }
}

function loadModel(path: string): EnergyModel {
  const text = readText(path, 'model file');
  try { return parseModel(text, path); } catch (e) { throw new InputError((e as Error).message); }
}

function loadTrial(path: string, d: ControllerDesign): ReportTrial {
  const text = readText(path, 'trial file');
  let trace;
  try { trace = traceFromCsv(text, path); } catch (e) { throw new InputError((e as Error).message); }
  if (trace.t.length < 2) throw new InputError(`${path}: expected at least 2 rows of samples, got ${trace.t.length}`);
  const lastStage = trace.stage ? trace.stage[trace.stage.length - 1] : d.initialStage;
  const stage = d.stages[lastStage - 1];
  if (!stage) throw new InputError(`${path}: column stage: stage ${lastStage} does not exist in the design (it has ${d.stages.length})`);
  let metrics = null;
  try {
    metrics = trialMetrics(trace, { target: stage.target.energy, Q: d.law.Q, R: d.law.R, uMax: d.law.uMax ?? undefined });
  } catch { metrics = null; }
  return { name: basename(path), trace, metrics };
}

function ensureDir(dir: string): void {
  try { mkdirSync(dir, { recursive: true }); } catch (e) { throw new InputError(`${dir}: cannot create the output folder: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`); }
}

export const run: Verb = async (argv, io) => {
  const args = parseArgs(argv, SPEC);
  if (args.flags.has('help')) { io.out(USAGE); return 0; }
  if (args.positional.length !== 1) throw new UsageError(`expected one design file, got ${args.positional.length}\n${USAGE}`);
  const cDir = optionalValue(args, 'c'), reportFile = optionalValue(args, 'report'), plotsDir = optionalValue(args, 'plots'), jsonDir = optionalValue(args, 'json');
  if (!cDir && !reportFile && !plotsDir && !jsonDir) throw new UsageError(`nothing to write: give --c, --report, --plots or --json\n${USAGE}`);
  const name = optionalValue(args, 'name') ?? 'controller';
  if (optionalValue(args, 'name') !== undefined && !cDir) throw new UsageError('option --name only applies with --c DIR');
  try { checkCName(name, 'NAME'); } catch (e) { throw new UsageError(`option --name: ${(e as Error).message}`); }
  const written: string[] = [];
  const write = (path: string, data: string | Buffer): void => {
    try { writeFileSync(path, data); } catch (e) { throw new InputError(`${path}: cannot write: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`); }
    written.push(path);
  };
  try {
    const design = loadDesign(args.positional[0]);
    const modelPath = optionalValue(args, 'model');
    const model = modelPath ? loadModel(modelPath) : undefined;
    const trials = (args.values.get('trial') ?? []).map((p) => loadTrial(p, design));

    if (cDir) {
      ensureDir(cDir);
      const r = exportC(design, name);
      for (const f of r.files) write(join(cDir, f.name), f.text);
      const c = r.vectors.coverage;
      io.out(`C99 controller: ${c.rows} test vectors (states from ${r.vectors.source}): ${c.saturated} saturated, ${c.rateLimited} rate-limited, ${c.zeroB} with b = 0, ${c.switches} stage switch(es)`);
      io.out(`  check it on the target toolchain: cc -std=c99 -O2 -Wall -Wextra -Werror ${name}.c ${name}_check.c -lm && ./a.out`);
    }
    if (jsonDir) {
      ensureDir(jsonDir);
      const dj = prettyJson(design, 'design');
      write(join(jsonDir, 'design.json'), dj.text);
      if (model) {
        const mj = prettyJson(model, 'model');
        write(join(jsonDir, 'model.json'), mj.text);
        if (mj.nonFinite.length) io.out(`  note: model values that JSON cannot hold were written as null: ${mj.nonFinite.slice(0, 5).join(', ')}${mj.nonFinite.length > 5 ? ', ...' : ''}`);
      }
    }
    if (plotsDir) {
      ensureDir(plotsDir);
      const en = compileDesignEnergy(design.model.energy, design.model.coordinate, design.model.lambda);
      const vr = design.model.validRange;
      const unit = design.model.units;
      const svgs: [string, string][] = [];
      svgs.push(['landscape', landscapePlot({
        V: (q) => en.H(q, 0), qRange: [vr.qMin, vr.qMax], coordinate: design.model.coordinate, unit, wells: design.model.wells, barriers: design.model.barriers,
        targets: design.stages.map((s) => ({ label: `stage ${s.index} (${s.name}): H* = ${Number(s.target.energy.toPrecision(4))} ${unit}`, energy: s.target.energy })), title: 'Potential landscape V(q) = H(q, 0)',
      })]);
      trials.forEach((t, i) => {
        const base = `trial${i + 1}`;
        svgs.push([`${base}-energy`, energyPlot(t.trace, { unit, targets: design.stages.map((s) => s.target.energy), title: `Energy: ${t.name}` })]);
        svgs.push([`${base}-input`, inputPlot(t.trace, { unit: design.input.unit, uMax: design.law.uMax, title: `Input: ${t.name}` })]);
        let vmax = 0, qa = vr.qMin, qb = vr.qMax;
        for (let k = 0; k < t.trace.t.length; k++) { vmax = Math.max(vmax, Math.abs(t.trace.v[k])); qa = Math.min(qa, t.trace.q[k]); qb = Math.max(qb, t.trace.q[k]); }
        const vlim = (vmax > 0 ? vmax : 1) * 1.15;
        svgs.push([`${base}-phase`, phasePlot({
          energy: (q, v) => en.H(q, v), qRange: [qa, qb], vRange: [-vlim, vlim], coordinate: design.model.coordinate, unit, trajectory: t.trace,
          levels: [...design.stages.map((s) => s.target.energy), ...design.model.barriers.map((b) => b.energy)], title: `Phase portrait: ${t.name}`,
        })]);
      });
      for (const [file, svg] of svgs) {
        write(join(plotsDir, `${file}.svg`), svg);
        write(join(plotsDir, `${file}.png`), svgToPng(svg));
      }
    }
    if (reportFile) {
      write(reportFile, buildReport({ design, model, trials, title: `Ergostat report: ${basename(args.positional[0])}` }));
    }
  } catch (e) {
    for (const p of written) io.out(`wrote ${p}`);
    if (e instanceof InputError) { io.err(`ergostat export: ${e.message}`); return 1; }
    throw e;
  }
  for (const p of written) io.out(`wrote ${p}`);
  io.out('');
  io.out('SAFETY: energy controllers deliberately put energy into hardware.');
  for (const c of SAFETY_CAUTIONS) io.out(`  - ${c}`);
  io.out(SAFETY_DEFERENCE);
  return 0;
};
