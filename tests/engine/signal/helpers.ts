// Shared helpers for the signal tests: one "close enough" check and sampled test signals.
import { expect } from 'vitest';
import { Pcg32 } from '../../../src-main/engine/signal/random.ts';

/** |actual - expected| <= tol * max(scale, |expected|). */
export function expectClose(actual: number, expected: number, tol: number, what = '', scale = 1): void {
  const err = Math.abs(actual - expected) / Math.max(scale, Math.abs(expected));
  if (!(err <= tol)) expect.fail(`${what} ${actual} vs ${expected}: error ${err.toExponential(2)} > ${tol}`);
}

/** Samples f at t = i dt, i = 0..n-1. */
export function sample(n: number, dt: number, f: (t: number) => number): Float64Array {
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) out[i] = f(i * dt);
  return out;
}

/** x plus independent normal noise of standard deviation sigma (seeded PCG32), as a new array. */
export function addNoise(x: Float64Array, sigma: number, seed: number): Float64Array {
  const rng = new Pcg32(seed);
  return x.map((v) => v + sigma * rng.normal());
}

/** RMS of a - b over indices [from, to). */
export function rmsDiff(a: Float64Array, b: Float64Array, from = 0, to = a.length): number {
  let s = 0;
  for (let i = from; i < to; i++) s += (a[i] - b[i]) ** 2;
  return Math.sqrt(s / (to - from));
}
