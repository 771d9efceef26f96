// Logarithmic decrement of a free decay and the damping ratio it implies:
// delta = (1/n) ln(x_0 / x_n) for peaks n periods apart, zeta = delta / sqrt(4 pi^2 + delta^2)
// (e.g. Thomson & Dahleh, "Theory of Vibration with Applications", 5th ed., §2.6, from memory;
// references.md §2). Here delta is fitted over all peaks at once: least squares of ln(amplitude)
// against the half-cycle index, one common slope with separate intercepts for maxima and minima
// (so a swing that is lopsided about its equilibrium, as in one well of a Duffing beam, is fine).
// Peaks: the extremum of each half-cycle about the equilibrium, refined by the vertex of the
// parabola through the three samples around it. Equilibrium, unless given: for a viscously damped
// linear oscillator successive extrema e0, e1, e2 satisfy (e0 - c)/(e1 - c) = (e1 - c)/(e2 - c), so
// c = (e0 e2 - e1^2) / (e0 + e2 - 2 e1) (the Aitken delta-squared form); the median over all
// triples is used.
import { savgolFilter } from './savgol.ts';
import { estimateNoise } from './noise.ts';
import { chooseSavgol } from './choose-window.ts';

export interface Peak {
  /** Time of the interpolated extremum (s, from the first sample). */
  t: number;
  /** Interpolated (smoothed) value at the extremum. */
  x: number;
  kind: 'max' | 'min';
  /** |x - equilibrium|. */
  amplitude: number;
  /** Half-cycle count from the first peak found (maxima and minima alternate). */
  halfCycle: number;
}

export type LogDecrementStatus = 'ok' | 'too-few-peaks' | 'not-decaying';

export interface LogDecrementResult {
  status: LogDecrementStatus;
  message: string;
  /** Logarithmic decrement per full period (NaN unless status is 'ok' or 'not-decaying'). */
  delta: number;
  /** Damping ratio delta / sqrt(4 pi^2 + delta^2) (NaN unless status is 'ok'). */
  zeta: number;
  /** Damped period from the peak times (s); NaN with fewer than two peaks. */
  period: number;
  /** Equilibrium the amplitudes are measured from. */
  equilibrium: number;
  /** Peaks used in the fit, in time order. */
  peaks: Peak[];
  /** RMS residual of the ln-amplitude fit (0 for two peaks). */
  residual: number;
}

export interface LogDecrementOptions {
  /** Known equilibrium (e.g. 0 for a hanging pendulum); estimated from the peaks if absent. */
  equilibrium?: number;
  /** Smoothing before peak search: a window, or false for none; default chooseSavgol's choice. */
  smoothing?: { halfWindow: number; order: number } | false;
  /** Noise standard deviation of x; default estimateNoise(x, dt).sigma. */
  noiseSigma?: number;
  /** Peaks smaller than this about the equilibrium are ignored; default 10 noise sigmas. */
  minAmplitude?: number;
}

/** zeta = delta / sqrt(4 pi^2 + delta^2) (exact for viscous damping). */
export function dampingRatioFromDecrement(delta: number): number {
  return delta / Math.sqrt(4 * Math.PI * Math.PI + delta * delta);
}

/**
 * delta from successive same-kind peak amplitudes a_0, a_1, ... one period apart: minus the
 * least-squares slope of ln a_k against k (for two peaks exactly ln(a_0 / a_1)).
 */
export function decrementFromAmplitudes(amplitudes: ArrayLike<number>): number {
  const n = amplitudes.length;
  if (n < 2) throw new RangeError(`decrementFromAmplitudes: needs at least 2 amplitudes, got ${n}`);
  let sk = 0, sy = 0;
  for (let k = 0; k < n; k++) {
    const a = amplitudes[k];
    if (!(a > 0) || !Number.isFinite(a)) throw new RangeError(`decrementFromAmplitudes: amplitudes[${k}] must be positive and finite, got ${a}`);
    sk += k;
    sy += Math.log(a);
  }
  const kbar = sk / n, ybar = sy / n;
  let sxy = 0, sxx = 0;
  for (let k = 0; k < n; k++) {
    sxy += (k - kbar) * (Math.log(amplitudes[k]) - ybar);
    sxx += (k - kbar) * (k - kbar);
  }
  return -sxy / sxx;
}

