// The printable report: one self-contained HTML file (inline CSS and inline SVG plots, no
// external resources, no scripts) with the safety cautions first (design.md §5, safety.ts), then
// the data summary, the learned energy and its checks, the landscape, the design, and the trials
// with their baselines and plots. Every piece of text taken from a file is HTML-escaped; the
// plots escape their own text (plots/svg.ts). Print CSS keeps figures and tables whole and starts
// each main section on a new page.
import type { ControllerDesign } from '../design/types.ts';
import { compileDesignEnergy } from '../design/energy.ts';
import type { EnergyModel } from '../engine/learn/model.ts';
import { modelEvaluator } from '../engine/learn/model.ts';
import type { BaselineRow } from '../engine/trial/baselines.ts';
import type { TrialMetrics } from '../engine/trial/metrics.ts';
import type { Trace } from '../engine/trial/types.ts';
import { SAFETY_CAUTIONS, SAFETY_DEFERENCE } from '../safety.ts';
import { APP_VERSION } from '../version.ts';
import { escapeHtml as e, fmt, table } from './html.ts';
import { energyPlot, inputPlot, landscapePlot, phasePlot } from './plots/index.ts';

export interface ReportTrial {
  name: string;
  trace: Trace;
  metrics?: TrialMetrics | null;
  baselines?: BaselineRow[];
}

export interface RecordingsSummary {
  runs: { name: string; source?: string; samples: number; rateHz?: number; durationS?: number; noiseSigma?: number; note?: string }[];
  warnings?: string[];
}

export interface ReportInput {
  model?: EnergyModel;
  design?: ControllerDesign;
  trials?: ReportTrial[];
  recordingsSummary?: RecordingsSummary;
  /** Title; default "Ergostat report". */
  title?: string;
  /** Time stamp printed in the header (ISO text); default now. */
  generatedAt?: string;
}

const CSS = `
:root { --ink: #22303c; --soft: #5b6770; --rule: #dedbd2; --accent: #0f6e75; --warn: #a15c00; --warn-soft: #fbefd9; --bad: #a3272b; --good: #2c6e3f; }
* { box-sizing: border-box; }
body { font-family: 'DejaVu Sans', 'Noto Sans', 'Segoe UI', system-ui, sans-serif; color: var(--ink); background: #fff; margin: 0 auto; max-width: 900px; padding: 24px; font-size: 14px; line-height: 1.45; }
h1 { font-size: 1.6rem; margin: 0 0 4px; }
h2 { font-size: 1.25rem; border-bottom: 2px solid var(--accent); padding-bottom: 3px; margin-top: 28px; }
h3 { font-size: 1.05rem; color: var(--soft); margin: 18px 0 6px; }
.meta { color: var(--soft); margin: 0 0 14px; }
.cautions { border: 3px solid var(--warn); background: var(--warn-soft); padding: 12px 16px; border-radius: 6px; }
.cautions h2 { border: none; margin: 0 0 6px; color: var(--warn); }
.cautions li { margin: 3px 0; }
table { border-collapse: collapse; margin: 6px 0 12px; }
th, td { border-bottom: 1px solid var(--rule); padding: 3px 10px 3px 0; text-align: left; vertical-align: top; }
th { color: var(--soft); font-weight: 600; }
td.num, .num { text-align: right; font-variant-numeric: tabular-nums; }
code, .formula { font-family: 'DejaVu Sans Mono', ui-monospace, monospace; font-size: 0.92rem; overflow-wrap: anywhere; }
.ok { color: var(--good); font-weight: 600; }
.bad { color: var(--bad); font-weight: 600; }
figure { margin: 10px 0 16px; }
figure svg { max-width: 100%; height: auto; display: block; }
figcaption { color: var(--soft); font-size: 0.9rem; }
.empty { color: var(--soft); font-style: italic; }
@page { size: A4; margin: 14mm; }
@media print {
  body { max-width: none; padding: 0; font-size: 11pt; }
  section.major { break-before: page; }
  figure, table, .cautions { break-inside: avoid; }
  h2, h3 { break-after: avoid; }
}
`;

const okCell = (ok: boolean): string => (ok ? '<span class="ok">ok</span>' : '<span class="bad">not met</span>');
const num = (x: number | null | undefined, d = 4): string => `<span class="num">${e(fmt(x, d))}</span>`;
const figure = (svg: string, caption: string): string => `<figure>${svg}<figcaption>${e(caption)}</figcaption></figure>`;

