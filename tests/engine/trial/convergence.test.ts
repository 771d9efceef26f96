// Closed-loop convergence of the cycle-averaged energy into the +-2% band (issue 4, "Tests that
// must exist"), with the level-hold law of engine/control, a 12-bit encoder (or a 12-bit ADC over
// a stated span for the linear Duffing coordinate), Gaussian position noise, and a 1 kHz
// controller; |u| <= uMax is checked on the applied input. Analytic energies written inline:
// pendulum H = 1/2 m l^2 v^2 + m g l (1 - cos q) (references.md §5, §6), Duffing double well
// H = v^2/2 - a x^2/2 + b x^4/4 (references.md "Duffing double well").
import { describe, it, expect } from 'vitest';
import { simulate } from '../../../src-main/engine/trial/simulate.ts';
import { trialMetrics } from '../../../src-main/engine/trial/metrics.ts';
import { sensorSigmas } from '../../../src-main/engine/trial/energy-resolution.ts';
import { levelHoldController } from '../../../src-main/engine/trial/level-hold-adapter.ts';
import { meanSquareInputGain } from '../../../src-main/engine/control/index.ts';
import { Pcg32 } from '../../../src-main/engine/signal/random.ts';
import type { EnergyFunction } from '../../../src-main/engine/types.ts';
import type { EstimatorOptions, TrialPlant } from '../../../src-main/engine/trial/types.ts';

const DEG = Math.PI / 180;

// Pendulum rig: m = 0.5 kg, l = 0.42 m (references.md §5), light viscous damping zeta = 0.01.
const m = 0.5, l = 0.42, g = 9.81, J = m * l * l, w0 = Math.sqrt(g / l), c = 2 * 0.01 * w0;
const pendulum: TrialPlant = { coordinate: 'angle', accel: (q, v, u) => -(g / l) * Math.sin(q) - c * v + u / J };
// Koopman eigenvalue of the energy under light viscous damping: lambda = -2 zeta w0 = -c
// (design.md §2; the cycle average of dH/dt = -c J v^2 is -c H for small swings).
const pendulumH: EnergyFunction = {
  coordinate: 'angle', lambda: -c,
  H: (q, v) => 0.5 * J * v * v + m * g * l * (1 - Math.cos(q)),
  grad: (q, v, o) => { o[0] = m * g * l * Math.sin(q); o[1] = J * v; },
};

// Duffing double well, a = b = 1: wells at x = +-1, barrier at x = 0, 1/4 above the wells; light
// damping. H carries the offset of design.md §2 (V = 0 at the deepest well): H = ... + 1/4.
const da = 1, db = 1, dc = 0.01;
const duffing: TrialPlant = { coordinate: 'linear', accel: (x, v, u) => da * x - db * x * x * x - dc * v + u };
const duffingH: EnergyFunction = {
  coordinate: 'linear', lambda: -dc,
  H: (x, v) => 0.5 * v * v - 0.5 * da * x * x + 0.25 * db * x ** 4 + (da * da) / (4 * db),
  grad: (x, v, o) => { o[0] = -da * x + db * x * x * x; o[1] = v; },
};

interface Case {
  plant: TrialPlant; energy: EnergyFunction; q0: number; target: number; uMax: number; inputGain: number;
  gain: number; eps: number; duration: number; sensor: { bits: number; range?: number; noiseStd: number };
  /** Cutoff of the velocity low-pass, Hz. */
  cutoffHz: number;
  /** Use the model observer instead of the filtered difference. */
  observer?: boolean;
  /** Bottom of the well the orbit circles (for <b^2>). */
  bottom: number;
}

