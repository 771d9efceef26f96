import { describe, it, expect } from 'vitest';
import { simulate } from '../../../src-main/engine/trial/simulate.ts';
import { openLoop } from '../../../src-main/engine/trial/energy-pump.ts';
import { wrapAngle } from '../../../src-main/engine/trial/sensor.ts';
import type { Controller, TrialPlant } from '../../../src-main/engine/trial/types.ts';
import type { EnergyFunction } from '../../../src-main/engine/types.ts';
import { builtinPlant } from '../../../src-main/engine/plant/index.ts';

const doubleIntegrator: TrialPlant = { coordinate: 'linear', accel: (_q, _v, u) => u };
const kinetic: EnergyFunction = { coordinate: 'linear', lambda: 0, H: (_q, v) => 0.5 * v * v, grad: (_q, v, o) => { o[0] = 0; o[1] = v; } };

/** Records what the controller was shown, returns a fixed u. */
function recorder(u: (k: number) => number): Controller & { q: number[]; v: number[]; t: number[] } {
  const r = {
    q: [] as number[], v: [] as number[], t: [] as number[],
    reset() { r.q.length = 0; r.v.length = 0; r.t.length = 0; },
    step(q: number, v: number, t: number) { r.q.push(q); r.v.push(v); r.t.push(t); return u(r.t.length - 1); },
  };
  return r;
}

