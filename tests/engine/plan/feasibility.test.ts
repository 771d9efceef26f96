import { describe, expect, it } from 'vitest';
import { buildHopPlan, checkCandidate, searchUMax, type FeasibilityProblem, type Landscape } from '../../../src-main/engine/plan/index.ts';

// A synthetic problem with a closed-form answer. Three wells at q = -1, 1, 3 with barriers at 0
// and 2 (energy 0.05); H = v^2 / 2. The plant is q'' = u. The controller pushes with u = 1 until
// the plan's switch (q past 0.1 moving up), then brakes with u = -u_max sign(v). From rest at
// q = -1 the switch comes at q_s with speed v_s (constant acceleration: q_s = -1 + v_s^2 / 2);
// braking gives v^2 = v_s^2 - 2 u_max (q - q_s). With no potential nothing holds the state once
// H is below the barrier, so the run stays in well 2 (and settles at rest) exactly when it stops
// before the far barrier at 2: u_max > v_s^2 / (2 (2 - q_s)) (kinematics).
const land: Landscape = {
  qMin: -2, qMax: 4, periodic: false,
  wells: [{ index: 1, q: -1, V: 0 }, { index: 2, q: 1, V: 0 }, { index: 3, q: 3, V: 0 }],
  barriers: [{ q: 0, V: 0.05, between: [1, 2] }, { q: 2, V: 0.05, between: [2, 3] }],
};
const H = (_q: number, v: number) => (v * v) / 2;
const rate = 1000;

function problem(): FeasibilityProblem {
  return {
    build(uMax) {
      const plan = buildHopPlan(land, H, { from: 1, to: 2 });
      const qs = plan.transitions[0].when.qAbove!;
      let stage = 1;
      return {
        accel: (_q, _v, u) => u, H, plan,
        controller: {
          reset() { stage = 1; },
          step(q, v) { if (stage === 1 && q > qs && v > 0) stage = 2; return stage === 1 ? 1 : -uMax * Math.sign(v); },
          stage: () => stage,
        },
      };
    },
    grid: [{ q: -1, v: 0, energy: 0 }], rateHz: rate, maxDuration: 20, settleTime: 0.5,
  };
}

describe('feasibility check and u_max search', () => {
  // The switch sample: the first t = kT with -1 + t^2/2 > 0.1 (RK4 is exact for constant acceleration).
  const ts = Math.ceil(Math.sqrt(2.2) * rate) / rate;
  const vs = ts, qs = -1 + (ts * ts) / 2;
  const uStar = (vs * vs) / (2 * (2 - qs));

  it('judges a candidate on either side of the closed-form threshold', () => {
    const lo = checkCandidate(problem(), uStar * 0.97, 0.1);
    expect(lo.feasible).toBe(false);
    expect(['overshot', 'escaped']).toContain(lo.runs[0].outcome.status);
    expect(checkCandidate(problem(), uStar * 0.9, 0.1).runs[0].outcome.status).toBe('overshot'); // not even captured
    const hi = checkCandidate(problem(), uStar * 1.03, 0.1);
    expect(hi.feasible).toBe(true);
    expect(hi.runs[0].outcome.switches[0].q).toBeCloseTo(qs, 12);
    expect(hi.runs[0].outcome.status).toBe('settled');
  });

  it('brackets and bisects to the threshold, answering with a verified-feasible u_max', () => {
    const r = searchUMax(problem(), 0.1, 0.1, { relTol: 0.01 });
    expect(r.status).toBe('found');
    expect(r.method).toBe('doubling, then bisection');
    expect(r.found!).toBeGreaterThanOrEqual(uStar * (1 - 1e-3)); // within the sampling error of the closed form
    expect(r.bound).toBeLessThanOrEqual(uStar * (1 + 1e-3));
    expect(r.found! / r.bound - 1).toBeLessThanOrEqual(0.01);
    expect(checkCandidate(problem(), r.found!, 0.1).feasible).toBe(true);
    expect(r.simulations).toBe(r.candidates); // one start state per candidate
  });

  it('says so when nothing up to the limit works', () => {
    const r = searchUMax(problem(), 0.001, 0.1, { factor: 8 });
    expect(r.found).toBeNull();
    expect(r.status).toBe('not-found');
    expect(r.bound).toBeCloseTo(0.008, 12);
  });
});
