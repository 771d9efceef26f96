// The C99 export end to end: generate NAME.h / NAME.c / NAME_check.c, compile them with the
// system C compiler and run the check program, whose table holds the engine's own outputs
// (design/supervisor.ts on engine/control makeLevelHold) along a closed-loop trajectory. The C port
// is an independent implementation of the law: agreement within 1e-9 is the check; a perturbed
// constant must make it fail.
import { describe, expect, it } from 'vitest';
import { exportC } from '../../../src-main/export/c/index.ts';
import { SAFETY_CAUTIONS } from '../../../src-main/safety.ts';
import { compileAndRun, perturb, worstErrors } from './compile.ts';
import { pendulumDesign } from '../fixtures.ts';
import { I, MGL } from '../../design/fixtures.ts';

const pend = pendulumDesign({ law: { ...pendulumDesign().law, uMax: 0.1, rateMax: 5 } });

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

  it('refuses a name that is not a C identifier, and designs the C code cannot hold, naming the argument', () => {
    expect(() => exportC(pend, '2fast')).toThrow(/^name: "2fast" is not a C identifier/);
    expect(() => exportC(pend, 'my-controller')).toThrow(/name: .* is not a C identifier/);
    expect(() => exportC(pend, 'double')).toThrow(/name: "double" is a C keyword/);
    expect(() => exportC(pend, '__x')).toThrow(/reserved/);
    expect(() => exportC(pendulumDesign({ sampleRateHz: 0 }), 'p')).toThrow(/design\.sampleRateHz/);
    expect(() => exportC(pendulumDesign({ law: { ...pend.law, Q: NaN } }), 'p')).toThrow(/design\.law\.Q/);
    expect(() => exportC(pendulumDesign({ model: { ...pend.model, energy: 'v^2 + x' } }), 'p')).toThrow(/design\.model\.energy/);
    // A constant part that folds to NaN (log(0)*0) cannot be a C constant.
    expect(() => exportC(pendulumDesign({ model: { ...pend.model, energy: 'v^2 + log(0)*0*q' } }), 'p')).toThrow(/design\.model\.energy: .*non-finite number NaN/);
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

