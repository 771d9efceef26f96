import { describe, expect, it } from 'vitest';
import { compileDesignEnergy } from '../../src-main/design/energy.ts';

describe('compileDesignEnergy', () => {
  it('evaluates the pendulum energy and its gradient (elementary mechanics: dH/dq = m g l sin q, dH/dv = m l^2 v)', () => {
    const e = compileDesignEnergy('0.0882*v^2/2 + 2.06*(1 - cos(q))', 'angle', -0.05);
    const g = new Float64Array(2);
    for (const [q, v] of [[0.3, -1], [2.9, 4], [-1, 0]]) {
      expect(e.H(q, v)).toBeCloseTo(0.0441 * v * v + 2.06 * (1 - Math.cos(q)), 14);
      e.grad(q, v, g);
      expect(g[0]).toBeCloseTo(2.06 * Math.sin(q), 14);
      expect(g[1]).toBeCloseTo(0.0882 * v, 14);
    }
    expect(e.lambda).toBe(-0.05);
    expect(e.coordinate).toBe('angle');
  });

  it('names the field on a bad formula', () => {
    expect(() => compileDesignEnergy('v^2 + (q', 'linear', 0)).toThrow(/^design\.model\.energy: column/);
    expect(() => compileDesignEnergy('v^2 + u', 'linear', 0, 'x.model.energy')).toThrow(/^x\.model\.energy:/);
  });
});