function run(k: Case, seed: number) {
  const rng = new Pcg32(seed, 1);
  const estimator: EstimatorOptions = k.observer ? { kind: 'observer', model: k.plant } : { kind: 'difference', cutoffHz: k.cutoffHz };
  // Loss compensation u_ff = -lambda H* b / <b^2>, <b^2> on the undamped model orbit at H* (design.md §2).
  const orbit = meanSquareInputGain({ energy: k.energy, accel: (q) => k.plant.accel(q, 0, 0, 0), inputGain: k.inputGain, level: k.target, q0: k.bottom });
  expect(orbit.status).toBe('ok');
  const controller = levelHoldController({
    energy: k.energy, inputGain: k.inputGain, target: k.target, Q: k.gain * k.gain, R: 1, eps: k.eps, uMax: k.uMax, meanB2: orbit.meanB2,
  });
  const r = simulate({
    plant: k.plant, energy: k.energy, controller, q0: k.q0, v0: 0, duration: k.duration, rateHz: 1000,
    sensor: k.sensor, random: () => rng.uniform(), estimator,
  });
  const sig = sensorSigmas(r.diagnostics.sensorStep, k.sensor.noiseStd, r.diagnostics.T, estimator);
  // The tool's metrics: band = max(2% |H*|, the sensor's energy resolution), stated.
  const metrics = trialMetrics(r.trace, { target: k.target, energy: k.energy, sensor: sig });
  // The strict check of the issue: the last 3 cycle averages inside +-2% of H*, whatever the sensor.
  const strict = trialMetrics(r.trace, { target: k.target });
  expect(strict.bandBasis).toBe('relative');
  expect(strict.band).toBeCloseTo(0.02 * Math.abs(k.target), 15);
  expect(strict.converged).toBe(true);
  return { r, metrics };
}

const encoder = { bits: 12, noiseStd: 5e-4 }; // 12-bit over 2 pi: step 1.53e-3 rad; noise 0.5 mrad

