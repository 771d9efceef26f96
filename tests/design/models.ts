// EnergyModel-shaped objects with known analytic energies (as `ergostat learn` would write them
// for noise-free data), for the designer and CLI tests.
// Pendulum per unit inertia: H = v^2/2 + (g/l)(1 - cos q) (elementary mechanics, divided by m l^2).
// Duffing double well, m = 1: H = v^2/2 - a q^2/2 + b q^4/4 + a^2/(4b), wells at +-sqrt(a/b) with
// H = 0, barrier at 0 with H = a^2/(4b) (references.md, "Duffing double well").
import type { EnergyModel } from '../../src-main/engine/learn/index.ts';

export const GRAV = 9.81, LEN = 0.42, W2 = GRAV / LEN, LAMBDA = -0.05;

function base(coordinate: 'angle' | 'linear'): EnergyModel {
  return {
    format: 'ergostat-energy-model', version: 1, status: 'ok',
    verdict: { code: 'ok', ok: true, reason: 'analytic test model', advice: '' },
    coordinate,
    library: { degree: 2, harmonics: coordinate === 'angle' ? 1 : null, evenV: true, terms: [] },
    coefficients: [], offset: 0, formula: '', units: 'J/kg', lambda: LAMBDA,
    damping: { lambda: LAMBDA, period: 1.3, omegaN: 4.83, zetaFromLambda: 0.005, zetaLogDecrement: null, lambdaDerivativeForm: null },
    scale: { mass: null, massSource: 'none', massFromForcedRun: null, inputGain: null, forcedRunR2: null, joulesPerModelUnit: 1 },
    landscape: null,
    structure: { separable: true, nonSeparableShare: 0, massFormula: '1', potentialFormula: '' },
    replay: [],
    metrics: {
      samples: 10000, runs: 2, freeRuns: 2, forcedRuns: 0, dt: 0.001, noiseSigma: 1e-4, signalToNoise: 1000,
      halfWindow: 10, windowSeconds: 0.021, savgolOrder: 4, lagsSeconds: [0.1], mu1: 1e-8, mu2: 1e-3, gap: 1e5, heldOut: 1e-8,
      nullSpaceDimension: 1, ridge: 0, derivativeForm: null, candidates: [], pareto: [], sparsityThreshold: 0,
    },
  };
}

/** Pendulum per unit inertia ('J/kg', uncalibrated unless mass is given: then H is in joules with inertia `mass`). */
export function pendulumModel(mass: number | null = null): EnergyModel {
  const m = base('angle');
  const s = mass ?? 1;
  m.library.terms = [{ kind: 'mono', a: 0, b: 2 }, { kind: 'trig', fn: 'cos', k: 1, b: 0 }];
  m.coefficients = [0.5 * s, -W2 * s];
  m.offset = W2 * s;
  if (mass !== null) { m.units = 'J'; m.scale = { ...m.scale, mass, massSource: 'given', joulesPerModelUnit: mass }; }
  m.landscape = { qMin: -Math.PI, qMax: Math.PI, periodic: true, wells: [{ index: 1, q: 0, V: 0 }], barriers: [{ q: -Math.PI, V: 2 * W2 * s, between: [1, 1] }] };
  return m;
}

/** Double-well Duffing, a = b = 1, m = 1 ('J'), recorded over q in [-1.8, 1.8]. */
export function duffingModel(): EnergyModel {
  const m = base('linear');
  m.library.terms = [{ kind: 'mono', a: 0, b: 2 }, { kind: 'mono', a: 2, b: 0 }, { kind: 'mono', a: 4, b: 0 }];
  m.coefficients = [0.5, -0.5, 0.25];
  m.offset = 0.25;
  m.units = 'J';
  m.scale = { ...m.scale, mass: 1, massSource: 'given' };
  m.damping = { ...m.damping, period: 2 * Math.PI / Math.SQRT2 };
  m.landscape = { qMin: -1.8, qMax: 1.8, periodic: false, wells: [{ index: 1, q: -1, V: 0 }, { index: 2, q: 1, V: 0 }], barriers: [{ q: 0, V: 0.25, between: [1, 2] }] };
  return m;
}
