// The Trials screen's views: min/max decimation of a trial trace (every column's extremes kept,
// time order kept, the point budget respected) and H on the phase-plane grid. Check values: the
// extremes of a synthetic trace with spikes placed by the test; the pendulum energy
// H = I v^2/2 + m g l (1 - cos q), I = m l^2 (elementary mechanics), which the analytic fixture model
// holds up to the designer's scale (I, see the test), evaluated by hand at every grid node.
import { describe, expect, it } from 'vitest';
import { decimateTrace, trialGrid } from '../../src-main/api/trial-views.ts';
import { designLevelHold } from '../../src-main/design/level-hold.ts';
import { pendulumModel } from '../engine/plan/fixtures.ts';

function synthetic(n: number) {
  const t = new Float64Array(n), q = new Float64Array(n), v = new Float64Array(n), u = new Float64Array(n), H = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    t[i] = i * 1e-3;
    q[i] = Math.sin(0.01 * i);
    v[i] = Math.cos(0.01 * i);
    u[i] = 0.1 * Math.sin(0.37 * i);
    H[i] = 1 + 0.01 * Math.cos(0.05 * i);
  }
  // Single-sample spikes, one per column, away from any bucket edge.
  u[123_457] = 5;
  u[700_001] = -4;
  H[333_333] = 9;
  v[999_990] = -7;
  return { t, q, v, u, H };
}

describe('decimateTrace', () => {
  it('keeps each column\'s extremes and time order within the point budget', () => {
    const tr = synthetic(1_000_000);
    const d = decimateTrace(tr, 2000);
    expect(d.decimated).toBe(true);
    expect(d.samples).toBe(1_000_000);
    expect(d.t.length).toBeLessThanOrEqual(2000);
    expect(Math.max(...d.u)).toBe(5);
    expect(Math.min(...d.u)).toBe(-4);
    expect(Math.max(...d.H)).toBe(9);
    expect(Math.min(...d.v)).toBe(-7);
    for (let i = 1; i < d.t.length; i++) expect(d.t[i]).toBeGreaterThan(d.t[i - 1]);
    expect(d.t[0]).toBe(0);
    expect(d.t[d.t.length - 1]).toBe(tr.t[tr.t.length - 1]);
  });

  it('returns short traces whole', () => {
    const tr = synthetic(1_000_000);
    const short = { t: tr.t.subarray(0, 50), q: tr.q.subarray(0, 50), v: tr.v.subarray(0, 50), u: tr.u.subarray(0, 50), H: tr.H.subarray(0, 50), stage: new Float64Array(50).fill(1) };
    const d = decimateTrace(short, 100);
    expect(d.decimated).toBe(false);
    expect(d.u).toEqual(Array.from(short.u));
    expect(d.stage).toEqual(new Array(50).fill(1));
  });
});

describe('trialGrid', () => {
  it('evaluates the design\'s H on a grid covering the trajectory', () => {
    const m = 0.5, l = 0.42, g = 9.81;
    const design = designLevelHold(pendulumModel(m, l, g), { target: { kind: 'amplitude', amplitude: 1 }, mass: m * l * l, uMax: 0.5, rateHz: 200, source: 'fixture' });
    const q = [-1, 0, 1], v = [0, 2, -2];
    const grid = trialGrid(design, { q, v }, 21, 11);
    expect(grid.q[0]).toBeLessThan(-1);
    expect(grid.q[20]).toBeGreaterThan(1);
    expect(grid.v[0]).toBeLessThan(-2);
    expect(grid.v[10]).toBeGreaterThan(2);
    for (let j = 0; j < 11; j++) for (let i = 0; i < 21; i++) {
      // The fixture is not calibrated, so the designer reads it as energy per unit inertia and
      // scales it by the inertia given (design.md §2, "Scale"): H_design = I * H_fixture.
      const I = m * l * l;
      const want = I * (0.5 * I * grid.v[j] ** 2 + m * g * l * (1 - Math.cos(grid.q[i])));
      expect(Math.abs(grid.H[j * 21 + i] - want)).toBeLessThan(1e-12 * (1 + want));
    }
  });
});