function cautionsSection(design?: ControllerDesign): string {
  const extra = (design?.cautions ?? []).filter((c) => !SAFETY_CAUTIONS.includes(c) && c !== SAFETY_DEFERENCE);
  return `<section class="cautions" id="safety"><h2>Safety cautions</h2>`
    + '<p>Energy controllers deliberately put energy into hardware.</p>'
    + `<ul>${SAFETY_CAUTIONS.map((c) => `<li>${e(c)}</li>`).join('')}</ul>`
    + (extra.length ? `<p>Cautions recorded with the design:</p><ul>${extra.map((c) => `<li>${e(c)}</li>`).join('')}</ul>` : '')
    + `<p>${e(SAFETY_DEFERENCE)}</p></section>`;
}

function dataSection(s?: RecordingsSummary): string {
  if (!s) return '<section id="data"><h2>Data</h2><p class="empty">No recordings summary was given.</p></section>';
  const rows = s.runs.map((r) => [e(r.name), e(r.source ?? ''), num(r.samples, 8), num(r.rateHz), num(r.durationS), num(r.noiseSigma, 3), e(r.note ?? '')]);
  return `<section id="data"><h2>Data</h2>${table(['run', 'file', 'samples', 'rate (Hz)', 'duration (s)', 'noise sigma', 'note'], rows)}`
    + (s.warnings?.length ? `<h3>Warnings</h3><ul>${s.warnings.map((w) => `<li>${e(w)}</li>`).join('')}</ul>` : '')
    + '</section>';
}

function energySection(m?: EnergyModel, d?: ControllerDesign): string {
  if (!m && !d) return '<section class="major" id="energy"><h2>Learned energy</h2><p class="empty">No model was given.</p></section>';
  let h = '<section class="major" id="energy"><h2>Learned energy</h2>';
  if (m) {
    h += `<p>Status: ${m.status === 'ok' ? '<span class="ok">ok</span>' : '<span class="bad">no conserved energy found</span>'} \u2014 ${e(m.verdict?.reason ?? '')}</p>`;
    if (m.verdict?.advice) h += `<p>${e(m.verdict.advice)}</p>`;
    h += `<p>H(q, v) = <span class="formula">${e(m.formula)}</span> (${e(m.units)})</p>`;
    const me = m.metrics;
    h += '<h3>Checks</h3>' + table(['quantity', 'value', 'meaning'], [
      ['Koopman eigenvalue lambda', num(m.lambda), 'near 0: conserved; negative: light damping (1/s)'],
      ['damping ratio (from lambda)', num(m.damping?.zetaFromLambda), ''],
      ['damping ratio (log decrement)', num(m.damping?.zetaLogDecrement), 'independent estimate from the peaks'],
      ['period', num(m.damping?.period), 's'],
      ['relative non-conservation mu1', num(me?.mu1, 3), 'smallest generalized eigenvalue'],
      ['spectral gap mu2/mu1', num(me?.gap, 3), 'large: one clear conserved function'],
      ['held-out conservation', num(me?.heldOut, 3), 'on runs not used for learning'],
      ['null-space dimension', num(me?.nullSpaceDimension), ''],
      ['Savitzky-Golay window', num(me?.windowSeconds), 's'],
      ['noise sigma', num(me?.noiseSigma, 3), 'unit of q'],
    ].map((r) => [e(r[0]), r[1], e(r[2])]));
    if (m.replay?.length) {
      h += '<h3>Replay of the measured runs</h3>' + table(['run', 'seconds', 'RMS error', 'relative error'],
        m.replay.map((r) => [e(r.run), num(r.seconds), num(r.rmsError, 3), num(r.relativeError, 3)]));
    }
    if (m.scale) h += `<p>Scale: mass ${e(fmt(m.scale.mass))} (${e(m.scale.massSource)}), input gain ${e(fmt(m.scale.inputGain))}.</p>`;
  }
  if (d) h += `<p>Energy used by the controller: <span class="formula">${e(d.model.energy)}</span> (${e(d.model.units)}), lambda ${e(fmt(d.model.lambda))} 1/s.</p>`;
  return h + '</section>';
}

interface EnergyView { H: (q: number, v: number) => number; coordinate: 'angle' | 'linear'; unit: string; qRange: [number, number]; wells: { index: number; q: number; energy: number }[]; barriers: { q: number; energy: number }[] }

