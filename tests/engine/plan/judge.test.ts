import { describe, expect, it } from 'vitest';
import { buildHopPlan, judgePlan } from '../../../src-main/engine/plan/index.ts';
import { doubleWellModel } from './fixtures.ts';

// Double well H = (q^2 - 1)^2 / 4 + v^2 / 2: barrier 1/4 at q = 0, wells at +-1 (references.md).
const H = (q: number, v: number) => (q * q - 1) ** 2 / 4 + v * v / 2;
const plan = buildHopPlan(doubleWellModel().landscape!, H, { from: 1, to: 2 });

/** Feeds (t, q, v, stage) samples; returns the verdict. */
function feed(samples: [number, number, number, number][], settleTime = 1) {
  const j = judgePlan(plan, H, settleTime);
  let last = samples[0];
  for (const s of samples) { last = s; if (!j.observe(...s)) break; }
  return j.finish(last[0], last[1], last[2], false);
}

describe('judgePlan (hop)', () => {
  it('settles: switch inside the right well, captured below the barrier, then held in the band', () => {
    const o = feed([[0, -1, 0.5, 1], [1, 0.2, 0.8, 2], [2, 0.9, 0.1, 2], [3, 1, 0.01, 2], [4.5, 1, 0.01, 2]]);
    expect(o.status).toBe('settled');
    expect(o.ok).toBe(true);
    expect(o.switches).toEqual([{ leg: 1, t: 1, q: 0.2, v: 0.8, inside: true }]);
    expect(o.captureTimes).toEqual([2]);
  });

  it('reports a state that goes back over the barrier before it is captured', () => {
    const o = feed([[0, -1, 0.5, 1], [1, 0.2, 0.8, 2], [2, -0.01, -0.8, 2]]);
    expect(o.status).toBe('returned');
    expect(o.ok).toBe(false);
  });

  it('flags a switch outside the target well, and names the phase a run ended in', () => {
    const o = feed([[0, -1, 0.5, 1], [1, -0.05, 0.8, 2]]);
    expect(o.switches[0].inside).toBe(false);
    expect(o.ok).toBe(false);
    expect(feed([[0, -1, 0.5, 1], [9, -1, 0.2, 1]]).status).toBe('no-switch');
    expect(feed([[0, -1, 0.5, 1], [1, 0.2, 0.8, 2], [2, 1.5, 0.5, 2]]).status).toBe('not-captured');
    expect(feed([[0, -1, 0.5, 1], [1, 0.2, 0.8, 2], [2, 1, 0.5, 2], [3, 1, 0.5, 2]]).status).toBe('captured');
  });
});
