// The C99 export end to end: generate NAME.h / NAME.c / NAME_check.c, compile them with the
// system C compiler and run the check program, whose table holds the engine's own outputs
// (design/supervisor.ts on engine/control makeLevelHold) along a closed-loop trajectory. The C port
// is an independent implementation of the law: agreement within 1e-9 is the check; a perturbed
// constant must make it fail.
import { describe, expect, it } from 'vitest';
import { exportC } from '../../../src-main/export/c/index.ts';
import { controllerFromDesign } from '../../../src-main/design/supervisor.ts';
import { SAFETY_CAUTIONS } from '../../../src-main/safety.ts';
import { compileAndRun, worstErrors } from './compile.ts';
import { duffingDesign, duffingH, duffingHop, pendulumDesign } from '../fixtures.ts';
import { I, MGL } from '../../design/fixtures.ts';

const pend = pendulumDesign({ law: { ...pendulumDesign().law, uMax: 0.1, rateMax: 5 } });
const duffI = duffingDesign({ law: { ...duffingDesign().law, integral: { Qw: 2, antiWindup: 'conditional' } } });
const hop0 = duffingHop();
const hop = { ...hop0, law: { ...hop0.law, uMax: 0.4 } };

function perturb(files: { name: string; text: string }[], file: string, pattern: RegExp, replace: string) {
  return files.map((f) => {
    if (f.name !== file) return f;
    expect(pattern.test(f.text)).toBe(true);
    return { name: f.name, text: f.text.replace(pattern, replace) };
  });
}