function energyView(m?: EnergyModel, d?: ControllerDesign): EnergyView | null {
  if (d) {
    const en = compileDesignEnergy(d.model.energy, d.model.coordinate, d.model.lambda);
    return { H: (q, v) => en.H(q, v), coordinate: d.model.coordinate, unit: d.model.units, qRange: [d.model.validRange.qMin, d.model.validRange.qMax], wells: d.model.wells, barriers: d.model.barriers };
  }
  if (m && m.status === 'ok' && m.landscape) {
    const ev = modelEvaluator(m);
    return {
      H: (q, v) => ev.H(q, v), coordinate: m.coordinate, unit: m.units, qRange: [m.landscape.qMin, m.landscape.qMax],
      wells: m.landscape.wells.map((w) => ({ index: w.index, q: w.q, energy: w.V })), barriers: m.landscape.barriers.map((b) => ({ q: b.q, energy: b.V })),
    };
  }
  return null;
}

function landscapeSection(view: EnergyView | null, d?: ControllerDesign): string {
  let h = '<section id="landscape"><h2>Landscape</h2>';
  if (!view || !(view.qRange[1] > view.qRange[0])) return `${h}<p class="empty">No energy with a landscape was given.</p></section>`;
  const targets = (d?.stages ?? []).map((s) => ({ label: `stage ${s.index} (${s.name}): H* = ${fmt(s.target.energy)}`, energy: s.target.energy }));
  h += figure(landscapePlot({ V: (q) => view.H(q, 0), qRange: view.qRange, coordinate: view.coordinate, unit: view.unit, wells: view.wells, barriers: view.barriers, targets, title: 'Potential landscape V(q) = H(q, 0)' }),
    'Wells (minima) and barriers (maxima between them) of the learned energy; dashed: stage targets.');
  h += table(['', 'q', `energy (${view.unit})`], [
    ...view.wells.map((w) => [e(`well ${w.index}`), num(w.q), num(w.energy)]),
    ...view.barriers.map((b) => [e('barrier'), num(b.q), num(b.energy)]),
  ]);
  return h + '</section>';
}

function designSection(d?: ControllerDesign): string {
  if (!d) return '<section class="major" id="design"><h2>Controller design</h2><p class="empty">No design was given.</p></section>';
  const l = d.law;
  const unit = d.input.unit || 'model units';
  let h = '<section class="major" id="design"><h2>Controller design</h2>';
  h += `<p>${e(d.kind)} controller, ${d.stages.length} stage(s), sample rate ${e(fmt(d.sampleRateHz))} Hz, delay ${e(d.delaySamples)} sample(s). Source: ${e(d.source)} (Ergostat ${e(d.app)}).</p>`;
  h += '<h3>Law (SDRE on the energy coordinate)</h3>' + table(['parameter', 'value'], [
    ['Q (weight on z^2)', num(l.Q)], ['R (weight on u^2)', num(l.R)], ['eps (sign regularisation)', num(l.eps)], ['lambda (1/s)', num(l.lambda)],
    ['input gain g', num(d.input.gain)], [`u max (${unit})`, l.uMax === null ? 'none' : num(l.uMax)], [`rate limit (${unit}/s)`, l.rateMax === null ? 'none' : num(l.rateMax)],
    ['integral action', l.integral ? e(`Qw = ${fmt(l.integral.Qw)}, anti-windup ${l.integral.antiWindup}`) : 'none'],
    ['loss compensation', l.lossCompensation ? 'on' : 'off'],
  ].map((r) => [e(r[0]), r[1]]));
  h += '<h3>Stages</h3>' + table(['stage', 'name', 'target', `H* (${d.model.units})`, '<b^2>'],
    d.stages.map((s) => [num(s.index), e(s.name), e(s.target.kind), num(s.target.energy), num(s.meanB2)]));
  if (d.transitions.length) {
    h += '<h3>Switching</h3>' + table(['from', 'to', 'when', 'why'], d.transitions.map((t) => {
      const c = t.when, parts: string[] = [];
      const q = c.wrapped ? 'wrapped q' : 'q';
      if (c.qAbove !== undefined) parts.push(`${q} > ${fmt(c.qAbove, 6)}`);
      if (c.qBelow !== undefined) parts.push(`${q} < ${fmt(c.qBelow, 6)}`);
      if (c.vSign !== undefined) parts.push(c.vSign > 0 ? 'v > 0' : 'v < 0');
      if (c.energyAbove !== undefined) parts.push(`H > ${fmt(c.energyAbove, 6)}`);
      if (c.energyBelow !== undefined) parts.push(`H < ${fmt(c.energyBelow, 6)}`);
      return [num(t.from), num(t.to), e(parts.join(' and ')), e(t.reason)];
    }));
  }
  if (d.checks.length) h += '<h3>Design checks</h3>' + table(['check', 'result', 'detail'], d.checks.map((c) => [e(c.name), okCell(c.ok), e(c.detail)]));
  return h + '</section>';
}

