// White sensor-noise level of a smooth, uniformly sampled signal.
// Difference-based estimator: the k-th difference of white noise of variance s^2 has variance
// C(2k, k) s^2 (binomial identity sum_i C(k,i)^2 = C(2k,k)), while a smooth signal's k-th
// difference shrinks like (omega dt)^k (Rice, Ann. Stat. 12 (1984) 1215, for k = 1; the higher
// orders follow Hall, Kay & Titterington, Biometrika 77 (1990) 521). The spread of the
// differences is their standard deviation after dropping those beyond 5 robust sigmas, the
// robust sigma being 1.4826 x the median absolute deviation (Hampel, JASA 69 (1974) 383), so a
// few glitches do not inflate it.
// Quantization: a reading rounded to a step q carries an error uniform on [-q/2, q/2] with
// standard deviation q / sqrt(12) (common practice); that is taken as a floor.
import { selectInPlace } from '../data/median.ts';

export interface NoiseEstimate {
  /** Noise standard deviation in the signal's units (the larger of the two estimates below). */
  sigma: number;
  /** Quantization step detected in the samples, 0 if the values do not lie on a grid. */
  quantStep: number;
  /** Which estimate set sigma, in words (difference order or quantization floor). */
  method: string;
  /** The difference-based estimate alone. */
  sigmaDifferences: number;
  /** Difference order k used. */
  differenceOrder: number;
  /** One-sided power spectral density of the noise, sigma^2 * 2 dt (units^2 / Hz). */
  density: number;
}

const MAX_ORDER = 8;
/** Within this factor of the smallest normalised spread, the lowest order is preferred. */
const PREFER_LOW = 1.05;

function binomial(n: number, k: number): number {
  let r = 1;
  for (let i = 1; i <= k; i++) r = (r * (n - k + i)) / i;
  return r;
}

/** Median (mean of the two middle values for an even count) by selection; a is reordered. */
function medianInPlace(a: Float64Array): number {
  const n = a.length;
  const h = n >> 1;
  const upper = selectInPlace(a, h);
  if (n % 2) return upper;
  let lower = -Infinity;
  for (let i = 0; i < h; i++) if (a[i] > lower) lower = a[i]; // a[0..h-1] <= a[h] after selection
  return 0.5 * (lower + upper);
}

/**
 * Robust standard deviation of differences d: the plain standard deviation of those within
 * 5 robust sigmas (1.4826 MAD) of the median, so glitches are dropped. The plain deviation of
 * the kept values, not the MAD itself, is returned: the MAD of quantized data can only take
 * grid values and would be biased by up to half a step. floor: the smallest cut-off (a step).
 */
function robustSpread(d: Float64Array, floor: number): number {
  const work = Float64Array.from(d);
  const med = medianInPlace(work);
  const dev = new Float64Array(d.length);
  for (let i = 0; i < d.length; i++) dev[i] = Math.abs(d[i] - med);
  work.set(dev);
  const cut = 5 * Math.max(1.482602218505602 * medianInPlace(work), floor);
  let n = 0, s = 0, s2 = 0;
  for (let i = 0; i < d.length; i++) {
    if (dev[i] <= cut) {
      n++;
      s += d[i];
      s2 += d[i] * d[i];
    }
  }
  const mean = s / n;
  return Math.sqrt(Math.max(0, s2 / n - mean * mean) * (n / Math.max(1, n - 1)));
}

/**
 * The grid step q if every sample equals min(x) + integer * q (within 1e-3 of q), else 0.
 * q is the smallest non-zero change between successive samples, or a divisor of it (2..6).
 * Continuous data fail the test for all but a few samples.
 */
export function quantizationStep(x: Float64Array): number {
  const n = x.length;
  if (n < 3) return 0;
  let lowest = Infinity, highest = -Infinity;
  for (let i = 0; i < n; i++) {
    if (x[i] < lowest) lowest = x[i];
    if (x[i] > highest) highest = x[i];
  }
  const range = highest - lowest;
  if (!(range > 0)) return 0;
  // Smallest non-zero change between successive samples: one step for a quantized smooth signal
  // (or a small multiple of it, tried below by its divisors).
  const tiny = range * 1e-12;
  let gap = Infinity;
  for (let i = 1; i < n; i++) {
    const g = Math.abs(x[i] - x[i - 1]);
    if (g > tiny && g < gap) gap = g;
  }
  if (!Number.isFinite(gap)) return 0;
  for (let div = 1; div <= 6; div++) {
    const q = gap / div;
    if (range / q > 1e12) break;
    let ok = true;
    for (let i = 0; i < n && ok; i++) {
      const r = (x[i] - lowest) / q;
      ok = Math.abs(r - Math.round(r)) < 1e-3;
    }
    if (ok) return q;
  }
  return 0;
}

/** Noise level of x sampled every dt seconds. x is not modified. */
export function estimateNoise(x: Float64Array, dt: number): NoiseEstimate {
  if (!(x instanceof Float64Array)) throw new TypeError('estimateNoise: x must be a Float64Array');
  if (!(dt > 0) || !Number.isFinite(dt)) throw new RangeError(`estimateNoise: dt must be a positive finite number, got ${dt}`);
  const n = x.length;
  if (n < 2 * MAX_ORDER + 8) throw new RangeError(`estimateNoise: x needs at least ${2 * MAX_ORDER + 8} samples, got ${n}`);
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(x[i])) throw new RangeError(`estimateNoise: x[${i}] is not finite (${x[i]})`);
  }
  // Successive differences in place on a copy; spread[k] normalised by sqrt(C(2k, k)).
  const quantStep = quantizationStep(x);
  const d = Float64Array.from(x);
  const spread = new Float64Array(MAX_ORDER + 1);
  let len = n;
  for (let k = 1; k <= MAX_ORDER; k++) {
    for (let i = 0; i < len - 1; i++) d[i] = d[i + 1] - d[i];
    len--;
    spread[k] = robustSpread(d.subarray(0, len), quantStep) / Math.sqrt(binomial(2 * k, k));
  }
  let smallest = Infinity;
  for (let k = 1; k <= MAX_ORDER; k++) smallest = Math.min(smallest, spread[k]);
  let order = 1;
  while (spread[order] > PREFER_LOW * smallest) order++;
  const sigmaDifferences = spread[order];
  const floor = quantStep / Math.sqrt(12);
  const sigma = Math.max(sigmaDifferences, floor);
  const method = floor > sigmaDifferences
    ? `quantization floor step/sqrt(12), step ${quantStep.toPrecision(4)} (differences of order ${order} gave ${sigmaDifferences.toPrecision(3)})`
    : `robust spread of differences of order ${order}` + (quantStep > 0 ? `, above the quantization floor ${floor.toPrecision(3)}` : '');
  return { sigma, quantStep, method, sigmaDifferences, differenceOrder: order, density: sigma * sigma * 2 * dt };
}
