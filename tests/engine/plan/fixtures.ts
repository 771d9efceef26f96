// Energy models written down analytically (not learned), shaped like engine/learn's EnergyModel,
// for the planner's and the hop designer's tests. The landscape is found by engine/learn's own
// findLandscape on V(q) = H(q, 0); tests that check it compare against closed forms.
import type { EnergyModel, TermSpec } from '../../../src-main/engine/learn/index.ts';
import { findLandscape, modelEvaluator } from '../../../src-main/engine/learn/index.ts';
import type { Coordinate } from '../../../src-main/engine/types.ts';

export interface AnalyticModel {
  coordinate: Coordinate;
  terms: TermSpec[];
  coefficients: number[];
  offset: number;
  lambda: number;
  units?: 'J' | 'J/kg';
  inputGain?: number | null;
  range: [number, number];
}

export function analyticModel(a: AnalyticModel): EnergyModel {
  const periodic = a.coordinate === 'angle';
  const base = { library: { degree: 0, harmonics: null, evenV: true, terms: a.terms }, coefficients: a.coefficients, offset: a.offset };
  const ev = modelEvaluator(base);
  const landscape = findLandscape((q) => ev.H(q, 0), a.range[0], a.range[1], periodic);
  const dm = { lambda: a.lambda, period: 1, omegaN: 1, zetaFromLambda: 0, zetaLogDecrement: null, lambdaDerivativeForm: null };
  return {
    format: 'ergostat-energy-model', version: 1, status: 'ok',
    verdict: { code: 'ok', ok: true, reason: 'written down analytically (test)', advice: '' },
    coordinate: a.coordinate,
    ...base,
    formula: 'see terms',
    units: a.units ?? 'J',
    lambda: a.lambda,
    damping: dm,
    scale: { mass: null, massSource: 'none', massFromForcedRun: null, inputGain: a.inputGain ?? null, forcedRunR2: null, joulesPerModelUnit: 1 },
    landscape,
    structure: { separable: true, nonSeparableShare: 0, massFormula: null, potentialFormula: null },
    replay: [],
    metrics: {
      samples: 0, runs: 0, freeRuns: 0, forcedRuns: 0, dt: 0.001, noiseSigma: 0, signalToNoise: Infinity, halfWindow: 0, windowSeconds: 0,
      savgolOrder: 0, lagsSeconds: [], mu1: 0, mu2: 0, gap: 0, heldOut: 0, nullSpaceDimension: 1, ridge: 0,
      derivativeForm: null, candidates: [], pareto: [], sparsityThreshold: 0,
    },
  };
}

const mono = (a: number, b: number): TermSpec => ({ kind: 'mono', a, b });

/** Double-well Duffing, m = 1: H = v^2/2 - a q^2/2 + b q^4/4 + a^2/(4b) (V = 0 at the wells), lambda = -c. */
export function doubleWellModel(a = 1, b = 1, c = 0.02): EnergyModel {
  return analyticModel({
    coordinate: 'linear', terms: [mono(0, 2), mono(2, 0), mono(4, 0)], coefficients: [0.5, -a / 2, b / 4],
    offset: (a * a) / (4 * b), lambda: -c, range: [-2 * Math.sqrt(a / b), 2 * Math.sqrt(a / b)],
  });
}

/** Pendulum, H = I v^2/2 + m g l (1 - cos q), I = m l^2, lambda = -c (as builtinPlant('pendulum')). */
export function pendulumModel(m = 0.5, l = 0.42, g = 9.81, c = 0.05): EnergyModel {
  return analyticModel({
    coordinate: 'angle', terms: [mono(0, 2), { kind: 'trig', fn: 'cos', k: 1, b: 0 }], coefficients: [(m * l * l) / 2, -m * g * l],
    offset: m * g * l, lambda: -c, range: [-Math.PI, Math.PI],
  });
}
