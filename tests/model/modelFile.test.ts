import { describe, it, expect } from 'vitest';
import { ModelFileError, parseModel, serializeModel } from '../../src-main/model/index.ts';
import { gradientFormulas, toEnergyFunction, type EnergyModel } from '../../src-main/engine/learn/index.ts';
import { compileFormula } from '../../src-main/engine/formula/index.ts';

// A hand-written pendulum model: H = 0.5 v^2 - 23.357 cos q + 23.357 (elementary mechanics,
// g/l = 23.357142857143 from references.md §5), plus a user term with a zero coefficient.
function pendulumModel(): EnergyModel {
  const w2 = 23.357142857143;
  return {
    format: 'ergostat-energy-model', version: 1, status: 'ok',
    verdict: { code: 'ok', ok: true, reason: 'a lightly damped conserved energy was found', advice: '' },
    coordinate: 'angle',
    library: { degree: 2, harmonics: 2, evenV: true, terms: [{ kind: 'trig', fn: 'cos', k: 1, b: 0 }, { kind: 'mono', a: 0, b: 2 }, { kind: 'user', source: 'sin(q)^2*v^2' }] },
    coefficients: [-w2, 0.5, 0], offset: w2, formula: `- ${w2}*cos(q) + 0.5*v^2 + ${w2}`, units: 'J/kg', lambda: -0.05,
    damping: { lambda: -0.05, period: 1.3, omegaN: 4.83, zetaFromLambda: 0.0052, zetaLogDecrement: null, lambdaDerivativeForm: -0.051 },
    scale: { mass: null, massSource: 'none', massFromForcedRun: null, inputGain: null, forcedRunR2: null, joulesPerModelUnit: 1 },
    landscape: { qMin: -Math.PI, qMax: Math.PI, periodic: true, wells: [{ index: 1, q: 0, V: 0 }], barriers: [{ q: Math.PI, V: 2 * w2, between: [1, 1] }] },
    structure: { separable: true, nonSeparableShare: 0, massFormula: '1', potentialFormula: `- ${w2}*cos(q) + ${w2}` },
    replay: [{ run: 'run 1', seconds: 3.9, rmsError: 0.01, relativeError: 0.004 }],
    metrics: {
      samples: 1000, runs: 1, freeRuns: 1, forcedRuns: 0, dt: 0.005, noiseSigma: 0.001, signalToNoise: 300, halfWindow: 20, windowSeconds: 0.205, savgolOrder: 6,
      lagsSeconds: [0.1, 0.2], mu1: 1e-4, mu2: 0.5, gap: 5000, heldOut: NaN, nullSpaceDimension: 1, ridge: 0,
      derivativeForm: { lambda: -0.051, mu1: 0.2, agreement: 0.9999 }, candidates: [{ halfWindow: 20, lagsSeconds: [0.1, 0.2], degree: 2, mu1: 1e-4, mu2: 0.5, gap: 5000, heldOut: NaN, lambda: -0.05 }],
      pareto: [{ threshold: 0, terms: 2, mu: 1e-4, heldOut: NaN }], sparsityThreshold: 0,
    },
  };
}

/** A recorded range as engine/learn writes it (numbers as a 30 degree pendulum per unit inertia would give). */
const COVERAGE = { energyMin: 0.4, energyMax: 3.2, qMin: -0.52, qMax: 0.52, vMaxAbs: 2.5, joulesPerModelUnit: 1 };

function withField(edit: (o: any) => void): string {
  const o = JSON.parse(serializeModel(pendulumModel()));
  edit(o);
  return JSON.stringify(o);
}

