import { describe, expect, it } from 'vitest';
import { findClipping } from '../../../src-main/engine/data/clipping.ts';

describe('findClipping', () => {
  it('finds the stretches of a sine clipped at +-0.8', () => {
    // 4 cycles of 100 samples: sin(2 pi k / 100) > 0.8 for k/100 in (asin(0.8), pi - asin(0.8)) / 2 pi
    // = (0.14758, 0.35242), i.e. k = 15..35: 21 samples per cycle (elementary trigonometry).
    const x = Float64Array.from({ length: 400 }, (_, k) => Math.max(-0.8, Math.min(0.8, Math.sin((2 * Math.PI * k) / 100))));
    const c = findClipping(x, 10);
    expect([c.max.value, c.max.stretches, c.max.samples, c.max.longestLength, c.max.longestStart]).toEqual([0.8, 4, 84, 21, 15]);
    expect([c.min.value, c.min.stretches, c.min.samples, c.min.longestLength, c.min.longestStart]).toEqual([-0.8, 4, 84, 21, 65]);
  });

  it('ignores stretches shorter than the threshold and an unclipped sine', () => {
    const x = Float64Array.from({ length: 400 }, (_, k) => Math.sin((2 * Math.PI * k) / 100 + 0.1));
    const c = findClipping(x, 3);
    expect(c.max.stretches + c.min.stretches).toBe(0);
    expect(() => findClipping(x, 0)).toThrow(/minRun/);
  });
});
