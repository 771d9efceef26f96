import { describe, it, expect } from 'vitest';
import { Pcg32 } from '../../../src-main/engine/signal/random.ts';

/** Reference PCG32 on BigInt, written from the algorithm's definition (O'Neill 2014, §6.3). */
function referencePcg32(seed: bigint, stream: bigint, count: number): number[] {
  const mask = (1n << 64n) - 1n;
  const inc = ((stream << 1n) | 1n) & mask;
  let state = 0n;
  const step = (): void => { state = (state * 6364136223846793005n + inc) & mask; };
  step();
  state = (state + seed) & mask;
  step();
  const out: number[] = [];
  for (let i = 0; i < count; i++) {
    const old = state;
    step();
    const xs = Number((((old >> 18n) ^ old) >> 27n) & 0xffffffffn);
    const rot = Number(old >> 59n);
    out.push(((xs >>> rot) | (xs << ((32 - rot) & 31))) >>> 0);
  }
  return out;
}

describe('Pcg32', () => {
  it('reproduces the reference demo output for seed 42, stream 54', () => {
    // First six outputs printed by pcg32-demo of O'Neill's C library (from memory).
    const g = new Pcg32(42n, 54n);
    expect(Array.from({ length: 6 }, () => g.nextUint32())).toEqual([0xa15c02b7, 0x7b47f409, 0xba1d3330, 0x83d2f293, 0xbfa4784b, 0xcbed606e]);
  });

  it('matches a BigInt implementation over many outputs, seeds and streams', () => {
    for (const [seed, stream] of [[0n, 0n], [1n, 7n], [2n ** 63n + 12345n, 2n ** 62n - 1n], [987654321987n, 3n]] as const) {
      const g = new Pcg32(seed, stream);
      const mine = Array.from({ length: 2000 }, () => g.nextUint32());
      expect(mine).toEqual(referencePcg32(seed, stream, 2000));
    }
    // A number seed is the same as the bigint seed.
    const a = new Pcg32(123456789012, 5), b = new Pcg32(123456789012n, 5n);
    for (let i = 0; i < 10; i++) expect(a.nextUint32()).toBe(b.nextUint32());
  });

  it('gives uniform numbers in [0, 1) and standard normals with the right moments', () => {
    const g = new Pcg32(2024);
    const N = 100000;
    let su = 0, lo = 1, hi = 0;
    for (let i = 0; i < N; i++) { const u = g.uniform(); su += u; lo = Math.min(lo, u); hi = Math.max(hi, u); }
    expect(lo).toBeGreaterThanOrEqual(0);
    expect(hi).toBeLessThan(1);
    // Mean 1/2 with standard error sqrt(1/12/N) = 9.1e-4; allow 5 standard errors.
    expect(Math.abs(su / N - 0.5)).toBeLessThan(5 * Math.sqrt(1 / 12 / N));
    const z = g.normals(N);
    let s1 = 0, s2 = 0, inside = 0;
    for (const v of z) { s1 += v; s2 += v * v; if (Math.abs(v) < 1) inside++; }
    // Mean 0 (s.e. 1/sqrt(N)), variance 1 (s.e. sqrt(2/N)), P(|Z| < 1) = 0.682689 (A&S Table 26.1).
    expect(Math.abs(s1 / N)).toBeLessThan(5 / Math.sqrt(N));
    expect(Math.abs(s2 / N - 1)).toBeLessThan(5 * Math.sqrt(2 / N));
    expect(Math.abs(inside / N - 0.682689)).toBeLessThan(5 * Math.sqrt(0.682689 * 0.317311 / N));
  });

  it('is reproducible and rejects bad seeds', () => {
    expect(new Pcg32(9).normals(5)).toEqual(new Pcg32(9).normals(5));
    expect(new Pcg32(9, 1).nextUint32()).not.toBe(new Pcg32(9, 2).nextUint32());
    expect(() => new Pcg32(-1)).toThrow(/seed must be a non-negative safe integer/);
    expect(() => new Pcg32(1.5)).toThrow(/seed/);
    expect(() => new Pcg32(1, 2n ** 64n)).toThrow(/stream must lie in/);
    expect(() => new Pcg32(1).normals(3, -1)).toThrow(/sigma/);
  });
});
