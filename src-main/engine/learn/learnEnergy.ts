// Learning the conserved energy H(q, v) of a lightly damped rig from position recordings
// (design.md §2 "Learning H", "Noise decides whether this works", "Scale, offset, sign",
// "A model to simulate from H", "Wells and hops"). Steps:
//  1. check the data; noise level, dominant period (velocity turning points);
//  2. for a small grid of Savitzky–Golay windows and pooled lag sets (fractions of the period),
//     stream the lagged Gram matrices once per window at the largest degree; for each lag set,
//     grow the degree until a conserved function appears (mu_1 small, clear spectral gap);
//     choose the configuration with the lowest such degree and the largest gap mu_2/mu_1;
//  3. lambda by a 1-D search on mu_1(lambda), the eigenfunction pinned to vanish at the well;
//  4. sparsity by sequential thresholding on the held-out Pareto front;
//  5. derivative-form cross-check; normalisation; landscape; structure check and replay;
//     forced-run calibration; the energy range the free runs covered (coverage.ts); a verdict
//     that refuses a bad fit.
import type { Recording } from '../types.ts';
import { accumulateDerivativeGram, addDerivativeGram, solveDerivativeForm, type DerivativeGram } from './derivativeForm.ts';
import { fitInputGain } from './forcedScale.ts';
import { recordedCoverage } from './coverage.ts';
import { accumulateGrams, sumGramSets, type GramSet } from './gram.ts';
import { heldOutMu } from './heldOut.ts';
import { findLandscape } from './landscape.ts';
import { buildLibrary, formulaOf, termGrad, termValue, type Term } from './library.ts';
import { estimateNoise, logDecrement } from '../signal/index.ts';
import { minimize1d } from './minimize1d.ts';
import { specFromTerm, type CandidateReport, type EnergyModel, type Landscape, type ReplayReport, type Verdict, type VerdictCode } from './model.ts';
import { dominantPeriod } from './period.ts';
import { prepareRecording, type PreparedRun } from './prepare.ts';
import { sparsify } from './sparsify.ts';
import { nonSeparableShare, replayError, separableParts } from './structure.ts';
import { userTerm } from './userTerm.ts';
import { estimateStates, velocityOnly } from './velocity.ts';
import { solveWeak, weakMatrices } from './weakForm.ts';

export interface LearnOptions {
  /** Largest library degree (default 6 for displacements, 4 for angles). */
  maxDegree?: number;
  /** Degree the growth starts from (default 2). */
  minDegree?: number;
  /** Highest harmonic for angles (default: the degree). */
  harmonics?: number;
  /** Mass (or moment of inertia for angles) in kg (kg m^2): scales H to joules. */
  mass?: number;
  /** Keep odd powers of v in the library (default false: H even in v, see library.ts). */
  oddV?: boolean;
  /** Extra library terms as formulas in q and v. */
  userTerms?: string[];
  /** Savitzky–Golay half-windows as fractions of the shortest run period (default below). */
  windowFractions?: number[];
  /** Pooled lag sets as fractions of the dominant period (default below). */
  lagSets?: number[][];
  /** Savitzky–Golay polynomial order (default 6). */
  savgolOrder?: number;
  /** Called with the fraction done (0..1) and the stage, e.g. for a worker's progress messages. */
  onProgress?: (fraction: number, stage: string) => void;
}

/** Checks the options once, naming the bad one. */
function checkOptions(o: LearnOptions): void {
  const int = (name: string, v: number | undefined, lo: number, hi: number) => {
    if (v !== undefined && !(Number.isInteger(v) && v >= lo && v <= hi)) throw new RangeError(`learnEnergy: options.${name} must be an integer in ${lo}..${hi}, got ${v}`);
  };
  int('maxDegree', o.maxDegree, 1, 12); int('minDegree', o.minDegree, 1, 12); int('harmonics', o.harmonics, 1, 12); int('savgolOrder', o.savgolOrder, 2, 10);
  if (o.mass !== undefined && !(o.mass > 0 && Number.isFinite(o.mass))) throw new RangeError(`learnEnergy: options.mass must be a positive number, got ${o.mass}`);
  if (o.windowFractions !== undefined && (!Array.isArray(o.windowFractions) || o.windowFractions.length === 0 || o.windowFractions.some((f) => !(f > 0 && f < 1)))) {
    throw new RangeError('learnEnergy: options.windowFractions must be a non-empty array of fractions of the period in (0, 1)');
  }
  if (o.lagSets !== undefined && (!Array.isArray(o.lagSets) || o.lagSets.length === 0 || o.lagSets.some((set) => !Array.isArray(set) || set.length === 0 || set.some((f) => !(f > 0 && f < 5))))) {
    throw new RangeError('learnEnergy: options.lagSets must be a non-empty array of non-empty arrays of lags in periods, each in (0, 5)');
  }
  if (o.userTerms !== undefined && (!Array.isArray(o.userTerms) || o.userTerms.some((t) => typeof t !== 'string'))) throw new RangeError('learnEnergy: options.userTerms must be an array of formula strings');
}

