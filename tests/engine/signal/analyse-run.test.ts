import { describe, it, expect } from 'vitest';
import { analyseRun } from '../../../src-main/engine/signal/analyse-run.ts';
import type { Run } from '../../../src-main/engine/types.ts';
import { addNoise, expectClose, rmsDiff, sample } from './helpers.ts';

// An underdamped free decay about 0.1 rad, analytic: x = c + A e^{-zeta w t} cos(wd t),
// wd = w sqrt(1 - zeta^2) (elementary), and its exact velocity.
const zeta = 0.01, w = 2 * Math.PI * 0.8, wd = w * Math.sqrt(1 - zeta * zeta), A = 0.6, c = 0.1;
const pos = (t: number): number => c + A * Math.exp(-zeta * w * t) * Math.cos(wd * t);
const vel = (t: number): number => -A * Math.exp(-zeta * w * t) * (zeta * w * Math.cos(wd * t) + wd * Math.sin(wd * t));

function makeRun(n: number, dt: number, sigma: number): Run {
  const t = sample(n, dt, (s) => 2 + s); // starts at t = 2 s
  return { name: 'swing-a.csv run 1', source: 'swing-a.csv', t, q: addNoise(sample(n, dt, pos), sigma, 21) };
}

describe('analyseRun', () => {
  it('summarises a noisy free decay: sampling, range, noise, velocity and damping', () => {
    const dt = 0.004, n = 5000, sigma = 1e-3;
    const run = makeRun(n, dt, sigma);
    const q0 = Float64Array.from(run.q);
    const a = analyseRun(run, 'angle');
    expect(run.q).toEqual(q0); // input untouched
    expect(a.samples).toBe(n);
    expectClose(a.sampleRate, 250, 1e-9, 'sample rate');
    expectClose(a.duration, (n - 1) * dt, 1e-9, 'duration');
    expect(a.unit).toBe('rad');
    expect(a.max).toBeGreaterThan(c + A - 5 * sigma);
    expectClose(a.noise.sigma, sigma, 0.1, 'noise', 0);
    // Velocity error: the rule's own estimate must describe the error actually made (30 %),
    // and the error must be far below the swing's speed A w = 3.0 rad/s.
    const vTrue = sample(n, dt, vel);
    const m = a.savgol.halfWindow;
    const err = rmsDiff(a.velocity, vTrue, m, n - m);
    expect(Math.abs(err / a.savgol.velocityRmsError - 1)).toBeLessThan(0.3);
    expect(err).toBeLessThan(0.01);
    expect(a.velocity.length).toBe(n);
    // Damping: the zeta put in, within 2 % (references.md §2 formula).
    expect(a.logDecrement.status).toBe('ok');
    expectClose(a.logDecrement.zeta, zeta, 0.02, 'zeta', 0);
    expectClose(a.logDecrement.equilibrium, c, 0.01, 'equilibrium', 0);
  });

  it('honours a fixed window and rejects runs it cannot analyse, naming the run', () => {
    const run = makeRun(1000, 0.01, 1e-3);
    const a = analyseRun(run, 'linear', { savgol: { halfWindow: 12, order: 3 } });
    expect([a.savgol.halfWindow, a.savgol.order, a.unit]).toEqual([12, 3, 'm']);
    const t = Float64Array.from(run.t); t[500] += 0.0004; // 4 % of the 0.01 s step
    expect(() => analyseRun({ ...run, t }, 'angle')).toThrow(/run "swing-a.csv run 1": sampling is not uniform at sample 500/);
    expect(() => analyseRun({ ...run, q: run.q.subarray(0, 999) }, 'angle')).toThrow(/t has 1000 samples but q has 999/);
    expect(() => analyseRun({ ...run, t: run.t.subarray(0, 10), q: run.q.subarray(0, 10) }, 'angle')).toThrow(/has 10 samples; at least 64/);
    expect(() => analyseRun(run, 'polar' as never)).toThrow(/coordinate must be 'angle' or 'linear'/);
  });
});
