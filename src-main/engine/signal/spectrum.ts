// Averaged periodogram (Welch, IEEE Trans. Audio Electroacoust. 15 (1967) 70): linearly
// detrended, Hann-windowed segments overlapping by half, power averaged over segments.
// Normalised so that, over all L bins of a segment, the powers add up to the signal's variance
// (Parseval), and white noise of variance s^2 has expected power s^2 / L in every bin.
import { fftInPlace } from './fft.ts';

export interface WelchSpectrum {
  /** Segment length L (power of two). */
  segment: number;
  /** Number of segments averaged. */
  segments: number;
  /** Bin spacing in Hz, 1 / (L dt). */
  df: number;
  /** power[k], k = 0..L/2: average power in bin k (one of the two mirror bins; double it for k in 1..L/2-1). */
  power: Float64Array;
}

/** Largest power of two <= n. */
function floorPow2(n: number): number {
  let p = 1;
  while (p * 2 <= n) p *= 2;
  return p;
}

/**
 * Welch spectrum of x (sampled every dt) with segments of at most maxSegment samples and at most
 * half the record, so that at least three overlapping segments are averaged.
 */
export function welchSpectrum(x: Float64Array, dt: number, maxSegment = 8192): WelchSpectrum {
  const n = x.length;
  if (n < 32) throw new RangeError(`welchSpectrum: x needs at least 32 samples, got ${n}`);
  const L = Math.max(16, Math.min(floorPow2(maxSegment), floorPow2(Math.floor(n / 2))));
  const K = Math.ceil((n - L) / (L / 2)) + 1;
  const win = new Float64Array(L);
  let sumW2 = 0;
  for (let i = 0; i < L; i++) {
    win[i] = 0.5 - 0.5 * Math.cos((2 * Math.PI * i) / L); // periodic Hann
    sumW2 += win[i] * win[i];
  }
  const re = new Float64Array(L), im = new Float64Array(L);
  const power = new Float64Array(L / 2 + 1);
  // Least-squares line over a segment: centred abscissa c = i - (L-1)/2, sum c^2 = L(L^2-1)/12.
  const sumC2 = (L * (L * L - 1)) / 12;
  for (let s = 0; s < K; s++) {
    const start = K === 1 ? 0 : Math.round((s * (n - L)) / (K - 1));
    let mean = 0, slope = 0;
    for (let i = 0; i < L; i++) mean += x[start + i];
    mean /= L;
    for (let i = 0; i < L; i++) slope += (i - (L - 1) / 2) * x[start + i];
    slope /= sumC2;
    for (let i = 0; i < L; i++) {
      re[i] = (x[start + i] - mean - slope * (i - (L - 1) / 2)) * win[i];
      im[i] = 0;
    }
    fftInPlace(re, im);
    for (let k = 0; k <= L / 2; k++) power[k] += (re[k] * re[k] + im[k] * im[k]) / (L * sumW2);
  }
  for (let k = 0; k <= L / 2; k++) power[k] /= K;
  return { segment: L, segments: K, df: 1 / (L * dt), power };
}
