// Choice of the Savitzky–Golay window and order for the velocity, by the smallest estimated
// mean-square velocity error (a bias–variance balance, as in Press et al., "Numerical Recipes",
// 3rd ed., §14.9, which discusses it without a formula; the rule below is ours).
//
// For centred first-derivative weights w_j (j = -m..m, antisymmetric) and white noise of
// standard deviation s (from estimateNoise), the error of the velocity at an interior sample is
//   noise part   s^2 * sum_j w_j^2 / dt^2                                      (exact), plus
//   bias part    sum over frequencies f of P(f) * |G(f) - 2 pi f|^2,
// with G(f) = 2 sum_{j>0} w_j sin(2 pi f j dt) / dt the filter's gain on a sinusoid (the true
// derivative gains 2 pi f) and P(f) the signal's power spectrum. P is the Welch spectrum of the
// samples minus the noise floor s^2 / L, keeping only bins significantly above the floor
// (chi-square test at 1 % for the whole record, Bonferroni over bins), so that noise is not
// mistaken for fast signal. Orders 2, 4, 6 are tried (an odd order p has the same centred
// velocity weights as the even order p + 1, by symmetry of the window), with every
// half-window up to 40 and then 6 % steps up to a quarter of the record (at most 2000).
import { savgolCoefficients } from './savgol.ts';
import { estimateNoise, type NoiseEstimate } from './noise.ts';
import { welchSpectrum } from './spectrum.ts';

export interface SavgolChoice {
  halfWindow: number;
  order: number;
  /** Why this window, in words (for reports). */
  reason: string;
  /** Estimated RMS velocity error at interior samples (units/s): sqrt(noisePart + biasPart). */
  velocityRmsError: number;
  /** RMS of the noise part alone. */
  noiseRms: number;
  /** RMS of the bias part alone. */
  biasRms: number;
}

export interface ChooseSavgolOverride {
  halfWindow?: number;
  order?: number;
}

const ORDERS = [2, 4, 6];
const MAX_HALF_WINDOW = 2000;

/** Upper quantile z with P(Z > z) = p of the standard normal, A&S 26.2.23 (|error| < 4.5e-4), p <= 0.5. */
function normalUpperQuantile(p: number): number {
  const t = Math.sqrt(-2 * Math.log(p));
  return t - (2.515517 + 0.802853 * t + 0.010328 * t * t) / (1 + 1.432788 * t + 0.189269 * t * t + 0.001308 * t * t * t);
}

/** Upper p-quantile of chi-square(nu) / nu, Wilson–Hilferty cube-root approximation (A&S 26.4.17). */
function chiSquareMeanQuantile(nu: number, p: number): number {
  const z = normalUpperQuantile(p);
  const a = 2 / (9 * nu);
  return Math.pow(1 - a + z * Math.sqrt(a), 3);
}

function halfWindowGrid(order: number, mMax: number): number[] {
  const out: number[] = [];
  for (let m = Math.max(1, Math.ceil(order / 2)); m <= mMax; m = m < 40 ? m + 1 : Math.ceil(m * 1.06)) out.push(m);
  if (out.length > 0 && out[out.length - 1] < mMax) out.push(mMax);
  return out;
}

interface SignalBins { omega: Float64Array; power: Float64Array; count: number; fmax: number }

function significantBins(x: Float64Array, dt: number, sigma: number): SignalBins {
  const sp = welchSpectrum(x, dt);
  const L = sp.segment;
  // Hann segments overlapping by half are correlated (variance correlation about 0.167 between
  // neighbours, Welch 1967, from memory): equivalent chi-square degrees of freedom, conservatively.
  const nu = sp.segments === 1 ? 2 : (2 * sp.segments) / (1 + 2 * 0.167);
  const floor = (sigma * sigma) / L;
  const threshold = floor * chiSquareMeanQuantile(nu, 0.01 / (L / 2));
  const omega: number[] = [], power: number[] = [];
  let fmax = 0;
  for (let k = 1; k <= L / 2; k++) {
    const p = sp.power[k];
    if (p > threshold && p > 0) {
      omega.push(2 * Math.PI * k * sp.df);
      power.push((k === L / 2 ? 1 : 2) * (p - floor));
      fmax = k * sp.df;
    }
  }
  return { omega: Float64Array.from(omega), power: Float64Array.from(power), count: omega.length, fmax };
}

interface Score { mse: number; noise2: number; bias2: number }

