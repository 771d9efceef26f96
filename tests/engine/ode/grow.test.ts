import { describe, it, expect } from 'vitest';
import { GrowableF64 } from '../../../src-main/engine/ode/grow.ts';

describe('GrowableF64', () => {
  it('keeps every pushed value, in order, across many reallocations', () => {
    const g = new GrowableF64(1);
    const row = Float64Array.of(0, 0, 0);
    const big = new Float64Array(40).map((_, i) => -i);
    let expected: number[] = [];
    for (let k = 0; k < 1000; k++) {
      g.push(k);
      row[0] = k; row[1] = k + 0.5; row[2] = -k;
      g.pushAll(row);
      g.pushAll(row, 2);
      expected.push(k, k, k + 0.5, -k, k, k + 0.5);
      if (k % 100 === 0) { g.pushAll(big); expected = expected.concat(Array.from(big)); }
    }
    expect(g.length).toBe(expected.length);
    expect(Array.from(g.toArray())).toEqual(expected);
    expect(g.view().length).toBe(expected.length);
  });
});