describe('exportC', () => {
  it('pendulum level hold: the port reproduces the engine within 1e-9, including saturated and rate-limited samples and b = 0', () => {
    const r = exportC(pend, 'pend', { vectors: { q0: 0.5, samples: 1500 } });
    expect(r.files.map((f) => f.name)).toEqual(['pend.h', 'pend.c', 'pend_check.c']);
    const c = r.vectors.coverage;
    expect(c.rows).toBe(1500);
    expect(c.saturated).toBeGreaterThan(10);
    expect(c.rateLimited).toBeGreaterThan(10);
    expect(c.rows - c.saturated - c.rateLimited).toBeGreaterThan(10);
    expect(c.zeroB).toBeGreaterThan(0);
    // H column against the pendulum energy written by hand (elementary mechanics), not the parser.
    for (let k = 0; k < r.vectors.t.length; k += 97) {
      const q = r.vectors.q[k], v = r.vectors.v[k];
      expect(Math.abs(r.vectors.H[k] - ((I / 2) * v * v + MGL * (1 - Math.cos(q))))).toBeLessThan(1e-14);
    }
    const run = compileAndRun(r.files);
    expect(run.compilerOutput).toBe('');
    expect(run.compiled).toBe(true);
    expect(run.stdout).toMatch(/PASS/);
    expect(run.status).toBe(0);
    expect(worstErrors(run.stdout).u).toBeLessThanOrEqual(1e-9);

    // The header carries the safety cautions and the limits.
    const h = r.files[0].text;
    for (const caution of SAFETY_CAUTIONS) expect(h.replace(/\s+\*\s+/g, ' ')).toContain(caution.replace(/\s+/g, ' ').slice(0, 40));
    expect(h).toMatch(/\|u\| <= 0\.1 N m; \|du\/dt\| <= 5 N m\/s/);
    expect(h).toContain('double pend_step(pend_state *s, double q, double v, double t);');

    // A constant perturbed by 1e-6 relative must make the check fail (the test can fail).
    const bad = compileAndRun(perturb(r.files, 'pend.c', /pend_Q = 1\.0000000000000000;/, 'pend_Q = 1.0000010000000000;'));
    expect(bad.compiled).toBe(true);
    expect(bad.status).toBe(1);
    expect(bad.stdout).toMatch(/FAIL/);
  });

  it('Duffing level hold with integral action (2x2 CARE per sample): the port reproduces the engine within 1e-9', () => {
    const r = exportC(duffI, 'duffing_int', { vectors: { q0: 1.1, samples: 1500 } });
    const c = r.vectors.coverage;
    expect(c.saturated).toBeGreaterThan(10);
    expect(c.rateLimited).toBeGreaterThan(0);
    expect(c.riccatiFailures).toBe(0);
    for (let k = 0; k < r.vectors.t.length; k += 101) {
      expect(Math.abs(r.vectors.H[k] - duffingH(r.vectors.q[k], r.vectors.v[k]))).toBeLessThan(1e-14); // references.md, Duffing double well
    }
    // The integrator is at work: the engine's w is non-zero by the end (else this case would not test it).
    const sup = controllerFromDesign(duffI);
    for (let k = 0; k < r.vectors.t.length; k++) sup.step(r.vectors.q[k], r.vectors.v[k], r.vectors.t[k], 1 / duffI.sampleRateHz);
    expect(Math.abs(sup.last.w)).toBeGreaterThan(1e-3);
    const run = compileAndRun(r.files);
    expect(run.compilerOutput).toBe('');
    expect(run.status).toBe(0);
    expect(r.files[1].text).toContain('duffing_int_care2(');

    const bad = compileAndRun(perturb(r.files, 'duffing_int.c', /duffing_int_QW = 2\.0000000000000000;/, 'duffing_int_QW = 2.0000020000000000;'));
    expect(bad.status).toBe(1);
  });

  it('two-stage well hop: switches at the same sample as the engine, u within 1e-9 across the switch', () => {
    const r = exportC(hop, 'hop', { vectors: { q0: 1, v0: -0.75, samples: 2500 } });
    const c = r.vectors.coverage;
    expect(c.switches).toBe(1);
    const st = Array.from(r.vectors.stage);
    const first = st.indexOf(2);
    expect(first).toBeGreaterThan(100);
    // Independent check of the switch row: the first row with q < -0.3 and v < 0 (the design's condition).
    let expected = -1;
    for (let k = 0; k < st.length; k++) if (r.vectors.q[k] < -0.3 && r.vectors.v[k] < 0) { expected = k; break; }
    expect(first).toBe(expected);
    expect(c.saturated).toBeGreaterThan(0);
    expect(c.rateLimited).toBeGreaterThan(0);
    const body = r.files[1].text;
    expect(body).toMatch(/case 1:\n\s+if \(\(q < \(-0\.30000000000000004\)\) && \(v < 0\.0\)\)|case 1:\n\s+if \(\(q < \(-0\.29999999999999999\)\) && \(v < 0\.0\)\)/);
    const run = compileAndRun(r.files);
    expect(run.compilerOutput).toBe('');
    expect(run.stdout).toMatch(/stage mismatches 0/);
    expect(run.status).toBe(0);

    // Stage 2's target perturbed: the check must fail after the switch.
    const bad = compileAndRun(perturb(r.files, 'hop.c', /\{ 0\.080000000000000002, -0\.20000000000000001 \}/, '{ 0.080000000000000002, -0.20000020000000001 }'));
    expect(bad.status).toBe(1);
  });

  it('refuses a name that is not a C identifier, and designs the C code cannot hold, naming the argument', () => {
    expect(() => exportC(pend, '2fast')).toThrow(/^name: "2fast" is not a C identifier/);
    expect(() => exportC(pend, 'my-controller')).toThrow(/name: .* is not a C identifier/);
    expect(() => exportC(pend, 'double')).toThrow(/name: "double" is a C keyword/);
    expect(() => exportC(pend, '__x')).toThrow(/reserved/);
    expect(() => exportC(pendulumDesign({ sampleRateHz: 0 }), 'p')).toThrow(/design\.sampleRateHz/);
    expect(() => exportC(pendulumDesign({ law: { ...pend.law, Q: NaN } }), 'p')).toThrow(/design\.law\.Q/);
    expect(() => exportC(pendulumDesign({ model: { ...pend.model, energy: 'v^2 + x' } }), 'p')).toThrow(/design\.model\.energy/);
  });

  it('keeps hostile text out of the code: a design source with comment terminators stays inside the comment', () => {
    const d = pendulumDesign({ source: 'evil */ int x = 1; /* ??/\n#include <stdlib.h>' });
    const r = exportC(d, 'evil', { vectors: { samples: 50 } });
    const h = r.files[0].text;
    const comment = h.slice(0, h.indexOf('*/\n#ifndef'));
    expect(comment.slice(2)).not.toContain('*/');
    expect(h).not.toMatch(/^#include <stdlib\.h>/m);
    const run = compileAndRun(r.files);
    expect(run.compilerOutput).toBe('');
    expect(run.status).toBe(0);
  });
});
