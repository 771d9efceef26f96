// Formula trees to C (formula-c.ts): every function of the formula language, compiled and checked
// against the engine's evaluation of the same formula (H compared directly, the gradient through u).
import { describe, expect, it } from 'vitest';
import { exportC } from '../../../src-main/export/c/index.ts';
import { compileAndRun } from './compile.ts';
import { duffingDesign } from '../fixtures.ts';

describe('exportC energy code', () => {
  it('maps every function of the formula language to C with the engine\'s semantics (sweep of states, no plant formula)', () => {
    // Energy using each whitelisted function, powers (2, 3, -1, fractional, variable exponent), pi and folded constants.
    const energy = '0.5*v^2 + 0.3*q^2 + 0.01*abs(q)^3 + 0.001*min(q, 1, v)*max(v, -1) + 0.002*sign(q)*q^2'
      + ' + 0.05*tanh(q)*q + 0.01*exp(-q^2) + 0.001*log(1 + q^2) + 0.001*sqrt(1 + v^2) + 0.001*tan(q/4)'
      + ' + 0.001*2^(0.1*q) + 0.01*(2 + q^2)^-1 + 0.001*(1 + q^2)^2.5 + 0.0001*(pi/2 + sqrt(2))*q';
    // No limits at all: the generated code must then compile without the limit constants and the period.
    const d = duffingDesign({ model: { ...duffingDesign().model, energy, acceleration: null }, law: { ...duffingDesign().law, uMax: null, rateMax: null } });
    const r = exportC(d, 'funcs', { vectors: { samples: 1200 } });
    expect(r.vectors.source).toBe('sweep');
    const body = r.files[1].text;
    for (const f of ['fabs(', 'funcs_min2(', 'funcs_max2(', 'funcs_sign(', 'tanh(', 'exp(', 'log(', 'sqrt(', 'tan(', 'pow(']) expect(body).toContain(f);
    expect(body).not.toContain('pi');
    const run = compileAndRun(r.files);
    expect(run.compilerOutput).toBe('');
    expect(run.stdout).toMatch(/PASS/);
    expect(run.status).toBe(0);
  });
});
