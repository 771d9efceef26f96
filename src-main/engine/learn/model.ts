// The learned energy model as plain data (what the model file stores) and its evaluation.
// H(q, v) = offset + sum_j coefficients[j] * term_j(q, v), in `units`.
import type { Coordinate } from '../types.ts';
import { termGrad, termValue, type Term } from './library.ts';
import { userTerm } from './userTerm.ts';

export type TermSpec =
  | { kind: 'mono'; a: number; b: number }
  | { kind: 'trig'; fn: 'cos' | 'sin'; k: number; b: number }
  | { kind: 'user'; source: string };

export interface Well { index: number; q: number; V: number }
export interface Barrier { q: number; V: number; between: [number, number] }
export interface Landscape { qMin: number; qMax: number; periodic: boolean; wells: Well[]; barriers: Barrier[] }

export type VerdictCode = 'ok' | 'too-little-data' | 'noise-only' | 'heavy-damping' | 'not-conserved' | 'no-free-runs';

export interface Verdict { code: VerdictCode; ok: boolean; reason: string; advice: string }

export interface CandidateReport { halfWindow: number; lagsSeconds: number[]; degree: number | null; mu1: number; mu2: number; gap: number; heldOut: number; lambda: number }
export interface ParetoPoint { threshold: number; terms: number; mu: number; heldOut: number }
export interface ReplayReport { run: string; seconds: number; rmsError: number; relativeError: number }

/**
 * What the free runs covered, on the Savitzky–Golay states the fit used (coverage.ts): robust
 * extremes (the 0.5th and 99.5th percentiles per run, then the lowest and highest over the runs).
 * Energies in the model's units as learned, when scale.joulesPerModelUnit was `joulesPerModelUnit`;
 * a tool that rescales H keeps them valid by the ratio of the two (coverageEnergyFactor).
 * Angles: q wrapped to [-pi, pi) before the percentiles.
 */
export interface Coverage { energyMin: number; energyMax: number; qMin: number; qMax: number; vMaxAbs: number; joulesPerModelUnit: number }

export interface EnergyModel {
  format: 'ergostat-energy-model';
  version: 1;
  status: 'ok' | 'no-energy';
  verdict: Verdict;
  coordinate: Coordinate;
  library: { degree: number; harmonics: number | null; evenV: boolean; terms: TermSpec[] };
  coefficients: number[];
  offset: number;
  formula: string;
  /** 'J' when calibrated (mass given or from a forced run), else 'J/kg' (per unit mass or inertia). */
  units: 'J' | 'J/kg';
  lambda: number;
  damping: { lambda: number; period: number; omegaN: number; zetaFromLambda: number; zetaLogDecrement: number | null; lambdaDerivativeForm: number | null };
  scale: { mass: number | null; massSource: 'given' | 'forced-run' | 'none'; massFromForcedRun: number | null; inputGain: number | null; forcedRunR2: number | null; joulesPerModelUnit: number };
  landscape: Landscape | null;
  structure: { separable: boolean; nonSeparableShare: number; massFormula: string | null; potentialFormula: string | null };
  replay: ReplayReport[];
  /** The range the recordings covered; absent in files written before it was recorded (and when status is 'no-energy'). */
  coverage?: Coverage;
  metrics: {
    samples: number; runs: number; freeRuns: number; forcedRuns: number; dt: number;
    noiseSigma: number; signalToNoise: number;
    halfWindow: number; windowSeconds: number; savgolOrder: number; lagsSeconds: number[];
    mu1: number; mu2: number; gap: number; heldOut: number; nullSpaceDimension: number; ridge: number;
    derivativeForm: { lambda: number; mu1: number; agreement: number } | null;
    candidates: CandidateReport[];
    pareto: ParetoPoint[];
    sparsityThreshold: number;
  };
}

/** Factor from the coverage's energies to the model's current units (1 unless H was rescaled since learning). */
export function coverageEnergyFactor(m: Pick<EnergyModel, 'scale'> & { coverage?: Coverage }): number {
  const c = m.coverage;
  if (!c) return 1;
  const now = m.scale.joulesPerModelUnit;
  return Number.isFinite(now) && now > 0 && c.joulesPerModelUnit > 0 ? now / c.joulesPerModelUnit : 1;
}

export function termFromSpec(s: TermSpec): Term {
  if (s.kind === 'user') return userTerm(s.source);
  return { ...s };
}

export function specFromTerm(t: Term): TermSpec {
  if (t.kind === 'user') return { kind: 'user', source: t.source };
  if (t.kind === 'mono') return { kind: 'mono', a: t.a, b: t.b };
  return { kind: 'trig', fn: t.fn, k: t.k, b: t.b };
}

/** Evaluation closures over the model's terms (user terms compiled once). */
export function modelEvaluator(m: Pick<EnergyModel, 'library' | 'coefficients' | 'offset'>) {
  const terms = m.library.terms.map(termFromSpec);
  const idx: number[] = [];
  for (let j = 0; j < terms.length; j++) if (m.coefficients[j] !== 0) idx.push(j);
  const g = new Float64Array(2);
  return {
    H(q: number, v: number): number {
      let s = m.offset;
      for (const j of idx) s += m.coefficients[j] * termValue(terms[j], q, v);
      return s;
    },
    grad(q: number, v: number, out: Float64Array): void {
      let a = 0, b = 0;
      for (const j of idx) { termGrad(terms[j], q, v, g); a += m.coefficients[j] * g[0]; b += m.coefficients[j] * g[1]; }
      out[0] = a; out[1] = b;
    },
  };
}
