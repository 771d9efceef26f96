// The integral variant in C (care2-c.ts, a port of engine/control/care2.ts): one 2x2 CARE per
// sample. The check program compares the port with the engine's outputs (an independent
// implementation in another language) within 1e-9; a perturbed weight must make it fail.
import { describe, expect, it } from 'vitest';
import { exportC } from '../../../src-main/export/c/index.ts';
import { controllerFromDesign } from '../../../src-main/design/supervisor.ts';
import { compileAndRun, perturb } from './compile.ts';
import { duffingDesign, duffingH } from '../fixtures.ts';

const duffI = duffingDesign({ law: { ...duffingDesign().law, integral: { Qw: 2, antiWindup: 'conditional' } } });

describe('C port of the 2x2 CARE (integral action)', () => {
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

    // eps = 0: at b = 0 the 2x2 CARE has no stabilizing solution (G = 0, the integrator is not
    // stabilizable), u_fb = 0 there; the port must take the same path on the same samples.
    const d0 = duffingDesign({ law: { ...duffI.law, eps: 0 } });
    const r0 = exportC(d0, 'duffing_eps0', { vectors: { q0: 1.1, samples: 1500 } });
    expect(r0.vectors.coverage.riccatiFailures).toBeGreaterThan(0);
    expect(r0.vectors.coverage.riccatiFailures).toBe(r0.vectors.coverage.zeroB);
    const run0 = compileAndRun(r0.files);
    expect(run0.stdout).toMatch(/PASS/);
    expect(run0.status).toBe(0);
  });

});