describe('level-hold trials converge into the +-2% band of the cycle-averaged energy', () => {
  it('pumps a pendulum from near rest (3 degrees) to a 120-degree swing', () => {
    const target = m * g * l * (1 - Math.cos(120 * DEG)); // H* = V(120 deg), design.md "Wells and hops"
    const { r, metrics } = run({ plant: pendulum, energy: pendulumH, q0: 3 * DEG, target, uMax: 1, inputGain: 1 / J,
      gain: 20 / target, eps: 0.2, duration: 30, sensor: encoder, bottom: 0, cutoffHz: 10 }, 11);
    expect(r.status).toBe('ok');
    expect(metrics.bandBasis).toBe('relative');
    expect(metrics.converged).toBe(true);
    expect(Math.abs(metrics.finalRelError)).toBeLessThan(0.02);
    expect(metrics.timeToBand).not.toBeNull();
    expect(metrics.peakU).toBeLessThanOrEqual(1);
    // The swing reached: about 118 degrees measured (the velocity filter's lag, see the 10-degree case); bound 3%.
    expect(Math.abs(metrics.amplitude / (120 * DEG) - 1)).toBeLessThan(0.03);
  });

  it('pumps the pendulum to 120 degrees with the velocity from a model observer instead', () => {
    const target = m * g * l * (1 - Math.cos(120 * DEG));
    const { metrics } = run({ plant: pendulum, energy: pendulumH, q0: 3 * DEG, target, uMax: 1, inputGain: 1 / J,
      gain: 20 / target, eps: 0.2, duration: 30, sensor: encoder, bottom: 0, cutoffHz: 10, observer: true }, 15);
    expect(metrics.converged).toBe(true);
    expect(Math.abs(metrics.finalRelError)).toBeLessThan(0.02);
    expect(Math.abs(metrics.amplitude / (120 * DEG) - 1)).toBeLessThan(0.02);
    expect(metrics.peakU).toBeLessThanOrEqual(1);
  });

  it('bleeds a pendulum from 150 degrees to a 10-degree swing (amplitude within 2% of 10 degrees), velocity from the model observer', () => {
    const target = m * g * l * (1 - Math.cos(10 * DEG));
    const { r, metrics } = run({ plant: pendulum, energy: pendulumH, q0: 150 * DEG, target, uMax: 1, inputGain: 1 / J,
      gain: 20 / (m * g * l), eps: 0.2, duration: 30, sensor: encoder, bottom: 0, cutoffHz: 10, observer: true }, 12);
    expect(r.status).toBe('ok');
    expect(metrics.converged).toBe(true);
    // At 10 degrees the sensor's energy resolution is stated; the 2% band is used unless it is coarser.
    expect(metrics.resolution).toBeGreaterThan(0);
    expect(Math.abs(metrics.finalRelError)).toBeLessThan(0.02);
    expect(Math.abs(metrics.amplitude / (10 * DEG) - 1)).toBeLessThan(0.02);
    expect(metrics.peakU).toBeLessThanOrEqual(1);
  });

  it('bleeds to 10 degrees with the filtered-difference velocity too (the cycle average in the band; the lag costs amplitude)', () => {
    // Measured here: with the 10 Hz low-pass the swing settles about 2% below 10 degrees (9.81 deg)
    // although the cycle-averaged energy is within about 1%: the filter's lag (about 16 ms) makes the
    // law add energy late in each half swing, so H is lower at the turning points than on average.
    // The model observer above has no such bias. Bound here: 3%.
    const target = m * g * l * (1 - Math.cos(10 * DEG));
    const { metrics } = run({ plant: pendulum, energy: pendulumH, q0: 150 * DEG, target, uMax: 1, inputGain: 1 / J,
      gain: 20 / (m * g * l), eps: 0.2, duration: 30, sensor: encoder, bottom: 0, cutoffHz: 10 }, 12);
    expect(metrics.converged).toBe(true);
    expect(Math.abs(metrics.finalRelError)).toBeLessThan(0.02);
    expect(Math.abs(metrics.amplitude / (10 * DEG) - 1)).toBeLessThan(0.03);
  });

  // 12-bit ADC over a span of 4 (+-2 length units): step 0.98e-3; noise 0.5e-3. The swing takes
  // 4.4 s or more, so the velocity low-pass is set at 3 Hz (about ten times the swing frequency:
  // common practice) instead of the 10 Hz default.
  const adc = { bits: 12, range: 4, noiseStd: 5e-4 };
  it('raises a Duffing oscillator within its right-hand well (from near the bottom to H* = 0.15, below the barrier 0.25)', () => {
    const target = 0.15;
    const { r, metrics } = run({ plant: duffing, energy: duffingH, q0: 1.05, target, uMax: 0.05, inputGain: 1,
      gain: 4, eps: 0.02, duration: 60, sensor: adc, bottom: 1, cutoffHz: 3 }, 13);
    expect(r.status).toBe('ok');
    expect(metrics.converged).toBe(true);
    expect(Math.abs(metrics.finalRelError)).toBeLessThan(0.02);
    expect(metrics.qMin).toBeGreaterThan(0); // stayed in the right-hand well
    expect(metrics.peakU).toBeLessThanOrEqual(0.05);
  });

  it('lowers a Duffing oscillator within its right-hand well (from H = 0.23 to H* = 0.05)', () => {
    // Start at rest at the outer turning point of the level 0.23: (x^2 - 1)^2 / 4 = 0.23, x^2 = 1 + sqrt(0.92).
    const x0 = Math.sqrt(1 + Math.sqrt(0.92));
    expect(duffingH.H(x0, 0)).toBeCloseTo(0.23, 12);
    const target = 0.05;
    const { r, metrics } = run({ plant: duffing, energy: duffingH, q0: x0, target, uMax: 0.05, inputGain: 1,
      gain: 4, eps: 0.02, duration: 60, sensor: adc, bottom: 1, cutoffHz: 3 }, 14);
    expect(r.status).toBe('ok');
    expect(metrics.converged).toBe(true);
    expect(Math.abs(metrics.finalRelError)).toBeLessThan(0.02);
    expect(metrics.qMin).toBeGreaterThan(0);
    expect(metrics.peakU).toBeLessThanOrEqual(0.05);
  });
});