describe('model file', () => {
  it('round-trips a model, writing non-finite numbers as null and reading them back as NaN', () => {
    const text = serializeModel(pendulumModel());
    expect(text).toContain('"heldOut": null');
    const m = parseModel(text, 'p.json');
    expect(m.metrics.heldOut).toBeNaN();
    expect(m.coefficients).toEqual(pendulumModel().coefficients);
    // The energy evaluates to the pendulum's: 2 g/l at the top, v^2/2 at the bottom (elementary mechanics).
    const e = toEnergyFunction(m);
    expect(e.H(Math.PI, 0)).toBeCloseTo(2 * 23.357142857143, 9);
    expect(e.H(0, 2)).toBeCloseTo(2, 12);
    const g = new Float64Array(2);
    e.grad(0.3, 1.5, g);
    expect(g[0]).toBeCloseTo(23.357142857143 * Math.sin(0.3), 9);
    expect(g[1]).toBeCloseTo(1.5, 12);
  });

  it.each([
    [(o: any) => { o.format = 'something-else'; }, /field "format": expected "ergostat-energy-model"/],
    [(o: any) => { o.version = 2; }, /field "version": this Ergostat reads version 1, the file has version 2/],
    [(o: any) => { o.damping.lambda = 'abc'; }, /field "damping.lambda": expected a finite number, got "abc"/],
    [(o: any) => { o.coefficients.pop(); }, /field "coefficients": has 2 entries but library.terms has 3/],
    [(o: any) => { o.library.terms[0].k = 0; }, /field "library.terms\[0\].k": expected at least 1, got 0/],
    [(o: any) => { o.library.terms[1] = { kind: 'mono', a: 0, b: 0 }; }, /field "library.terms\[1\]": a monomial needs a \+ b >= 1/],
    [(o: any) => { o.library.terms[2].source = 'require("fs")'; }, /field "library.terms\[2\].source"/],
    [(o: any) => { o.formula = '0.5*v^^2'; }, /field "formula": not a formula our parser accepts/],
    [(o: any) => { o.units = 'kJ'; }, /field "units": expected one of "J", "J\/kg", got "kJ"/],
    [(o: any) => { o.landscape.wells[0].index = 0; }, /field "landscape.wells\[0\].index": expected at least 1/],
    [(o: any) => { o.verdict.ok = false; }, /field "verdict.ok": must be true when status is "ok"/],
    [(o: any) => { delete o.metrics; }, /field "metrics": expected an object, got undefined/],
    [(o: any) => { o.coverage = 3; }, /field "coverage": expected an object, got 3/],
    [(o: any) => { o.coverage = { ...COVERAGE, energyMax: 'high' }; }, /field "coverage.energyMax": expected a finite number, got "high"/],
    [(o: any) => { o.coverage = { ...COVERAGE, energyMin: null }; }, /field "coverage.energyMin": expected a finite number, got null/],
    [(o: any) => { o.coverage = { ...COVERAGE, energyMin: 50 }; }, /field "coverage.energyMax": must be at least coverage.energyMin \(50\), got 3.2/],
    [(o: any) => { o.coverage = { ...COVERAGE, qMin: 1 }; }, /field "coverage.qMax": must be at least coverage.qMin \(1\), got 0.52/],
    [(o: any) => { o.coverage = { ...COVERAGE, vMaxAbs: -1 }; }, /field "coverage.vMaxAbs": expected at least 0, got -1/],
    [(o: any) => { const { qMax: _drop, ...rest } = COVERAGE; o.coverage = rest; }, /field "coverage.qMax": expected a finite number, got undefined/],
    [(o: any) => { o.coverage = { ...COVERAGE, joulesPerModelUnit: 0 }; }, /field "coverage.joulesPerModelUnit": expected at least/],
  ])('names the field that is wrong (%#)', (edit, message) => {
    expect(() => parseModel(withField(edit), 'bad.json')).toThrow(ModelFileError);
    expect(() => parseModel(withField(edit), 'bad.json')).toThrow(message);
  });

  it('reads the recorded range when present, and files without it (or with null) as before', () => {
    const m = parseModel(withField((o) => { o.coverage = { ...COVERAGE }; }), 'c.json');
    expect(m.coverage).toEqual(COVERAGE);
    expect(parseModel(serializeModel(m), 'c2.json').coverage).toEqual(COVERAGE);
    const old = parseModel(serializeModel(pendulumModel()), 'old.json');
    expect('coverage' in old).toBe(false);
    expect('coverage' in parseModel(withField((o) => { o.coverage = null; }), 'n.json')).toBe(false);
  });

  it('gives dH/dq and dH/dv as formulas that match the model gradient', () => {
    // Symbolic derivative (formula package) against the term-wise analytic gradient (library.ts).
    const m = pendulumModel();
    const { dHdq, dHdv } = gradientFormulas(m);
    const fq = compileFormula(dHdq, ['q', 'v']), fv = compileFormula(dHdv, ['q', 'v']);
    const e = toEnergyFunction(m), g = new Float64Array(2);
    for (const [q, v] of [[0.4, -1], [2.9, 3.3]]) {
      e.grad(q, v, g);
      expect(fq.eval(Float64Array.from([q, v]))).toBeCloseTo(g[0], 9);
      expect(fv.eval(Float64Array.from([q, v]))).toBeCloseTo(g[1], 9);
    }
  });

  it('refuses text that is not JSON, naming the file', () => {
    expect(() => parseModel('{"format": ', 'x.json')).toThrow(/^x\.json: not valid JSON/);
  });
});
