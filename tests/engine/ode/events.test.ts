import { describe, it, expect } from 'vitest';
import { solveDopri5, type OdeEvent } from '../../../src-main/engine/ode/index.ts';
import { crosses } from '../../../src-main/engine/ode/events.ts';

// Harmonic oscillator x'' = -w^2 x, x(0) = 1, v(0) = 0: x = cos(w t), v = -w sin(w t) (elementary).
// Turning points v = 0 at t = k pi / w; there x = (-1)^k, so v' = -w^2 x changes sign with k:
// v crosses upwards (direction +1) at odd k and downwards (direction -1) at even k >= 2.
const w = 2.3;
const osc = (_t: number, y: Float64Array, d: Float64Array): void => { d[0] = y[1]; d[1] = -w * w * y[0]; };
const turning: OdeEvent['g'] = (_t, y) => y[1];
const opts = { rtol: 1e-10, atol: 1e-12 };

describe('event location (DOPRI5)', () => {
  it('finds every turning point of the harmonic oscillator within 1e-9 s of k pi / w', () => {
    const tEnd = 20;
    const r = solveDopri5(osc, [0, tEnd], [1, 0], { ...opts, events: [{ g: turning }] });
    expect(r.status).toBe('done');
    const expected = Math.floor((tEnd * w) / Math.PI);
    expect(r.events.length).toBe(expected);
    r.events.forEach((e, j) => {
      expect(e.index).toBe(0);
      expect(Math.abs(e.t - ((j + 1) * Math.PI) / w)).toBeLessThan(1e-9);
      expect(Math.abs(e.y[0] - (j % 2 === 0 ? -1 : 1))).toBeLessThan(1e-9); // x = (-1)^k there
      expect(Math.abs(e.y[1])).toBeLessThan(1e-9);
    });
  });

  it('keeps only crossings in the requested direction', () => {
    const r = solveDopri5(osc, [0, 20], [1, 0], { ...opts, events: [{ g: turning, direction: 1 }, { g: turning, direction: -1 }] });
    const up = r.events.filter((e) => e.index === 0), down = r.events.filter((e) => e.index === 1);
    // Upward at odd k, downward at even k >= 2 (see the header comment).
    up.forEach((e, j) => expect(Math.abs(e.t - ((2 * j + 1) * Math.PI) / w)).toBeLessThan(1e-9));
    down.forEach((e, j) => expect(Math.abs(e.t - ((2 * j + 2) * Math.PI) / w)).toBeLessThan(1e-9));
    expect(up.length + down.length).toBe(Math.floor((20 * w) / Math.PI));
    // Reported in time order overall.
    for (let j = 1; j < r.events.length; j++) expect(r.events[j].t).toBeGreaterThan(r.events[j - 1].t);
  });

  it('stops at a terminal event with the state there, and tEval stops with it', () => {
    const tEval = Array.from({ length: 101 }, (_, j) => j * 0.1);
    const r = solveDopri5(osc, [0, 10], [1, 0], { ...opts, tEval, events: [{ g: turning, direction: 1, terminal: true }] });
    const tStop = Math.PI / w; // first upward turning point
    expect(r.status).toBe('event');
    expect(Math.abs(r.tFinal - tStop)).toBeLessThan(1e-9);
    expect(Math.abs(r.yFinal[0] + 1)).toBeLessThan(1e-9);
    expect(r.events).toHaveLength(1);
    const last = r.t[r.t.length - 1];
    expect(last).toBeLessThanOrEqual(tStop);
    expect(last).toBeGreaterThan(tStop - 0.1);
    for (let k = 0; k < r.t.length; k++) expect(Math.abs(r.y[2 * k] - Math.cos(w * r.t[k]))).toBeLessThan(1e-8);
  });

  it('counts occurrences for terminal: k and records non-terminal events on the way', () => {
    const r = solveDopri5(osc, [0, 100], [1, 0], {
      ...opts,
      events: [{ g: (_t, y) => y[0] }, { g: turning, terminal: 3 }],
    });
    expect(r.status).toBe('event');
    expect(Math.abs(r.tFinal - (3 * Math.PI) / w)).toBeLessThan(1e-9);
    // Zeros of x = cos(w t) at (j + 1/2) pi / w: three of them precede the third turning point.
    const zeros = r.events.filter((e) => e.index === 0);
    expect(zeros).toHaveLength(3);
    zeros.forEach((e, j) => expect(Math.abs(e.t - ((j + 0.5) * Math.PI) / w)).toBeLessThan(1e-9));
  });

  it('locates events when integrating backwards in time', () => {
    // Start at t = 10 on the exact solution and run back to 0.1 (so no root sits on the end point):
    // the same turning points, in reverse order.
    const r = solveDopri5(osc, [10, 0.1], [Math.cos(10 * w), -w * Math.sin(10 * w)], { ...opts, events: [{ g: turning }] });
    expect(r.status).toBe('done');
    const ks = Array.from({ length: Math.floor((10 * w) / Math.PI) }, (_, j) => Math.floor((10 * w) / Math.PI) - j);
    expect(r.events.map((e) => Math.round((e.t * w) / Math.PI))).toEqual(ks);
    for (const e of r.events) expect(Math.abs(e.t - (Math.round((e.t * w) / Math.PI) * Math.PI) / w)).toBeLessThan(1e-9);
    expect(Math.abs(r.yFinal[0] - Math.cos(0.1 * w))).toBeLessThan(1e-8);
  });

  it('places a root to ~1e-12 s on a linear event function of time', () => {
    // g = t - t*: the root is t* exactly (any interpolant is exact in t), so this isolates the root finder.
    const tStar = Math.PI / 3;
    const r = solveDopri5(osc, [0, 5], [1, 0], { ...opts, events: [{ g: (t) => t - tStar, terminal: true }] });
    expect(Math.abs(r.tFinal - tStar)).toBeLessThan(1e-12);
  });
});

describe('crosses', () => {
  it('treats a zero at the step start as already counted and a zero at the step end as a crossing', () => {
    expect(crosses(-1, 1, 0)).toBe(true);
    expect(crosses(-1, 0, 1)).toBe(true);
    expect(crosses(0, 1, 1)).toBe(false);
    expect(crosses(1, -1, 1)).toBe(false);
    expect(crosses(1, -1, -1)).toBe(true);
    expect(crosses(1, 2, 0)).toBe(false);
  });
});