/** Thresholds of the verdict (relative non-conservation, spectral gap, damping ratio, signal-to-noise). */
/** A function one degree higher replaces the first conserved one when its non-conservation is this many times smaller. */
const LEVEL_UP_FACTOR = 10;

export const LEARN_LIMITS = { muMax: 0.02, gapMin: 5, zetaMax: 0.1, snrMin: 20, minPeriods: 3 };
const WINDOW_FRACTIONS = [0.04, 0.07, 0.11, 0.17];
/** Largest number of samples the window/lag/degree search looks at (the final fit uses all). */
const SEARCH_SAMPLES = 300_000;

/** Runs for the grid search: all of them when small enough, else evenly spread runs, cut to fit. */
function searchSubset(runs: Float64Array[], limit: number): { runs: Float64Array[]; subset: boolean } {
  const total = runs.reduce((s, q) => s + q.length, 0);
  if (total <= limit) return { runs, subset: false };
  const per = Math.max(Math.ceil(limit / runs.length), Math.min(limit, 2000));
  const out: Float64Array[] = [];
  let used = 0;
  const stride = Math.max(1, Math.floor(runs.length / Math.max(1, Math.floor(limit / per))));
  for (let i = 0; i < runs.length && used < limit; i += stride) {
    const q = runs[i].subarray(0, Math.min(runs[i].length, per, limit - used));
    out.push(q);
    used += q.length;
  }
  return { runs: out, subset: true };
}
const LAG_SETS = [[0.05, 0.09, 0.14], [0.11, 0.19, 0.31]];

interface Config { window: number; lagIdx: number[]; degree: number; active: number[]; lambda: number; shift: Float64Array; mu1: number; mu2: number; gap: number; heldOut: number }

function blankModel(coordinate: Recording['coordinate'], verdict: Verdict, dt: number): EnergyModel {
  return {
    format: 'ergostat-energy-model', version: 1, status: 'no-energy', verdict, coordinate,
    library: { degree: 0, harmonics: null, evenV: true, terms: [] }, coefficients: [], offset: 0, formula: '', units: 'J/kg', lambda: 0,
    damping: { lambda: 0, period: NaN, omegaN: NaN, zetaFromLambda: NaN, zetaLogDecrement: null, lambdaDerivativeForm: null },
    scale: { mass: null, massSource: 'none', massFromForcedRun: null, inputGain: null, forcedRunR2: null, joulesPerModelUnit: 1 },
    landscape: null,
    structure: { separable: false, nonSeparableShare: NaN, massFormula: null, potentialFormula: null },
    replay: [],
    metrics: {
      samples: 0, runs: 0, freeRuns: 0, forcedRuns: 0, dt, noiseSigma: NaN, signalToNoise: NaN,
      halfWindow: 0, windowSeconds: 0, savgolOrder: 0, lagsSeconds: [], mu1: NaN, mu2: NaN, gap: NaN, heldOut: NaN,
      nullSpaceDimension: 0, ridge: 0, derivativeForm: null, candidates: [], pareto: [], sparsityThreshold: 0,
    },
  };
}

const ADVICE: Record<VerdictCode, string> = {
  'ok': '',
  'too-little-data': 'record more free swings: several runs, each at least a few periods long, at different amplitudes',
  'noise-only': 'check the sensor channel and its scaling; the position must swing well above the noise',
  'heavy-damping': 'the rig loses too much energy per swing for an energy map; reduce friction or record with the damper removed',
  'not-conserved': 'make sure the runs are free swings (no drive, or give the drive as --input), try a higher --degree, or add terms with user formulas',
  'no-free-runs': 'add at least a few free-swing runs (input zero) to learn from; forced runs only calibrate the scale',
};

function verdict(code: VerdictCode, reason: string): Verdict {
  return { code, ok: code === 'ok', reason, advice: ADVICE[code] };
}

