// The degree growth must not stop at a function that is conserved only piecewise. On the demo
// strip (a double-well Duffing, mostly recorded inside one well at a time) an odd cubic in q is
// nearly constant on each in-well orbit and passes the limits at degree 3; the energy appears at
// degree 4 with a non-conservation about 100 times smaller and must be the one chosen.
// Check values: wells at +-sqrt(a/b) and the barrier at q = 0 (references.md, "Duffing double
// well"; elementary calculus), and the true energy of the simulated plant up to an affine map.
import { describe, expect, it } from 'vitest';
import { demoRecording } from '../../../src-main/demo/rigs.ts';
import { parseCsvText } from '../../../src-main/recordings/index.ts';
import { learnEnergy, modelEvaluator } from '../../../src-main/engine/learn/index.ts';
import { compilePlant } from '../../../src-main/engine/plant/index.ts';

describe('degree growth on a double well recorded mostly in one well at a time', () => {
  it('finds the even energy at degree 4, not an odd function of degree 3', () => {
    const d = demoRecording('strip');
    const rec = parseCsvText(d.file.text, d.file.name, d.mapping).recording;
    const m = learnEnergy(rec, {});
    expect(m.status).toBe('ok');
    expect(m.library.degree).toBeGreaterThanOrEqual(4);
    const { a, b } = d.plant.params;
    const qw = Math.sqrt(a / b);
    expect(m.landscape!.wells).toHaveLength(2);
    expect(Math.abs(m.landscape!.wells[0].q + qw) / qw).toBeLessThan(0.01);
    expect(Math.abs(m.landscape!.wells[1].q - qw) / qw).toBeLessThan(0.01);
    expect(Math.abs(m.landscape!.barriers[0].q) / qw).toBeLessThan(0.01);
    // R^2 of an affine fit of the learned H to the true energy on a grid over the recorded range.
    const truth = compilePlant(d.plant);
    const ev = modelEvaluator(m);
    const xs: number[] = [];
    const ys: number[] = [];
    for (let i = 0; i <= 40; i++) for (let j = 0; j <= 40; j++) {
      const q = -0.007 + (0.014 * i) / 40;
      const v = -0.25 + (0.5 * j) / 40;
      xs.push(ev.H(q, v));
      ys.push(truth.energy!(q, v));
    }
    const n = xs.length;
    const mx = xs.reduce((s, x) => s + x, 0) / n;
    const my = ys.reduce((s, y) => s + y, 0) / n;
    let sxy = 0, sxx = 0, syy = 0;
    for (let k = 0; k < n; k++) { sxy += (xs[k] - mx) * (ys[k] - my); sxx += (xs[k] - mx) ** 2; syy += (ys[k] - my) ** 2; }
    expect((sxy * sxy) / (sxx * syy)).toBeGreaterThan(0.9999);
  }, 60_000);
});
