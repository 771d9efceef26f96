// Quantization step of a sampled channel, from the gaps between distinct sorted values: their
// common divisor (Euclid's algorithm on the gaps, with a rounding tolerance) is the candidate step,
// accepted only when every sample lies on the grid min + k * step (common practice for judging ADC
// resolution from recorded data). To stay fast on long runs the candidate first comes from a
// strided subsample; the full sort runs only when that candidate fails and could still mean a
// coarse grid.

export interface Quantization {
  /** Grid step (units of the channel). */
  step: number;
  /** Number of grid levels spanned from min to max. */
  levels: number;
  /** log2(levels): the resolution in bits that the channel actually uses. */
  bits: number;
}

const SUBSAMPLE = 1 << 16;
/** Finer than this many levels is not "heavy" quantization; no full sort is spent to find the grid. */
const FINE_LEVELS = 1 << 16;
/** Beyond this many levels (about 24 bits) a "grid" is indistinguishable from rounding noise. */
const MAX_LEVELS = 1 << 24;

/** Greatest common divisor of a and b up to tol (Euclid with floating remainders, which are exact). */
function gcdTol(a: number, b: number, tol: number): number {
  while (b > tol) {
    let r = a % b;
    if (b - r <= tol) r = 0;
    a = b;
    b = r;
  }
  return a;
}

/** Common step of the gaps between distinct sorted values, up to tol (Infinity when all are equal). */
function gapStep(sorted: Float64Array, tol: number): number {
  let g = Infinity;
  for (let i = 1; i < sorted.length; i++) {
    const d = sorted[i] - sorted[i - 1];
    if (d > tol && d < g) g = d;
  }
  if (g === Infinity) return g;
  for (let i = 1; i < sorted.length; i++) {
    const d = sorted[i] - sorted[i - 1];
    if (d <= tol) continue;
    const k = Math.round(d / g);
    if (Math.abs(d - k * g) > tol) g = gcdTol(Math.max(g, d), Math.min(g, d), tol);
  }
  return g;
}

function onGrid(x: Float64Array, x0: number, step: number): boolean {
  const inv = 1 / step;
  for (let i = 0; i < x.length; i++) {
    const r = (x[i] - x0) * inv;
    if (Math.abs(r - Math.round(r)) > 1e-3) return false;
  }
  return true;
}

/** The grid the samples lie on, or undefined when they lie on no common grid (or are constant). */
/** (Pass the min and max of x when known, to save a pass.) */
export function estimateQuantization(x: Float64Array, known?: { min: number; max: number }): Quantization | undefined {
  const n = x.length;
  let lo = Infinity;
  let hi = -Infinity;
  if (known !== undefined) {
    lo = known.min;
    hi = known.max;
  } else {
    for (let i = 0; i < n; i++) {
      const v = x[i];
      if (v < lo) lo = v;
      if (v > hi) hi = v;
    }
  }
  const range = hi - lo;
  if (!(range > 0)) return undefined;
  const stride = Math.max(1, Math.ceil(n / SUBSAMPLE));
  const sub = new Float64Array(Math.ceil(n / stride));
  for (let i = 0, k = 0; i < n; i += stride, k++) sub[k] = x[i];
  // Rounding of the recorded values (binary doubles of decimal text, or of scaled ADC counts).
  const tol = 1e-9 * Math.max(Math.abs(lo), Math.abs(hi));
  const usable = (s: number): boolean => s > tol && range / s < MAX_LEVELS;
  let step = gapStep(sub.sort(), tol);
  if (!usable(step) || !onGrid(x, lo, step)) {
    if (stride === 1 || !(range / step < FINE_LEVELS)) return undefined;
    step = gapStep(Float64Array.from(x).sort(), tol);
    if (!usable(step) || !onGrid(x, lo, step)) return undefined;
  }
  const intervals = Math.round(range / step);
  const refined = range / intervals; // averages the rounding of the individual gaps
  const levels = intervals + 1;
  return { step: refined, levels, bits: Math.log2(levels) };
}