/** Splits one long run into time blocks so that held-out checks are possible. */
function segmentsOf(runs: Float64Array[][], minBlocks: number): Float64Array[][] {
  if (runs.length >= 2) return runs;
  const [q, v] = runs[0];
  const n = q.length, b = minBlocks;
  const out: Float64Array[][] = [];
  for (let k = 0; k < b; k++) {
    const s = Math.floor((k * n) / b), e = Math.floor(((k + 1) * n) / b);
    out.push([q.subarray(s, e), v.subarray(s, e)]);
  }
  return out;
}

function selectLags(g: GramSet, idx: number[]): GramSet {
  return { ...g, lags: idx.map((i) => g.lags[i]) };
}

function termsValueAt(terms: Term[], q: number, v: number): Float64Array {
  return Float64Array.from(terms.map((t) => termValue(t, q, v)));
}

function evalH(terms: Term[], xi: ArrayLike<number>, q: number, v: number): number {
  let s = 0;
  for (let j = 0; j < terms.length; j++) if (xi[j] !== 0) s += xi[j] * termValue(terms[j], q, v);
  return s;
}

function dHdv(terms: Term[], xi: ArrayLike<number>, q: number, v: number, g: Float64Array): number {
  let s = 0;
  for (let j = 0; j < terms.length; j++) if (xi[j] !== 0) { termGrad(terms[j], q, v, g); s += xi[j] * g[1]; }
  return s;
}

/** Orientation of H: +1 when H grows with |v| on the data (mean of v dH/dv positive). */
function orientation(terms: Term[], xi: ArrayLike<number>, states: Float64Array[][]): number {
  const g = new Float64Array(2);
  let s = 0;
  for (const [q, v] of states) {
    const step = Math.max(1, Math.floor(q.length / 300));
    for (let i = 0; i < q.length; i += step) s += v[i] * dHdv(terms, xi, q[i], v[i], g);
  }
  return s < 0 ? -1 : 1;
}

/** Position of the deepest well of V(q) = sign * H(q, 0) on the range (grid argmin when V has no interior minimum). */
function deepestWell(terms: Term[], xi: ArrayLike<number>, sign: number, lo: number, hi: number): number {
  let best = lo, bv = Infinity;
  for (let i = 0; i <= 400; i++) {
    const q = lo + ((hi - lo) * i) / 400;
    const val = sign * evalH(terms, xi, q, 0);
    if (val < bv) { bv = val; best = q; }
  }
  return best;
}