function metricsRows(m: TrialMetrics): string[][] {
  return [
    ['target H*', num(m.target)], ['band half-width', num(m.band)], ['time to band (s)', m.timeToBand === null ? 'never' : num(m.timeToBand)],
    ['converged', okCell(m.converged)], ['final energy', num(m.finalEnergy)], ['final relative error', num(m.finalRelError, 3)],
    ['cost J', num(m.J)], ['peak |u|', num(m.peakU)], ['actuator work (integral |u v| dt)', num(m.workAbs)],
  ].map((r) => [e(r[0] as string), r[1] as string]);
}

function trialsSection(trials: ReportTrial[] | undefined, view: EnergyView | null, d?: ControllerDesign): string {
  let h = '<section class="major" id="trials"><h2>Trials</h2>';
  if (!trials || trials.length === 0) return `${h}<p class="empty">No trials were given.</p></section>`;
  for (const t of trials) {
    h += `<h3>${e(t.name)}</h3>`;
    if (t.trace.t.length < 2) { h += '<p class="empty">The trace has fewer than 2 samples.</p>'; continue; }
    if (t.metrics) h += table(['metric', 'value'], metricsRows(t.metrics));
    const unit = d?.model.units ?? view?.unit ?? 'model units';
    h += figure(energyPlot(t.trace, { unit, targets: d ? d.stages.map((s) => s.target.energy) : t.metrics?.target, title: `Energy: ${t.name}` }),
      'Energy against time; dashed: the target of the active stage, shaded: +-2 % band.');
    h += figure(inputPlot(t.trace, { unit: d?.input.unit ?? '', uMax: d?.law.uMax ?? null, title: `Input: ${t.name}` }), 'Input against time (held over each sample); dashed: the saturation limits.');
    if (view) {
      let vmax = 0;
      for (let i = 0; i < t.trace.v.length; i++) vmax = Math.max(vmax, Math.abs(t.trace.v[i]));
      let qa = view.qRange[0], qb = view.qRange[1];
      for (let i = 0; i < t.trace.q.length; i++) { qa = Math.min(qa, t.trace.q[i]); qb = Math.max(qb, t.trace.q[i]); }
      const vr = (vmax > 0 ? vmax : 1) * 1.15;
      const levels = [...(d?.stages ?? []).map((s) => s.target.energy), ...view.barriers.map((b) => b.energy)];
      h += figure(phasePlot({ energy: view.H, qRange: [qa, qb], vRange: [-vr, vr], coordinate: view.coordinate, unit: view.unit, trajectory: t.trace, levels, title: `Phase portrait: ${t.name}` }),
        'Trajectory (q, v) over level sets of H; dashed: target and barrier levels.');
    }
    if (t.baselines?.length) {
      h += '<h4>Baselines on the same cost</h4>' + table(['controller', 'status', 'cost J', 'time to band (s)', 'peak |u|', 'work'], t.baselines.map((b) => [
        e(b.name), b.status === 'ok' ? '<span class="ok">ok</span>' : `<span class="bad">${e(b.status)}</span> ${e(b.message)}`,
        num(b.metrics?.J), b.metrics ? (b.metrics.timeToBand === null ? 'never' : num(b.metrics.timeToBand)) : '\u2013', num(b.metrics?.peakU), num(b.metrics?.workAbs),
      ]));
    }
  }
  return h + '</section>';
}

/** The whole report as one HTML document. */
export function buildReport(input: ReportInput = {}): string {
  if (input === null || typeof input !== 'object') throw new TypeError('input: expected {model?, design?, trials?, recordingsSummary?}');
  const { model, design, trials, recordingsSummary } = input;
  if (trials !== undefined && !Array.isArray(trials)) throw new TypeError('input.trials: expected an array of {name, trace}');
  const view = energyView(model, design);
  const title = input.title ?? 'Ergostat report';
  const when = input.generatedAt ?? new Date().toISOString();
  return '<!DOCTYPE html>\n<html lang="en"><head><meta charset="utf-8">'
    + '<meta http-equiv="Content-Security-Policy" content="default-src \'none\'; style-src \'unsafe-inline\'; img-src data:">'
    + `<meta name="viewport" content="width=device-width, initial-scale=1"><title>${e(title)}</title><style>${CSS}</style></head><body>`
    + `<header><h1>${e(title)}</h1><p class="meta">Generated ${e(when)} by Ergostat ${e(APP_VERSION)}.</p></header>`
    + cautionsSection(design)
    + dataSection(recordingsSummary)
    + energySection(model, design)
    + landscapeSection(view, design)
    + designSection(design)
    + trialsSection(trials, view, design)
    + '</body></html>\n';
}
