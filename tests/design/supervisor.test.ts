import { describe, expect, it } from 'vitest';
import { controllerFromDesign, conditionHolds, wrapAngle } from '../../src-main/design/supervisor.ts';
import { makeLevelHold } from '../../src-main/engine/control/index.ts';
import { simulate } from '../../src-main/engine/trial/simulate.ts';
import { G, I, L, MGL, pendulumDesign } from './fixtures.ts';

// Independent pendulum energy written by hand (elementary mechanics), not through the formula parser.
const energyByHand = {
  coordinate: 'angle' as const,
  lambda: -0.05,
  H: (q: number, v: number) => (I / 2) * v * v + MGL * (1 - Math.cos(q)),
  grad: (q: number, v: number, out: Float64Array) => { out[0] = MGL * Math.sin(q); out[1] = I * v; },
};
const plant = { coordinate: 'angle' as const, accel: (q: number, v: number, u: number) => -(G / L) * Math.sin(q) - 0.05 * v + u / I };

describe('controllerFromDesign', () => {
  it('runs a one-stage design exactly as makeLevelHold does, sample for sample', () => {
    const d = pendulumDesign();
    const sup = controllerFromDesign(d);
    const ref = makeLevelHold({ energy: energyByHand, inputGain: 1 / I, target: 0.5, Q: 1, R: 1, eps: 0.01, lambda: -0.05, uMax: 0.5, rateMax: 50, meanB2: 40 });
    // Drive both with the same states along a swing (a closed-loop trace of the reference).
    const r = simulate({ plant, energy: energyByHand, controller: { reset: () => ref.reset(), step: (q, v, t, dt) => ref.step({ q, v, t }, dt).u }, q0: 0.3, v0: 0, duration: 3, estimator: { kind: 'ideal' } });
    ref.reset(); sup.reset();
    let worst = 0;
    for (let k = 0; k < r.trace.t.length; k++) {
      const a = ref.step({ q: r.trace.q[k], v: r.trace.v[k], t: r.trace.t[k] }, 1e-3).u;
      const b = sup.step(r.trace.q[k], r.trace.v[k], r.trace.t[k], 1e-3);
      // The compiled formula and the hand-written energy differ only by rounding: u agrees to ~1e-12 relative.
      worst = Math.max(worst, Math.abs(a - b));
    }
    expect(worst).toBeLessThan(1e-9);
    expect(sup.stage()).toBe(1);
    expect(sup.switches()).toEqual([]);
  });

  it('reproduces makeLevelHold bit for bit when given the same energy function', () => {
    const d = pendulumDesign({ law: { ...pendulumDesign().law, integral: { Qw: 2, antiWindup: 'conditional' } } });
    const sup = controllerFromDesign(d, { energy: energyByHand });
    const ref = makeLevelHold({ energy: energyByHand, inputGain: 1 / I, target: 0.5, Q: 1, R: 1, eps: 0.01, lambda: -0.05, uMax: 0.5, rateMax: 50, meanB2: 40, integral: { Qw: 2 } });
    const a = simulate({ plant, energy: energyByHand, controller: sup, q0: 0.2, v0: 0.5, duration: 2, estimator: { kind: 'ideal' } });
    const b = simulate({ plant, energy: energyByHand, controller: { reset: () => ref.reset(), step: (q, v, t, dt) => ref.step({ q, v, t }, dt).u }, q0: 0.2, v0: 0.5, duration: 2, estimator: { kind: 'ideal' } });
    expect(Array.from(a.trace.u)).toEqual(Array.from(b.trace.u));
    expect(Array.from(a.trace.q)).toEqual(Array.from(b.trace.q));
  });

  it('switches a two-stage design at the first sample where the condition holds, and logs it', () => {
    // Stage 1 pumps toward 0.8 J; switch to stage 2 (hold 0.3 J) once H > 0.6 J with v > 0.
    const base = pendulumDesign();
    const d = pendulumDesign({
      kind: 'well-hop',
      stages: [
        { index: 1, name: 'raise', target: { kind: 'energy', energy: 0.8 }, meanB2: null },
        { index: 2, name: 'settle', target: { kind: 'energy', energy: 0.3 }, meanB2: null },
      ],
      transitions: [{ from: 1, to: 2, when: { energyAbove: 0.6, vSign: 1 }, reason: 'test' }],
      law: { ...base.law, lossCompensation: false },
    });
    const sup = controllerFromDesign(d, { energy: energyByHand });
    const r = simulate({ plant, energy: energyByHand, controller: sup, q0: 0.2, v0: 0, duration: 6, estimator: { kind: 'ideal' } });
    const sw = sup.switches();
    expect(sw.length).toBe(1);
    expect(sw[0].from).toBe(1);
    expect(sw[0].to).toBe(2);
    // Independent check on the trace: the first row where H > 0.6 and v > 0 (the controller saw the same true state).
    let first = -1;
    for (let k = 0; k < r.trace.t.length; k++) if (r.trace.H[k] > 0.6 && r.trace.v[k] > 0) { first = k; break; }
    expect(first).toBeGreaterThan(0);
    expect(sw[0].t).toBe(r.trace.t[first]);
    expect(r.trace.stage![first - 1]).toBe(1);
    expect(r.trace.stage![first]).toBe(2);
    expect(r.trace.stage![r.trace.t.length - 1]).toBe(2);
    // reset clears the log and returns to the initial stage.
    sup.reset();
    expect(sup.stage()).toBe(1);
    expect(sup.switches()).toEqual([]);
  });

  it('keeps the rate limit across a switch (the new law starts from the last u)', () => {
    const base = pendulumDesign();
    const d = pendulumDesign({
      stages: [
        { index: 1, name: 'a', target: { kind: 'energy', energy: 2 }, meanB2: null },
        { index: 2, name: 'b', target: { kind: 'energy', energy: 0 }, meanB2: null },
      ],
      transitions: [{ from: 1, to: 2, when: { energyAbove: 0.05 }, reason: 'test' }],
      law: { ...base.law, lossCompensation: false, uMax: 1, rateMax: 10 },
    });
    const sup = controllerFromDesign(d, { energy: energyByHand });
    const r = simulate({ plant, energy: energyByHand, controller: sup, q0: 0.05, v0: 1, duration: 1, estimator: { kind: 'ideal' } });
    let worst = 0;
    for (let k = 1; k < r.trace.u.length; k++) worst = Math.max(worst, Math.abs(r.trace.u[k] - r.trace.u[k - 1]));
    expect(sup.switches().length).toBe(1);
    expect(worst).toBeLessThanOrEqual(10 * 1e-3 + 1e-12);
  });

  it('evaluates conditions with strict inequalities, on the wrapped angle only when asked', () => {
    expect(conditionHolds({ qAbove: 1 }, 1, 0, 0, true)).toBe(false);
    expect(conditionHolds({ qAbove: 1 }, 1 + 1e-12, 0, 0, true)).toBe(true);
    expect(conditionHolds({ qBelow: 0, wrapped: true }, 2 * Math.PI - 0.1, 0, 0, true)).toBe(true);
    expect(conditionHolds({ qBelow: 0 }, 2 * Math.PI - 0.1, 0, 0, true)).toBe(false);
    expect(conditionHolds({ vSign: -1 }, 0, 0, 0, false)).toBe(false);
    expect(conditionHolds({ energyBelow: 1, energyAbove: 0 }, 0, 0, 0.5, false)).toBe(true);
    expect(wrapAngle(Math.PI)).toBeCloseTo(-Math.PI, 15);
    expect(wrapAngle(-Math.PI)).toBe(-Math.PI);
  });

  it('refuses inconsistent stage numbers, naming the field', () => {
    expect(() => controllerFromDesign(pendulumDesign({ initialStage: 2 }))).toThrow(/design\.initialStage/);
    expect(() => controllerFromDesign(pendulumDesign({ transitions: [{ from: 1, to: 3, when: { qAbove: 0 }, reason: '' }] }))).toThrow(/design\.transitions\[0\]\.to/);
  });
});