export function learnEnergy(rec: Recording, opts: LearnOptions = {}): EnergyModel {
  checkOptions(opts);
  const prep = prepareRecording(rec);
  const { dt } = prep;
  const angle = rec.coordinate === 'angle';
  const fail = (code: VerdictCode, reason: string, extra?: (m: EnergyModel) => void) => {
    const m = blankModel(rec.coordinate, verdict(code, reason), dt);
    m.metrics.samples = prep.samples; m.metrics.runs = rec.runs.length;
    m.metrics.freeRuns = prep.free.length; m.metrics.forcedRuns = prep.forced.length;
    extra?.(m);
    return m;
  };
  const progress = opts.onProgress ?? (() => {});
  if (prep.free.length === 0) return fail('no-free-runs', 'every run has a non-zero input, so none is a free swing');
  const free = prep.free;
  const minLen = Math.min(...free.map((r) => r.q.length));
  const totalFree = free.reduce((s, r) => s + r.q.length, 0);
  if (totalFree < 200 || minLen < 20) return fail('too-little-data', `only ${totalFree} free-swing samples (shortest run ${minLen}); at least 200 are needed`);

  // Noise and signal level.
  const sigmas = free.map((r) => estimateNoise(r.q, dt).sigma).sort((a, b) => a - b);
  const sigma = sigmas[sigmas.length >> 1];
  let ss = 0, s1 = 0;
  for (const r of free) { let m = 0; for (const x of r.q) m += x; m /= r.q.length; for (const x of r.q) { ss += (x - m) ** 2; s1++; } }
  const spread = Math.sqrt(ss / s1);
  const snr = sigma > 0 ? spread / sigma : Infinity;
  const noiseInfo = (m: EnergyModel) => { m.metrics.noiseSigma = sigma; m.metrics.signalToNoise = snr; };
  if (!(snr >= LEARN_LIMITS.snrMin)) return fail('noise-only', `the position varies only ${snr.toFixed(1)} times its noise level (${sigma.toExponential(2)}); at least ${LEARN_LIMITS.snrMin} is needed`, noiseInfo);

  // Dominant period from velocity turning points, with a threshold of three times the velocity
  // noise of the current window (its noise gain from the filter's impulse response); the window is
  // refined to 1/16 of the shortest run period.
  const velNoise = (m: number) => {
    const x = new Float64Array(4 * m + 3);
    x[2 * m + 1] = 1;
    const r = velocityOnly(x, dt, m);
    let s2 = 0;
    for (let i = m; i < r.length - m; i++) s2 += r[i] * r[i];
    return sigma * Math.sqrt(s2);
  };
  const clampW = (m: number) => Math.max(2, Math.min(Math.floor((minLen - 1) / 2), 400, Math.round(m)));
  let m0 = clampW(Math.min(minLen / 40, 25));
  let period = NaN, shortest = NaN;
  for (let it = 0; it < 5; it++) {
    const vs = free.map((r) => velocityOnly(r.q, dt, m0));
    const pe = dominantPeriod(vs, dt, 0.1, 3 * velNoise(m0));
    period = pe.period;
    const finite = pe.perRun.filter(Number.isFinite);
    shortest = finite.length ? Math.min(...finite) : period;
    if (!Number.isFinite(period)) break;
    const m1 = clampW(shortest / 16 / dt);
    if (m1 === m0) break;
    m0 = m1;
  }
  const span = totalFree * dt;
  if (!Number.isFinite(period)) return fail('too-little-data', 'no oscillation found: the velocity does not change sign twice in any run', noiseInfo);
  if (span < LEARN_LIMITS.minPeriods * period) {
    return fail('too-little-data', `the free runs span ${span.toFixed(2)} s, only ${(span / period).toFixed(1)} periods of ${period.toFixed(3)} s; at least ${LEARN_LIMITS.minPeriods} are needed`, noiseInfo);
  }
  const omegaN = (2 * Math.PI) / period;

  // Library at the largest degree; lower degrees are prefixes (plus the user terms).
  const maxDeg = opts.maxDegree ?? (angle ? 4 : 6);
  const minDeg = Math.min(opts.minDegree ?? 2, maxDeg);
  const user = (opts.userTerms ?? []).map((s) => userTerm(s));
  const libOpts = { coordinate: rec.coordinate, harmonics: opts.harmonics, evenV: !opts.oddV } as const;
  const terms = buildLibrary({ ...libOpts, degree: maxDeg, userTerms: user });
  const P = terms.length;
  const base = P - user.length;
  const activeFor = (d: number) => {
    const k = buildLibrary({ ...libOpts, degree: d }).length;
    const a = Array.from({ length: k }, (_, i) => i);
    for (let j = base; j < P; j++) a.push(j);
    return a;
  };

  // Grid of windows and lag sets.
  const order = opts.savgolOrder ?? 6;
  const windows = [...new Set((opts.windowFractions ?? WINDOW_FRACTIONS).map((f) => Math.max(2, Math.round((f * shortest) / dt))))]
    .filter((m) => 2 * m + 1 <= minLen);
  const lagSets = (opts.lagSets ?? LAG_SETS).map((s) => [...new Set(s.map((f) => Math.max(1, Math.round((f * period) / dt))))]);
  const allLags = [...new Set(lagSets.flat())].sort((a, b) => a - b);
  const lagIdx = lagSets.map((s) => s.map((L) => allLags.indexOf(L)));
  if (windows.length === 0) return fail('too-little-data', `runs of ${minLen} samples are too short for the smoothing windows this period needs`, noiseInfo);

  let qLo = Infinity, qHi = -Infinity;
  for (const r of free) for (const x of r.q) { qLo = Math.min(qLo, x); qHi = Math.max(qHi, x); }
  const [rLo, rHi] = angle ? [-Math.PI, Math.PI] : [qLo, qHi];
  const lamRange: [number, number] = [-2.5 * omegaN, 0.2 * omegaN];

  const candidates: CandidateReport[] = [];
  const segGrams = new Map<number, GramSet[]>();
  let chosen: Config | null = null;
  let fallback: Config | null = null;
  const found: Config[] = [];
  // The grid search runs on at most SEARCH_SAMPLES samples (runs spread over the recording, the
  // longest cut); the chosen configuration is then accumulated over all the data.
  const search = searchSubset(free.map((r) => r.q), SEARCH_SAMPLES);
  const gramsFor = (m: number, qs: Float64Array[], lags: number[]) => {
    const st = qs.map((q) => { const s = estimateStates(q, dt, m, order); return [s.q, s.v]; });
    return { states: st, grams: segmentsOf(st, 4).map(([q, v]) => accumulateGrams(q, v, terms, lags)) };
  };
  for (const [wi, m] of windows.entries()) {
    progress((0.8 * wi) / windows.length, `searching window ${wi + 1} of ${windows.length}`);
    const { states, grams } = gramsFor(m, search.runs, allLags);
    if (!search.subset) segGrams.set(m, grams);
    const pooledAll = sumGramSets(grams, P, allLags);
    for (let li = 0; li < lagSets.length; li++) {
      const pooled = selectLags(pooledAll, lagIdx[li]);
      // One degree of the library: the best lambda and the weak-form eigenpair (null when the
      // problem cannot be solved or nothing is nearly conserved at this degree).
      const evalDegree = (d: number): { cfg: Config; ok: boolean } | null => {
        const active = activeFor(d);
        let sol0;
        try { sol0 = solveWeak(pooled, dt, 0, null, active); } catch { return null; }
        const sign0 = orientation(terms, sol0.xi, states);
        const shift0 = termsValueAt(terms, deepestWell(terms, sol0.xi, sign0, rLo, rHi), 0);
        // Coarse look over lambda first; the full search only where a conserved function is plausible.
        let coarse = sol0.mu[0];
        for (const f of [0.05, 0.2, 0.5, 1, 1.6]) {
          try { coarse = Math.min(coarse, solveWeak(pooled, dt, -f * omegaN, shift0, active).mu[0]); } catch { /* skip */ }
        }
        if (coarse > 10 * LEARN_LIMITS.muMax) {
          candidates.push({ halfWindow: m, lagsSeconds: lagSets[li].map((L) => L * dt), degree: null, mu1: coarse, mu2: NaN, gap: NaN, heldOut: NaN, lambda: NaN });
          return null;
        }
        const sign = orientation(terms, sol0.xi, states);
        const shift = termsValueAt(terms, deepestWell(terms, sol0.xi, sign, rLo, rHi), 0);
        const mu = (l: number) => { try { return solveWeak(pooled, dt, l, shift, active).mu[0]; } catch { return Infinity; } };
        const best = minimize1d(mu, lamRange[0], lamRange[1], { scan: 10, tol: 1e-4 * omegaN });
        const sol = solveWeak(pooled, dt, best.x, shift, active);
        const cfg: Config = { window: m, lagIdx: lagIdx[li], degree: d, active, lambda: best.x, shift, mu1: sol.mu[0], mu2: sol.mu[1], gap: sol.gap, heldOut: NaN };
        const ok = cfg.mu1 <= LEARN_LIMITS.muMax && cfg.gap >= LEARN_LIMITS.gapMin;
        if (ok) cfg.heldOut = heldOutMu(grams.map((g) => selectLags(g, lagIdx[li])), pooled, dt, cfg.lambda, shift, active);
        candidates.push({ halfWindow: m, lagsSeconds: lagSets[li].map((L) => L * dt), degree: ok ? d : null, mu1: cfg.mu1, mu2: cfg.mu2, gap: cfg.gap, heldOut: cfg.heldOut, lambda: cfg.lambda });
        if (!fallback || cfg.mu1 < fallback.mu1) fallback = cfg;
        return { cfg, ok };
      };
      for (let d = minDeg; d <= maxDeg; d++) {
        const r = evalDegree(d);
        if (!r || !r.ok) continue;
        // A lower-degree function can pass the limits while conserved only piecewise, e.g. an odd
        // function of q that stays constant on orbits inside each well of a double well but not
        // across the barrier. The energy then shows up one degree higher with a non-conservation
        // an order of magnitude smaller: take it. Functions of H (H^2, ...) do not improve on H
        // by that factor, so H is still found before H^2.
        let accept = r.cfg;
        if (d + 1 <= maxDeg) {
          const up = evalDegree(d + 1);
          if (up && up.ok && up.cfg.mu1 <= r.cfg.mu1 / LEVEL_UP_FACTOR) accept = up.cfg;
        }
        found.push(accept);
        break;
      }
    }
  }
  // Choice: the lowest degree at which a conserved function appears; among those configurations,
  // the ones whose held-out non-conservation is within 1.5x of the best, and of these the
  // largest spectral gap (a clear conserved function stands far below the next one).
  if (found.length) {
    const dMin = Math.min(...found.map((c) => c.degree));
    let atMin = found.filter((c) => c.degree === dMin);
    // The same level-up rule as in the degree growth, across windows and lags.
    const bestLow = Math.min(...atMin.map((c) => c.mu1));
    const higher = found.filter((c) => c.degree === dMin + 1 && c.mu1 <= bestLow / LEVEL_UP_FACTOR);
    if (higher.length > 0) atMin = higher;
    const hs = atMin.map((c) => c.heldOut).filter(Number.isFinite);
    const hBest = hs.length ? Math.min(...hs) : NaN;
    const eligible = atMin.filter((c) => !Number.isFinite(hBest) || !Number.isFinite(c.heldOut) || c.heldOut <= 1.5 * hBest);
    chosen = eligible.reduce((a, b) => (b.gap > a.gap ? b : a));
  }
  const lagsOf = (c: Config) => c.lagIdx.map((i) => allLags[i] * dt);
  const pick = chosen ?? fallback;
  if (!pick) return fail('not-conserved', 'the weak-form problem could not be solved for any window (a library term is constant on the data)', noiseInfo);
  const pickLags = pick.lagIdx.map((i) => allLags[i]);
  const grams = segGrams.has(pick.window)
    ? segGrams.get(pick.window)!.map((g) => selectLags(g, pick.lagIdx))
    : gramsFor(pick.window, free.map((r) => r.q), pickLags).grams;
  const pooled = sumGramSets(grams, P, pickLags);
  const held = heldOutMu(grams, pooled, dt, pick.lambda, pick.shift, pick.active);
  const full = solveWeak(pooled, dt, pick.lambda, pick.shift, pick.active);
  const nullDim = Array.from(full.mu).filter((x) => x <= LEARN_LIMITS.muMax).length;

  progress(0.8, 'sparsity and final fit');
  // Sparsity on the held-out Pareto front, then lambda again on the sparse set.
  const sp = sparsify(grams, pooled, dt, pick.lambda, pick.shift, pick.active);
  const states = free.map((r) => { const s = estimateStates(r.q, dt, pick.window, order, true); return { q: s.q, v: s.v, a: s.a! }; });
  const stPairs = states.map((s) => [s.q, s.v]);
  let xi = solveWeak(pooled, dt, pick.lambda, pick.shift, sp.active).xi;
  const sign0 = orientation(terms, xi, stPairs);
  const shift = termsValueAt(terms, deepestWell(terms, xi, sign0, rLo, rHi), 0);
  const lamBest = minimize1d((l) => { try { return solveWeak(pooled, dt, l, shift, sp.active).mu[0]; } catch { return Infinity; } }, lamRange[0], lamRange[1], { scan: 10, tol: 1e-5 * omegaN });
  const lambda = lamBest.x;
  const fin = solveWeak(pooled, dt, lambda, shift, sp.active);
  xi = fin.xi;
  const heldSparse = heldOutMu(grams, pooled, dt, lambda, shift, sp.active);

  // Derivative-form cross-check on the same terms.
  let dg: DerivativeGram | null = null;
  for (const s of states) { const g = accumulateDerivativeGram(s.q, s.v, s.a, terms, shift); dg = dg ? addDerivativeGram(dg, g) : g; }
  const { C } = weakMatrices(pooled, dt, lambda, shift, sp.active);
  let derivative: EnergyModel['metrics']['derivativeForm'] = null;
  try {
    const df = solveDerivativeForm(dg!, C, sp.active, lamRange);
    const k = sp.active.length;
    let ab = 0, aa = 0, bb = 0;
    for (let a = 0; a < k; a++) for (let b = 0; b < k; b++) {
      const c = C[a * k + b], xa = xi[sp.active[a]], xb = xi[sp.active[b]], ya = df.xi[sp.active[a]], yb = df.xi[sp.active[b]];
      ab += xa * c * yb; aa += xa * c * xb; bb += ya * c * yb;
    }
    derivative = { lambda: df.lambda, mu1: df.mu1, agreement: (ab * ab) / (aa * bb) };
  } catch {
    derivative = null;
  }

  // Normalisation: sign, offset at the deepest well, unit kinetic coefficient there, then mass.
  const sign = orientation(terms, xi, stPairs);
  const raw = Array.from(xi, (x) => sign * x);
  const qStar = deepestWell(terms, raw, 1, rLo, rHi);
  let landscape: Landscape = findLandscape((q) => evalH(terms, raw, q, 0), rLo, angle ? Math.PI : rHi, angle);
  const deepest = landscape.wells.length ? landscape.wells.reduce((a, b) => (b.V < a.V ? b : a)) : { q: qStar, V: evalH(terms, raw, qStar, 0) };
  let vrms = 0, nv = 0;
  for (const s of states) for (let i = 0; i < s.v.length; i += 7) { vrms += s.v[i] ** 2; nv++; }
  const dv = 1e-3 * Math.sqrt(vrms / nv);
  const g2 = new Float64Array(2);
  const kappa = (dHdv(terms, raw, deepest.q, dv, g2) - dHdv(terms, raw, deepest.q, -dv, g2)) / (4 * dv);
  const unit = kappa > 0 ? 1 / (2 * kappa) : 1;
  const unitCoef = raw.map((x) => x * unit);
  const unitOffset = -deepest.V * unit;

  // Forced runs: input gain g and the mass 1/g from the unit-mass model.
  let gainFit: { gain: number; r2: number } | null = null;
  if (prep.forced.length > 0) {
    const fr = prep.forced.filter((r: PreparedRun) => 2 * pick.window + 1 <= r.q.length).map((r) => { const s = estimateStates(r.q, dt, pick.window, order); return { q: s.q, v: s.v, u: r.u! }; });
    if (fr.length) {
      const f = fitInputGain(fr, (q, v) => evalH(terms, unitCoef, q, v) + unitOffset, (q, v, out) => {
        let a = 0, b = 0;
        for (let j = 0; j < P; j++) if (unitCoef[j] !== 0) { termGrad(terms[j], q, v, g2); a += unitCoef[j] * g2[0]; b += unitCoef[j] * g2[1]; }
        out[0] = a; out[1] = b;
      }, lambda, dt, Math.max(1, Math.round((0.25 * period) / dt)), pick.window);
      gainFit = { gain: f.gain, r2: f.r2 };
    }
  }
  const massFromForced = gainFit && gainFit.gain > 0 && gainFit.r2 > 0.9 ? 1 / gainFit.gain : null;
  const mass = opts.mass ?? massFromForced;
  const scale = mass ?? 1;
  const coefficients = unitCoef.map((x) => x * scale);
  const offset = unitOffset * scale;
  landscape = findLandscape((q) => evalH(terms, coefficients, q, 0) + offset, rLo, angle ? Math.PI : rHi, angle);

  // Structure check and replay.
  const sub = (x: Float64Array) => x.filter((_, i) => i % Math.max(1, Math.floor(totalFree / 20000)) === 0);
  const qAll = new Float64Array(states.flatMap((s) => Array.from(sub(s.q))));
  const vAll = new Float64Array(states.flatMap((s) => Array.from(sub(s.v))));
  const share = nonSeparableShare(terms, coefficients, qAll, vAll);
  const parts = separableParts(terms, coefficients);
  let mPositive = true;
  for (let i = 0; i <= 200; i++) if (!(parts.M(rLo + ((rHi - rLo) * i) / 200) > 0)) { mPositive = false; break; }
  const separable = share < 0.01 && mPositive;
  const replay: ReplayReport[] = [];
  if (separable) {
    free.forEach((r, k) => {
      const i0 = pick.window, steps = Math.min(r.q.length - 1 - i0, Math.round((3 * period) / dt));
      if (steps < 10) return;
      const e = replayError(parts, lambda, states[k].q[i0], states[k].v[i0], dt, r.q, i0, steps);
      replay.push({ run: r.name, seconds: steps * dt, rmsError: e.rms, relativeError: e.relative });
    });
  }
  const mTerms: Term[] = [], mCoef: number[] = [], vTerms: Term[] = [], vCoef: number[] = [];
  let mConst = 0;
  terms.forEach((t, j) => {
    if (coefficients[j] === 0 || t.kind === 'user') return;
    if (t.b === 2) {
      if (t.kind === 'mono' && t.a === 0) mConst += 2 * coefficients[j];
      else { mTerms.push({ ...t, b: 0 }); mCoef.push(2 * coefficients[j]); }
    } else if (t.b === 0) { vTerms.push(t); vCoef.push(coefficients[j]); }
  });

  progress(0.95, 'damping and verdict');
  const zetaLambda = -lambda / (2 * omegaN);
  const zetaLog = (() => {
    // Log decrement per free run (engine/signal, references.md §2) with the chosen window; median over runs.
    const z: number[] = [];
    for (const r of free) {
      if (r.q.length < 64) continue;
      const ld = logDecrement(r.q, dt, { smoothing: { halfWindow: pick.window, order: Math.min(order, 2 * pick.window) }, noiseSigma: sigma });
      if (ld.status === 'ok' && Number.isFinite(ld.zeta)) z.push(ld.zeta);
    }
    z.sort((a, b) => a - b);
    return z.length ? z[z.length >> 1] : null;
  })();
  // The range the free runs covered: H on the same Savitzky–Golay states the fit used, robust
  // extremes per run (0.5th / 99.5th percentiles), then over the runs (coverage.ts).
  const finalCoef = Array.from(coefficients, (x, j) => (sp.active.includes(j) ? x : 0));
  const coverage = recordedCoverage(states, (q, v) => evalH(terms, finalCoef, q, v) + offset, { periodic: angle, trim: pick.window, joulesPerModelUnit: scale });
  const model: EnergyModel = {
    format: 'ergostat-energy-model', version: 1, status: 'ok', verdict: verdict('ok', 'a lightly damped conserved energy was found'),
    coordinate: rec.coordinate,
    library: { degree: pick.degree, harmonics: angle ? (opts.harmonics ?? maxDeg) : null, evenV: !opts.oddV, terms: terms.map(specFromTerm) },
    coefficients: finalCoef,
    offset,
    formula: formulaOf(terms, coefficients, offset),
    units: mass !== null ? 'J' : 'J/kg',
    lambda,
    damping: { lambda, period, omegaN, zetaFromLambda: zetaLambda, zetaLogDecrement: zetaLog, lambdaDerivativeForm: derivative?.lambda ?? null },
    scale: {
      mass, massSource: opts.mass !== undefined ? 'given' : massFromForced !== null ? 'forced-run' : 'none',
      massFromForcedRun: massFromForced, inputGain: gainFit?.gain ?? null, forcedRunR2: gainFit?.r2 ?? null, joulesPerModelUnit: scale,
    },
    landscape,
    structure: { separable, nonSeparableShare: share, massFormula: separable ? formulaOf(mTerms, mCoef, mConst) : null, potentialFormula: separable ? formulaOf(vTerms, vCoef, offset) : null },
    replay,
    ...(coverage ? { coverage } : {}),
    metrics: {
      samples: prep.samples, runs: rec.runs.length, freeRuns: free.length, forcedRuns: prep.forced.length, dt,
      noiseSigma: sigma, signalToNoise: snr,
      halfWindow: pick.window, windowSeconds: (2 * pick.window + 1) * dt, savgolOrder: Math.min(order, 2 * pick.window), lagsSeconds: lagsOf(pick),
      mu1: fin.mu[0], mu2: fin.mu.length > 1 ? fin.mu[1] : NaN, gap: full.gap, heldOut: Number.isFinite(heldSparse) ? heldSparse : held,
      nullSpaceDimension: nullDim, ridge: fin.ridge, derivativeForm: derivative, candidates, pareto: sp.pareto, sparsityThreshold: sp.threshold,
    },
  };
  // Verdict: never present a bad fit as a result.
  let v: Verdict | null = null;
  const heavy = zetaLambda > LEARN_LIMITS.zetaMax || (zetaLog !== null && zetaLog > LEARN_LIMITS.zetaMax);
  const heavyText = `damping ratio ${zetaLambda.toFixed(3)} from lambda${zetaLog !== null ? ` and ${zetaLog.toFixed(3)} from the log decrement` : ''}, above ${LEARN_LIMITS.zetaMax}`;
  if (!chosen && heavy && pick.mu1 <= 10 * LEARN_LIMITS.muMax) v = verdict('heavy-damping', `no lightly damped energy: the best energy-like function decays fast (${heavyText}) and is not clearly conserved (non-conservation ${pick.mu1.toExponential(2)}, gap ${pick.gap.toFixed(1)})`);
  else if (!chosen) v = verdict('not-conserved', `no function in the library up to degree ${maxDeg} is conserved: best relative non-conservation ${pick.mu1.toExponential(2)} (limit ${LEARN_LIMITS.muMax}), spectral gap ${pick.gap.toFixed(1)} (at least ${LEARN_LIMITS.gapMin} needed)`);
  else if (Number.isFinite(model.metrics.heldOut) && model.metrics.heldOut > 5 * LEARN_LIMITS.muMax) v = verdict('not-conserved', `the energy found is not conserved on held-out runs (relative non-conservation ${model.metrics.heldOut.toExponential(2)})`);
  else if (!(kappa > 0)) v = verdict('not-conserved', 'the conserved function found does not grow with the speed, so it is not an energy');
  else if (heavy) v = verdict('heavy-damping', `no lightly damped energy: ${heavyText}`);
  if (v) {
    // The rejected candidate is not handed out as a result: only its diagnostics stay (metrics, damping).
    model.status = 'no-energy'; model.verdict = v;
    model.coefficients = model.coefficients.map(() => 0); model.offset = 0; model.formula = '';
    model.landscape = null; model.replay = []; delete model.coverage;
    model.structure = { separable: false, nonSeparableShare: NaN, massFormula: null, potentialFormula: null };
  }
  progress(1, 'done');
  return model;
}