function median(values: number[]): number {
  const s = values.slice().sort((a, b) => a - b);
  const h = s.length >> 1;
  return s.length % 2 ? s[h] : 0.5 * (s[h - 1] + s[h]);
}

interface RawExtremum { index: number; t: number; x: number; kind: 'max' | 'min'; halfCycle: number }

/**
 * Extrema of y about c: a half-cycle starts when y - c passes +h (or -h) coming from the other
 * side; its extremum is the largest |y - c| inside it. Extrema on the record's first or last
 * sample are dropped (the record may start or stop mid-swing).
 */
function halfCycleExtrema(y: Float64Array, dt: number, c: number, h: number): RawExtremum[] {
  const n = y.length;
  const out: RawExtremum[] = [];
  let side = 0, best = -1, count = -1;
  const close = (): void => {
    if (best > 0 && best < n - 1 && side !== 0) {
      // Vertex of the parabola through (best-1, best, best+1).
      const a = y[best - 1], b = y[best], d = y[best + 1];
      const den = a - 2 * b + d;
      const off = den !== 0 ? Math.max(-0.5, Math.min(0.5, (0.5 * (a - d)) / den)) : 0;
      out.push({ index: best, t: (best + off) * dt, x: b - 0.25 * (a - d) * off, kind: side > 0 ? 'max' : 'min', halfCycle: count });
    }
  };
  for (let i = 0; i < n; i++) {
    const v = y[i] - c;
    if ((v > h && side <= 0) || (v < -h && side >= 0)) {
      close();
      side = v > 0 ? 1 : -1;
      best = i;
      count++;
    } else if (side !== 0 && side * (y[i] - y[best]) > 0) {
      best = i;
    }
  }
  close();
  return out;
}

