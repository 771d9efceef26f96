import { describe, expect, it } from 'vitest';
import { GrowableF64 } from '../../../src-main/engine/data/growable-f64.ts';

describe('GrowableF64', () => {
  it('keeps every value across block boundaries and empties itself on toArray', () => {
    const g = new GrowableF64();
    const n = 3 * 65536 + 17;
    for (let i = 0; i < n; i++) g.push(i * 0.5);
    expect(g.length).toBe(n);
    expect(g.last()).toBe((n - 1) * 0.5);
    const a = g.toArray();
    expect(a.length).toBe(n);
    let ok = true;
    for (let i = 0; i < n; i++) if (a[i] !== i * 0.5) ok = false;
    expect(ok).toBe(true);
    expect(g.length).toBe(0);
    expect(Number.isNaN(g.last())).toBe(true);
  });
});
