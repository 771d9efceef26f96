// The supervisor in C (source.ts): stages, and transitions as generated if-conditions tried in
// order. The check program compares the port with the engine's outputs within 1e-9, stages exactly.
import { describe, expect, it } from 'vitest';
import { exportC } from '../../../src-main/export/c/index.ts';
import { compileAndRun, perturb } from './compile.ts';
import { duffingHop, pendulumDesign } from '../fixtures.ts';

const hop0 = duffingHop();
const hop = { ...hop0, law: { ...hop0.law, uMax: 0.4 } };

describe('C supervisor', () => {
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


  it('wrapped conditions: a pendulum one turn away (q near 2 pi) switches on the wrapped angle, as the engine does', () => {
    const base = pendulumDesign();
    const d = pendulumDesign({
      kind: 'well-hop',
      stages: [
        { index: 1, name: 'raise', target: { kind: 'energy', energy: 1.0 }, meanB2: null },
        { index: 2, name: 'settle', target: { kind: 'energy', energy: 0.3 }, meanB2: 40 },
      ],
      // Unwrapped, q stays near 2 pi and never goes below -0.5: only the wrapped angle can fire this.
      transitions: [{ from: 1, to: 2, when: { qBelow: -0.5, vSign: -1, wrapped: true }, reason: 'test' }],
      law: { ...base.law, uMax: 0.3, rateMax: 20 },
    });
    const r = exportC(d, 'wrap', { vectors: { q0: 2 * Math.PI + 0.3, samples: 2500 } });
    expect(r.vectors.coverage.switches).toBe(1);
    for (let k = 0; k < r.vectors.q.length; k++) expect(r.vectors.q[k]).toBeGreaterThan(Math.PI);
    expect(r.files[1].text).toContain('wrap_wrap(q) < (-0.50000000000000000)');
    const run = compileAndRun(r.files);
    expect(run.compilerOutput).toBe('');
    expect(run.stdout).toMatch(/stage mismatches 0/);
    expect(run.status).toBe(0);
  });
});