describe('simulate', () => {
  it('integrates a free harmonic oscillator to RK4 accuracy (q = cos(w t), exact solution)', () => {
    const w = 5;
    const plant: TrialPlant = { coordinate: 'linear', accel: (q) => -w * w * q };
    const H: EnergyFunction = { coordinate: 'linear', lambda: 0, H: (q, v) => 0.5 * v * v + 0.5 * w * w * q * q, grad: (q, v, o) => { o[0] = w * w * q; o[1] = v; } };
    const r = simulate({ plant, energy: H, controller: openLoop(), q0: 1, v0: 0, duration: 10, rateHz: 100, estimator: { kind: 'ideal' } });
    expect(r.status).toBe('ok');
    let err = 0;
    for (let k = 0; k < r.trace.t.length; k++) err = Math.max(err, Math.abs(r.trace.q[k] - Math.cos(w * r.trace.t[k])));
    // RK4 global error ~ (w h)^4 w t / 120 with h = 5 ms: about 1e-7 (Hairer et al. §II.3, order 4).
    expect(err).toBeLessThan(1e-6);
    expect(r.final.t).toBeCloseTo(10, 12);
    expect(r.final.q).toBeCloseTo(Math.cos(50), 6);
    expect(r.diagnostics.rk4Steps).toBe(2000);
    expect(r.trace.t.length).toBe(1000);
  });

  it('free system (u = 0): the undamped built-in pendulum conserves the model H and its own true energy over 60 s', () => {
    // Energy conservation of the undamped pendulum (elementary mechanics). Bound: relative drift
    // below 1e-9 at 1 kHz with 2 RK4 steps per sample (RK4 local error O(h^5); our bound, not a published one).
    const plant = builtinPlant('pendulum', { c: 0 });
    const J = 0.5 * 0.42 ** 2, mgl = 0.5 * 9.81 * 0.42;
    const model: EnergyFunction = { coordinate: 'angle', lambda: 0, H: (q, v) => 0.5 * J * v * v + mgl * (1 - Math.cos(q)), grad: (q, v, o) => { o[0] = mgl * Math.sin(q); o[1] = J * v; } };
    const r = simulate({ plant, energy: model, controller: openLoop(), q0: 2.5, v0: 0, duration: 60, sensor: { bits: 12 } });
    const H0 = r.trace.H[0], E0 = plant.energy!(2.5, 0);
    let dH = 0;
    for (let k = 0; k < r.trace.H.length; k++) dH = Math.max(dH, Math.abs(r.trace.H[k] - H0));
    expect(dH / H0).toBeLessThan(1e-9);
    expect(Math.abs(plant.energy!(r.final.q, r.final.v) - E0) / Math.abs(E0)).toBeLessThan(1e-9);
    expect(r.diagnostics.peakU).toBe(0);
  });

  it('holds u over each period: a constant input on q\'\' = u gives q = u t^2 / 2 exactly', () => {
    // RK4 is exact for polynomial solutions of degree <= 4 (Hairer et al. §II.1).
    const r = simulate({ plant: doubleIntegrator, energy: kinetic, controller: { reset() {}, step: () => 2 }, q0: 0, v0: 0, duration: 1, rateHz: 50, estimator: { kind: 'ideal' } });
    for (let k = 0; k < r.trace.t.length; k++) {
      expect(r.trace.q[k]).toBeCloseTo(r.trace.t[k] ** 2, 12);
      expect(r.trace.v[k]).toBeCloseTo(2 * r.trace.t[k], 12);
      expect(r.trace.u[k]).toBe(2);
    }
    expect(r.final.q).toBeCloseTo(1, 12);
  });

  it('zero-order hold: u = sample index changes only at the samples (piecewise-constant acceleration)', () => {
    // With u_k = k on [kT, (k+1)T): v(t_n) = T * sum_{k<n} k = T n(n-1)/2 (exact sum).
    const T = 0.01;
    const r = simulate({ plant: doubleIntegrator, energy: kinetic, controller: recorder((k) => k), q0: 0, v0: 0, duration: 0.5, rateHz: 1 / T, estimator: { kind: 'ideal' } });
    for (let n = 0; n < r.trace.t.length; n++) expect(r.trace.v[n]).toBeCloseTo((T * n * (n - 1)) / 2, 10);
  });

  it('delays the input by whole controller samples (zero until the delay line fills)', () => {
    const T = 0.01, d = 3;
    const r = simulate({ plant: doubleIntegrator, energy: kinetic, controller: { reset() {}, step: () => 1 }, q0: 0, v0: 0, duration: 0.5, rateHz: 1 / T, delaySamples: d, estimator: { kind: 'ideal' } });
    for (let k = 0; k < r.trace.t.length; k++) {
      expect(r.trace.u[k]).toBe(k < d ? 0 : 1);
      const tau = Math.max(0, r.trace.t[k] - d * T);
      expect(r.trace.q[k]).toBeCloseTo(0.5 * tau * tau, 12); // exact: q = (t - dT)^2 / 2 after the delay
    }
    // And a command sequence arrives unchanged, shifted by d samples.
    const seq = simulate({ plant: doubleIntegrator, energy: kinetic, controller: recorder((k) => Math.sin(k)), q0: 0, v0: 0, duration: 0.2, rateHz: 1 / T, delaySamples: d, estimator: { kind: 'ideal' } });
    for (let k = d; k < seq.trace.t.length; k++) expect(seq.trace.u[k]).toBe(Math.sin(k - d));
  });

  it('shows the controller the quantized, wrapped-then-unwrapped position, within half a step of the truth', () => {
    // A pendulum rotating over the top (q grows through many multiples of 2 pi).
    const plant: TrialPlant = { coordinate: 'angle', accel: (q) => -9.81 * Math.sin(q) };
    const H: EnergyFunction = { coordinate: 'angle', lambda: 0, H: (q, v) => 0.5 * v * v + 9.81 * (1 - Math.cos(q)), grad: (q, v, o) => { o[0] = 9.81 * Math.sin(q); o[1] = v; } };
    const rec = recorder(() => 0);
    const r = simulate({ plant, energy: H, controller: rec, q0: 0, v0: 8, duration: 5, rateHz: 1000, sensor: { bits: 12 } });
    const step = (2 * Math.PI) / 4096;
    expect(r.diagnostics.sensorStep).toBe(step);
    expect(r.trace.q[r.trace.q.length - 1]).toBeGreaterThan(6 * Math.PI); // several turns
    for (let k = 0; k < rec.q.length; k++) {
      expect(Math.abs(rec.q[k] - r.trace.q[k])).toBeLessThanOrEqual(step / 2 + 1e-9);
      // The reading itself is a multiple of the step after wrapping.
      const y = wrapAngle(rec.q[k]);
      expect(Math.abs(y / step - Math.round(y / step))).toBeLessThan(1e-6);
    }
  });

  it('with the ideal option the controller sees the true state; otherwise an estimate', () => {
    const w = 5;
    const plant: TrialPlant = { coordinate: 'linear', accel: (q) => -w * w * q };
    const rec = recorder(() => 0);
    const r = simulate({ plant, energy: kinetic, controller: rec, q0: 1, v0: 0, duration: 1, estimator: { kind: 'ideal' } });
    for (let k = 0; k < rec.v.length; k++) { expect(rec.v[k]).toBe(r.trace.v[k]); expect(rec.q[k]).toBe(r.trace.q[k]); }
    const rec2 = recorder(() => 0);
    const r2 = simulate({ plant, energy: kinetic, controller: rec2, q0: 1, v0: 0, duration: 1 });
    expect(rec2.v[0]).toBe(0); // the estimator starts from rest, as a rig does
    // Filtered difference lags: after the transient the error is a few percent of the amplitude w.
    let err = 0;
    for (let k = 500; k < rec2.v.length; k++) err = Math.max(err, Math.abs(rec2.v[k] - r2.trace.v[k]));
    expect(err).toBeGreaterThan(0);
    expect(err).toBeLessThan(0.1 * w);
  });

  it('records a decimated trace and the stage column when the controller has stages', () => {
    let stage = 1;
    const c: Controller = { reset() { stage = 1; }, step(_q, _v, t) { stage = t < 0.5 ? 1 : 2; return 0; }, stage: () => stage };
    const r = simulate({ plant: doubleIntegrator, energy: kinetic, controller: c, q0: 0, v0: 1, duration: 1, rateHz: 100, decimation: 10, estimator: { kind: 'ideal' } });
    expect(r.trace.t.length).toBe(10);
    expect(r.trace.t[1]).toBeCloseTo(0.1, 12);
    expect(Array.from(r.trace.stage!)).toEqual([1, 1, 1, 1, 1, 2, 2, 2, 2, 2]);
    expect(r.trace.q[3]).toBeCloseTo(0.3, 12);
  });

  it('reports divergence as a status, with the trace up to it', () => {
    const plant: TrialPlant = { coordinate: 'linear', accel: (q) => 1e6 * q * q * q };
    const r = simulate({ plant, energy: kinetic, controller: openLoop(), q0: 1, v0: 0, duration: 10, estimator: { kind: 'ideal' } });
    expect(r.status).toBe('diverged');
    expect(r.message).toMatch(/non-finite/);
    expect(r.trace.t.length).toBeLessThan(10000);
  });

  it('refuses bad arguments, naming them', () => {
    const base = { plant: doubleIntegrator, energy: kinetic, controller: openLoop(), q0: 0, v0: 0, duration: 1 };
    expect(() => simulate({ ...base, duration: 0 })).toThrow(/duration/);
    expect(() => simulate({ ...base, q0: NaN })).toThrow(/q0/);
    expect(() => simulate({ ...base, rateHz: -5 })).toThrow(/rateHz/);
    expect(() => simulate({ ...base, delaySamples: 1.5 })).toThrow(/delaySamples/);
    expect(() => simulate({ ...base, innerSteps: 0 })).toThrow(/innerSteps/);
    expect(() => simulate({ ...base, plant: {} as TrialPlant })).toThrow(/plant/);
    expect(() => simulate({ ...base, sensor: { noiseStd: 1e-3 } })).toThrow(/random source/);
  });
});
