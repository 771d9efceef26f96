import { describe, it, expect } from 'vitest';
import { buildTrial, compileEnergySpec, runTrialSpec, type TrialSpec } from '../../../src-main/engine/trial/trial-spec.ts';

const spec: TrialSpec = {
  plant: { coordinate: 'angle', acceleration: '-(g/l)*sin(q) - c*v + u/(m*l^2)', params: { g: 9.81, l: 0.42, m: 0.5, c: 0.1 } },
  energy: { H: '0.5*m*l^2*v^2 + m*g*l*(1 - cos(q))', params: { g: 9.81, l: 0.42, m: 0.5 }, lambda: -0.1 },
  controller: { kind: 'level-hold', target: 1, inputGain: 1 / (0.5 * 0.42 ** 2), Q: 4, R: 1, eps: 0.2, uMax: 0.5 },
  q0: 0.1, v0: 0, duration: 2, rateHz: 500, sensor: { bits: 12, noiseStd: 1e-4 }, metrics: { target: 1 },
};

describe('trial specs (plain data)', () => {
  it('compile the plant formula to the hand-written acceleration and the energy with its gradient', () => {
    const p = buildTrial(spec).plant;
    const e = compileEnergySpec(spec.energy, 'angle');
    const J = 0.5 * 0.42 ** 2;
    for (const [q, v, u] of [[0.3, -1, 0.2], [2, 0.5, -0.1]]) {
      expect(p.accel(q, v, u, 0)).toBeCloseTo(-(9.81 / 0.42) * Math.sin(q) - 0.1 * v + u / J, 12);
      expect(e.H(q, v)).toBeCloseTo(0.5 * J * v * v + 0.5 * 9.81 * 0.42 * (1 - Math.cos(q)), 12);
      const g = new Float64Array(2);
      e.grad(q, v, g);
      expect(g[0]).toBeCloseTo(0.5 * 9.81 * 0.42 * Math.sin(q), 12); // dH/dq by hand
      expect(g[1]).toBeCloseTo(J * v, 12);
    }
    expect(e.lambda).toBe(-0.1);
    // Scaled parameters (mismatch) take effect: c scaled by 0 removes the damping, l by 2 halves g/l.
    expect(buildTrial(spec, { c: 0 }).plant.accel(0, 1, 0, 0)).toBe(0);
    expect(buildTrial(spec, { l: 2 }).plant.accel(1, 0, 0, 0)).toBeCloseTo(-(9.81 / 0.84) * Math.sin(1), 12);
    expect(buildTrial(spec, { l: 2 }).nominal.accel(1, 0, 0, 0)).toBeCloseTo(-(9.81 / 0.42) * Math.sin(1), 12);
    expect(() => buildTrial(spec, { k: 2 })).toThrow(/scale\.k/);
  });

  it('run reproducibly (same noise seed, same trace) and survive a JSON round trip', () => {
    const a = runTrialSpec(spec);
    const b = runTrialSpec(JSON.parse(JSON.stringify(spec)));
    expect(Array.from(a.result.trace.q)).toEqual(Array.from(b.result.trace.q));
    expect(a.outcome.metrics).toEqual(b.outcome.metrics);
    const c = runTrialSpec({ ...spec, noiseSeed: 5 });
    expect(Array.from(c.result.trace.u)).not.toEqual(Array.from(a.result.trace.u));
  });

  it('report, not hide, a u_max too small to hold the target against the damping', () => {
    // Level 1 J (a swing of about 93 degrees) needs on average |lambda| H* = 0.1 W against the losses
    // (design.md §2, dH/dt = lambda H); a limit of 0.002 N m delivers at most 0.002 <|v|> ~ 0.01 W.
    const weak = runTrialSpec({ ...spec, q0: 1.6, duration: 20, controller: { ...spec.controller, uMax: 0.002 } as TrialSpec['controller'] });
    expect(weak.outcome.converged).toBe(false);
    expect(weak.outcome.metrics!.saturatedShare).toBeGreaterThan(0.9);
    expect(weak.outcome.message).toMatch(/uMax = 0\.002 .*too small/);
    // With enough authority (and a gain high enough that the steady error c J <v^2> / (k <|v|>) is well
    // inside the band) the same trial converges and says nothing of the kind.
    const strong = runTrialSpec({ ...spec, q0: 1.6, duration: 20, controller: { ...spec.controller, Q: 100, uMax: 1 } as TrialSpec['controller'] });
    expect(strong.outcome.converged).toBe(true);
    expect(strong.outcome.message).toBe('completed');
  });

  it('refuse bad descriptions, naming the field', () => {
    expect(() => buildTrial({ ...spec, plant: { ...spec.plant, coordinate: 'polar' as never } })).toThrow(/trial\.plant\.coordinate/);
    expect(() => buildTrial({ ...spec, plant: { ...spec.plant, acceleration: '-(g/l)*sin(q' } })).toThrow(/trial\.plant\.acceleration/);
    expect(() => buildTrial({ ...spec, plant: { ...spec.plant, acceleration: '-k*q' } })).toThrow(/trial\.plant\.acceleration/);
    expect(() => buildTrial({ ...spec, plant: { ...spec.plant, params: { g: 'x' as never } } })).toThrow(/trial\.plant\.params\.g/);
    expect(() => buildTrial({ ...spec, energy: { H: 'v^2 +' } })).toThrow(/trial\.energy\.H/);
    expect(() => buildTrial({ ...spec, controller: { kind: 'bang' } as never })).toThrow(/trial\.controller\.kind/);
    expect(() => buildTrial({ ...spec, controller: { ...spec.controller, Q: 0 } as never })).toThrow(/design\.Q/);
    expect(() => runTrialSpec({ ...spec, metrics: { target: NaN } })).toThrow(/trial\.metrics\.target/);
    expect(() => runTrialSpec({ ...spec, estimator: { kind: 'magic' } as never })).toThrow(/trial\.estimator\.kind/);
  });
});