function score(m: number, order: number, dt: number, sigma: number, bins: SignalBins): Score {
  const w = savgolCoefficients(m, order, 1, 0); // index m + j holds w_j
  let sumW2 = 0;
  for (let j = 0; j < w.length; j++) sumW2 += w[j] * w[j];
  const noise2 = (sigma * sigma * sumW2) / (dt * dt);
  let bias2 = 0;
  for (let b = 0; b < bins.count; b++) {
    const theta = bins.omega[b] * dt;
    // sum_{j>0} w_j sin(j theta) by the recurrence sin((j+1)t) = 2 cos t sin(jt) - sin((j-1)t).
    const c2 = 2 * Math.cos(theta);
    let sPrev = 0, s = Math.sin(theta), acc = 0;
    for (let j = 1; j <= m; j++) {
      acc += w[m + j] * s;
      const next = c2 * s - sPrev;
      sPrev = s;
      s = next;
    }
    const err = (2 * acc) / dt - bins.omega[b];
    bias2 += bins.power[b] * err * err;
  }
  return { mse: noise2 + bias2, noise2, bias2 };
}

/**
 * Chooses (halfWindow, order) for the Savitzky–Golay velocity of x sampled every dt seconds.
 * noise: a previous estimateNoise(x, dt) (computed here if absent). override: fixes the half
 * window and/or the order; a fixed value is validated and the other one is still chosen.
 */
export function chooseSavgol(x: Float64Array, dt: number, noise?: NoiseEstimate, override: ChooseSavgolOverride = {}): SavgolChoice {
  if (!(x instanceof Float64Array)) throw new TypeError('chooseSavgol: x must be a Float64Array');
  if (!(dt > 0) || !Number.isFinite(dt)) throw new RangeError(`chooseSavgol: dt must be a positive finite number, got ${dt}`);
  const n = x.length;
  if (n < 64) throw new RangeError(`chooseSavgol: x needs at least 64 samples, got ${n}`);
  const est = noise ?? estimateNoise(x, dt);
  if (!(est.sigma >= 0) || !Number.isFinite(est.sigma)) throw new RangeError(`chooseSavgol: noise.sigma must be finite and >= 0, got ${est.sigma}`);
  const mMax = Math.min(MAX_HALF_WINDOW, Math.floor((n - 1) / 4));
  const { halfWindow: fixedM, order: fixedP } = override;
  if (fixedP !== undefined && (!Number.isInteger(fixedP) || fixedP < 1 || fixedP > 10)) {
    throw new RangeError(`chooseSavgol: override.order must be an integer in [1, 10], got ${fixedP}`);
  }
  if (fixedM !== undefined) {
    if (!Number.isInteger(fixedM) || fixedM < 1 || 2 * fixedM + 1 > n) {
      throw new RangeError(`chooseSavgol: override.halfWindow must be an integer in [1, ${(n - 1) >> 1}], got ${fixedM}`);
    }
    if (fixedP !== undefined && 2 * fixedM + 1 <= fixedP) {
      throw new RangeError(`chooseSavgol: the window 2*halfWindow+1 = ${2 * fixedM + 1} must exceed order ${fixedP}`);
    }
  }
  const bins = significantBins(x, dt, est.sigma);
  const orders = fixedP !== undefined ? [fixedP] : ORDERS;
  let best: { m: number; p: number; s: Score } | undefined;
  for (const p of orders) {
    const ms = fixedM !== undefined ? (2 * fixedM + 1 > p ? [fixedM] : []) : halfWindowGrid(p, mMax);
    for (const m of ms) {
      const s = score(m, p, dt, est.sigma, bins);
      if (!best || s.mse < best.s.mse) best = { m, p, s };
    }
  }
  if (!best) {
    // Only reachable with a fixed half window too short for every candidate order.
    throw new RangeError(`chooseSavgol: override.halfWindow ${fixedM} leaves no order in {${ORDERS.join(', ')}} with a window exceeding it`);
  }
  const how = fixedM !== undefined && fixedP !== undefined ? 'given by the caller'
    : fixedM !== undefined ? 'half window given, order chosen by the smallest estimated velocity error'
    : fixedP !== undefined ? 'order given, half window chosen by the smallest estimated velocity error'
    : 'chosen by the smallest estimated velocity error';
  const band = bins.count === 0
    ? 'no oscillation stands above the noise floor, so the widest window was taken'
    : `signal above the noise floor up to ${bins.fmax.toPrecision(3)} Hz`;
  const reason = `${how}: noise sigma ${est.sigma.toPrecision(3)}, ${band}; `
    + `estimated RMS velocity error ${Math.sqrt(best.s.mse).toPrecision(3)} (noise ${Math.sqrt(best.s.noise2).toPrecision(3)}, bias ${Math.sqrt(best.s.bias2).toPrecision(3)})`;
  return {
    halfWindow: best.m,
    order: best.p,
    reason,
    velocityRmsError: Math.sqrt(best.s.mse),
    noiseRms: Math.sqrt(best.s.noise2),
    biasRms: Math.sqrt(best.s.bias2),
  };
}