/** Logarithmic decrement and damping ratio of a free decay x sampled every dt seconds. */
export function logDecrement(x: Float64Array, dt: number, opts: LogDecrementOptions = {}): LogDecrementResult {
  if (!(x instanceof Float64Array)) throw new TypeError('logDecrement: x must be a Float64Array');
  if (!(dt > 0) || !Number.isFinite(dt)) throw new RangeError(`logDecrement: dt must be a positive finite number, got ${dt}`);
  if (x.length < 64) throw new RangeError(`logDecrement: x needs at least 64 samples, got ${x.length}`);
  const { equilibrium, smoothing, noiseSigma, minAmplitude } = opts;
  if (equilibrium !== undefined && !Number.isFinite(equilibrium)) throw new RangeError(`logDecrement: opts.equilibrium must be finite, got ${equilibrium}`);
  if (noiseSigma !== undefined && !(noiseSigma >= 0 && Number.isFinite(noiseSigma))) throw new RangeError(`logDecrement: opts.noiseSigma must be finite and >= 0, got ${noiseSigma}`);
  if (minAmplitude !== undefined && !(minAmplitude >= 0 && Number.isFinite(minAmplitude))) throw new RangeError(`logDecrement: opts.minAmplitude must be finite and >= 0, got ${minAmplitude}`);

  const noise = noiseSigma === undefined || smoothing === undefined ? estimateNoise(x, dt) : undefined;
  const sigma = noiseSigma ?? noise!.sigma;
  const win = smoothing === undefined ? chooseSavgol(x, dt, noise) : smoothing;
  const y = win === false ? x : savgolFilter(x, dt, { halfWindow: win.halfWindow, order: win.order, derivative: 0 });

  let lo = Infinity, hi = -Infinity, mean = 0;
  for (let i = 0; i < y.length; i++) {
    lo = Math.min(lo, y[i]);
    hi = Math.max(hi, y[i]);
    mean += y[i];
  }
  mean /= y.length;
  // Hysteresis: well above the noise, but never above a tenth of the swing.
  const h = Math.min(Math.max(4 * sigma, 1e-9 * (hi - lo)), 0.1 * (hi - lo));
  const floorAmp = minAmplitude ?? 10 * sigma;

  let c = equilibrium ?? mean;
  let ext = halfCycleExtrema(y, dt, c, h);
  if (equilibrium === undefined && ext.length >= 3) {
    const guesses: number[] = [];
    for (let k = 0; k + 2 < ext.length; k++) {
      const [e0, e1, e2] = [ext[k].x, ext[k + 1].x, ext[k + 2].x];
      const den = e0 + e2 - 2 * e1;
      if (den !== 0) guesses.push((e0 * e2 - e1 * e1) / den);
    }
    if (guesses.length > 0) {
      c = median(guesses);
      ext = halfCycleExtrema(y, dt, c, h);
    }
  }
  const peaks: Peak[] = [];
  for (const e of ext) {
    const amplitude = Math.abs(e.x - c);
    if (amplitude > floorAmp && amplitude > 0) peaks.push({ t: e.t, x: e.x, kind: e.kind, amplitude, halfCycle: e.halfCycle });
  }
  if (peaks.length > 0) {
    const first = peaks[0].halfCycle;
    for (const p of peaks) p.halfCycle -= first;
  }
  const base = { equilibrium: c, peaks };
  const maxima = peaks.filter((p) => p.kind === 'max').length;
  const minima = peaks.length - maxima;
  if (maxima < 2 && minima < 2) {
    return {
      ...base, status: 'too-few-peaks', delta: NaN, zeta: NaN, residual: NaN,
      period: peaks.length >= 2 ? 2 * (peaks[peaks.length - 1].t - peaks[0].t) / (peaks[peaks.length - 1].halfCycle - peaks[0].halfCycle) : NaN,
      message: `found ${peaks.length} peak(s) above ${floorAmp.toPrecision(3)} about the equilibrium ${c.toPrecision(4)}; `
        + 'the log decrement needs two peaks of the same side a period apart',
    };
  }
  // ln a = b_kind + s * halfCycle: one slope, two intercepts (normal equations after centring
  // each kind on its own means).
  const stats = { max: { n: 0, k: 0, y: 0 }, min: { n: 0, k: 0, y: 0 } };
  for (const p of peaks) {
    const s = stats[p.kind];
    s.n++; s.k += p.halfCycle; s.y += Math.log(p.amplitude);
  }
  let sxy = 0, sxx = 0;
  for (const p of peaks) {
    const s = stats[p.kind];
    const dk = p.halfCycle - s.k / s.n;
    sxy += dk * (Math.log(p.amplitude) - s.y / s.n);
    sxx += dk * dk;
  }
  const slope = sxy / sxx;
  let rss = 0;
  for (const p of peaks) {
    const s = stats[p.kind];
    const r = Math.log(p.amplitude) - s.y / s.n - slope * (p.halfCycle - s.k / s.n);
    rss += r * r;
  }
  const residual = Math.sqrt(rss / peaks.length);
  // Period: least-squares slope of peak time against half-cycle index, times two.
  let tk = 0, tt = 0;
  for (const p of peaks) { tk += p.halfCycle; tt += p.t; }
  tk /= peaks.length; tt /= peaks.length;
  let pxy = 0, pxx = 0;
  for (const p of peaks) { pxy += (p.halfCycle - tk) * (p.t - tt); pxx += (p.halfCycle - tk) ** 2; }
  const period = (2 * pxy) / pxx;
  const delta = -2 * slope;
  if (!(delta > 0)) {
    return {
      ...base, status: 'not-decaying', delta, zeta: NaN, period, residual,
      message: `the peaks do not decay (fitted log decrement ${delta.toPrecision(3)} over ${peaks.length} peaks): forced or self-excited motion?`,
    };
  }
  const zeta = dampingRatioFromDecrement(delta);
  return {
    ...base, status: 'ok', delta, zeta, period, residual,
    message: `log decrement ${delta.toPrecision(4)} (damping ratio ${zeta.toPrecision(4)}) from ${peaks.length} peaks, period ${period.toPrecision(4)} s`
      + (zeta > 0.5 ? '; above a damping ratio of 0.5 the method loses precision' : ''),
  };
}
