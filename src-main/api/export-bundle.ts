// What 'export.write' writes into one folder for a stored design: the C99 controller with its
// check program (NAME.h, NAME.c, NAME_check.c), the design and model as pretty JSON, each chosen
// trial's trace as CSV (t,q,v,u,H[,stage]), plots as SVG and PNG (plots/: the landscape, and per
// trial energy, input and phase portrait) and the self-contained HTML report. The pieces are the
// export engine's (src-main/export); this file only gathers them and writes the files.
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { ControllerDesign } from '../design/types.ts';
import { compileDesignEnergy } from '../design/energy.ts';
import { finalStage } from '../design/final-stage.ts';
import type { EnergyModel } from '../engine/learn/index.ts';
import { trialMetrics, type Trace, type BaselineRow } from '../engine/trial/index.ts';
import {
  exportC, prettyJson, traceToCsv, buildReport, energyPlot, inputPlot, landscapePlot, phasePlot, svgToPng, type ReportTrial,
} from '../export/index.ts';
import type { ExportResult } from './results.ts';

export interface ExportOutputs {
  c?: { name: string };
  json?: boolean;
  csv?: boolean;
  plots?: boolean;
  report?: boolean;
}

export interface ExportTrial {
  name: string;
  trace: Trace;
  baselines: BaselineRow[];
}

/** A file name from a project name: letters, digits, dot, dash and underscore only. */
export function fileSlug(name: string): string {
  return name.replace(/[^A-Za-z0-9._-]+/g, '-').replace(/^[-.]+|-+$/g, '').slice(0, 80) || 'item';
}

export function writeExport(
  folder: string, title: string, design: ControllerDesign, model: EnergyModel | undefined, trials: ExportTrial[], out: ExportOutputs,
): ExportResult {
  const files: ExportResult['files'] = [];
  const notes: string[] = [];
  const write = (path: string, data: string | Buffer, kind: ExportResult['files'][number]['kind']) => {
    writeFileSync(path, data);
    files.push({ path, kind, bytes: typeof data === 'string' ? Buffer.byteLength(data) : data.length });
  };
  mkdirSync(folder, { recursive: true });
  const target = finalStage(design).target.energy;
  const reportTrials: ReportTrial[] = trials.map((t) => {
    let metrics = null;
    try {
      metrics = t.trace.t.length >= 2 ? trialMetrics(t.trace, { target, Q: design.law.Q, R: design.law.R, uMax: design.law.uMax ?? undefined }) : null;
    } catch {
      metrics = null;
    }
    return { name: t.name, trace: t.trace, metrics, baselines: t.baselines };
  });

  if (out.c) {
    const r = exportC(design, out.c.name);
    for (const f of r.files) write(join(folder, f.name), f.text, 'c');
    const c = r.vectors.coverage;
    notes.push(`C99: ${c.rows} test vectors (${c.saturated} saturated, ${c.rateLimited} rate-limited, ${c.zeroB} with b = 0, ${c.switches} stage switch(es)); `
      + `check on the target toolchain: cc -std=c99 -O2 -Wall -Wextra -Werror ${out.c.name}.c ${out.c.name}_check.c -lm && ./a.out`);
  }
  if (out.json) {
    write(join(folder, 'design.json'), prettyJson(design, 'design').text, 'json');
    if (model) {
      const mj = prettyJson(model, 'model');
      write(join(folder, 'model.json'), mj.text, 'json');
      if (mj.nonFinite.length) notes.push(`model values JSON cannot hold were written as null: ${mj.nonFinite.slice(0, 5).join(', ')}`);
    }
  }
  if (out.csv) {
    for (const t of trials) write(join(folder, `trial-${fileSlug(t.name)}.csv`), traceToCsv(t.trace), 'csv');
  }
  if (out.plots) {
    const dir = join(folder, 'plots');
    mkdirSync(dir, { recursive: true });
    const en = compileDesignEnergy(design.model.energy, design.model.coordinate, design.model.lambda);
    const vr = design.model.validRange;
    const unit = design.model.units;
    const svgs: [string, string][] = [['landscape', landscapePlot({
      V: (q) => en.H(q, 0), qRange: [vr.qMin, vr.qMax], coordinate: design.model.coordinate, unit, wells: design.model.wells, barriers: design.model.barriers,
      targets: design.stages.map((s) => ({ label: `stage ${s.index} (${s.name}): H* = ${Number(s.target.energy.toPrecision(4))} ${unit}`, energy: s.target.energy })),
      title: 'Potential landscape V(q) = H(q, 0)',
    })]];
    for (const t of trials) {
      const base = `trial-${fileSlug(t.name)}`;
      svgs.push([`${base}-energy`, energyPlot(t.trace, { unit, targets: design.stages.map((s) => s.target.energy), title: `Energy: ${t.name}` })]);
      svgs.push([`${base}-input`, inputPlot(t.trace, { unit: design.input.unit, uMax: design.law.uMax, title: `Input: ${t.name}` })]);
      let vmax = 0, qa = vr.qMin, qb = vr.qMax;
      for (let k = 0; k < t.trace.t.length; k++) {
        vmax = Math.max(vmax, Math.abs(t.trace.v[k]));
        qa = Math.min(qa, t.trace.q[k]);
        qb = Math.max(qb, t.trace.q[k]);
      }
      const vlim = (vmax > 0 ? vmax : 1) * 1.15;
      svgs.push([`${base}-phase`, phasePlot({
        energy: (q, v) => en.H(q, v), qRange: [qa, qb], vRange: [-vlim, vlim], coordinate: design.model.coordinate, unit, trajectory: t.trace,
        levels: [...design.stages.map((s) => s.target.energy), ...design.model.barriers.map((b) => b.energy)], title: `Phase portrait: ${t.name}`,
      })]);
    }
    for (const [name, svg] of svgs) {
      write(join(dir, `${name}.svg`), svg, 'svg');
      write(join(dir, `${name}.png`), svgToPng(svg), 'png');
    }
  }
  if (out.report) write(join(folder, 'report.html'), buildReport({ design, model, trials: reportTrials, title }), 'html');
  return { folder, files, notes };
}
