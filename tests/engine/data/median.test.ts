import { describe, expect, it } from 'vitest';
import { median, selectInPlace } from '../../../src-main/engine/data/median.ts';

// Reference: the k-th element of a fully sorted copy (independent computation with Array.prototype.sort).
describe('median / selectInPlace', () => {
  it('selects the k-th smallest value, as a full sort does', () => {
    let s = 7;
    const rnd = (): number => (s = (s * 16807) % 2147483647) / 2147483647;
    for (const n of [1, 2, 3, 10, 101, 1000]) {
      const a = Float64Array.from({ length: n }, () => Math.round(rnd() * 20) / 4); // many ties
      const sorted = Array.from(a).sort((x, y) => x - y);
      for (const k of [0, n >> 1, n - 1]) expect(selectInPlace(a.slice(), k)).toBe(sorted[k]);
    }
  });

  it('returns the upper middle value for an even count and leaves the input alone', () => {
    const a = Float64Array.of(4, 1, 3, 2);
    expect(median(a)).toBe(3);
    expect(Array.from(a)).toEqual([4, 1, 3, 2]);
    expect(median(new Float64Array(1001).fill(0.001))).toBe(0.001);
  });
});
