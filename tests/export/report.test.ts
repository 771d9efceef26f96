// The report: one self-contained HTML document with the safety cautions (safety.ts, design.md §5)
// before everything else, every section present, hostile text from files escaped, no external
// resources and no scripts, and inline SVG plots that are well-formed.
import { describe, expect, it } from 'vitest';
import { buildReport } from '../../src-main/export/report.ts';
import { SAFETY_CAUTIONS, SAFETY_DEFERENCE } from '../../src-main/safety.ts';
import { controllerFromDesign } from '../../src-main/design/supervisor.ts';
import { simulate } from '../../src-main/engine/trial/simulate.ts';
import { trialMetrics } from '../../src-main/engine/trial/metrics.ts';
import { compileFormula } from '../../src-main/engine/formula/index.ts';
import { duffingHop } from './fixtures.ts';
import { checkXml } from './plots/xml.ts';

const esc = (s: string) => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&#39;');

function hopTrial() {
  const d = duffingHop();
  const sup = controllerFromDesign(d);
  const f = compileFormula(d.model.acceleration!, ['q', 'v', 'u', 't']);
  const x = new Float64Array(4);
  const r = simulate({
    plant: { coordinate: 'linear', accel: (q, v, u, t) => { x[0] = q; x[1] = v; x[2] = u; x[3] = t; return f.eval(x); } },
    energy: sup.energy, controller: sup, q0: 1, v0: -0.75, duration: 8, rateHz: 200, estimator: { kind: 'ideal' },
  });
  return { d, trace: r.trace, metrics: trialMetrics(r.trace, { target: -0.2 }) };
}

describe('buildReport', () => {
  const { d, trace, metrics } = hopTrial();
  const hostile = '<script>alert("x")</script>';
  const design = { ...d, source: `rig ${hostile}`, stages: d.stages.map((s, i) => (i === 0 ? { ...s, name: hostile } : s)) };
  const html = buildReport({
    design, trials: [{ name: `${hostile}.csv`, trace, metrics, baselines: [{ name: 'energy-pump', status: 'ok', message: 'completed', metrics }] }],
    recordingsSummary: { runs: [{ name: hostile, source: 'a&b.csv', samples: 1000, rateHz: 200, durationS: 5 }], warnings: [hostile] },
    generatedAt: '2026-01-01T00:00:00Z',
  });

  it('puts every safety caution and the deference first, before any other section', () => {
    const safety = html.indexOf('id="safety"');
    expect(safety).toBeGreaterThan(0);
    for (const c of SAFETY_CAUTIONS) {
      const at = html.indexOf(esc(c));
      expect(at).toBeGreaterThan(safety);
      expect(at).toBeLessThan(html.indexOf('id="data"'));
    }
    expect(html).toContain(esc(SAFETY_DEFERENCE));
  });

  it('does not repeat the standard cautions when the design carries them too', () => {
    const once = buildReport({ design: { ...d, cautions: [...SAFETY_CAUTIONS, SAFETY_DEFERENCE] }, generatedAt: 'x' });
    expect(once.split(esc(SAFETY_DEFERENCE)).length - 1).toBe(1);
    expect(once).not.toContain('Cautions recorded with the design');
  });

  it('escapes text from files: no script element, the hostile names shown as text', () => {
    expect(html).not.toMatch(/<script/i);
    expect(html).toContain(esc(hostile));
    expect(html).toContain('a&amp;b.csv');
  });

  it('is self-contained: no external resources, links or scripts', () => {
    expect(html).not.toMatch(/\s(src|href)=/i);
    expect(html).not.toMatch(/url\((?!#)/);
    expect(html).not.toMatch(/@import/);
    expect(html.startsWith('<!DOCTYPE html>')).toBe(true);
  });

  it('has each section, the design parameters, and well-formed inline plots', () => {
    for (const id of ['safety', 'data', 'energy', 'landscape', 'design', 'trials']) expect(html).toContain(`id="${id}"`);
    expect(html).toContain('q &lt; -0.3 and v &lt; 0');
    expect(html).toContain('Baselines on the same cost');
    const svgs = [...html.matchAll(/<svg[\s\S]*?<\/svg>/g)].map((m) => m[0]);
    expect(svgs.length).toBe(4); // landscape, energy, input, phase
    for (const s of svgs) expect(checkXml(s).ok).toBe(true);
    // Print rules: sections start on new pages, figures are not split.
    expect(html).toMatch(/@media print[\s\S]*section\.major \{ break-before: page; \}/);
  });

  it('works with nothing but the cautions', () => {
    const bare = buildReport({ generatedAt: 'x' });
    expect(bare).toContain(esc(SAFETY_CAUTIONS[0]));
    expect(bare).toContain('No design was given.');
  });
});
