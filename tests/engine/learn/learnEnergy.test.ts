import { describe, it, expect } from 'vitest';
import { learnEnergy, modelEvaluator, toEnergyFunction } from '../../../src-main/engine/learn/index.ts';
import { affineR2, rng, simulate } from './simulate.ts';
import type { Recording } from '../../../src-main/engine/types.ts';

// Held-out grid: points of the phase plane inside the energy band the data covers, none of them samples.
function gridR2(H: (q: number, v: number) => number, Htrue: (q: number, v: number) => number, q: [number, number], v: [number, number], hMax: number): number {
  const f: number[] = [], g: number[] = [];
  for (let i = 0; i < 57; i++) for (let j = 0; j < 53; j++) {
    const x = q[0] + ((q[1] - q[0]) * (i + 0.5)) / 57, y = v[0] + ((v[1] - v[0]) * (j + 0.5)) / 53;
    if (Htrue(x, y) <= hMax) { f.push(H(x, y)); g.push(Htrue(x, y)); }
  }
  return affineR2(f, g);
}

describe('learnEnergy on simulated position-only recordings', () => {
  it('learns the double-well Duffing energy, its wells and its barrier', () => {
    // q'' = a q - b q^3 - c q', a = 2, b = 0.5: H = v^2/2 - a q^2/2 + b q^4/4, wells at +-sqrt(a/b) = +-2,
    // well depth a^2/(4b) = 2 below the barrier at q = 0 (references.md "Duffing double well").
    const a = 2, b = 0.5, c = 0.02;
    const Htrue = (q: number, v: number) => v * v / 2 - a * q * q / 2 + b * q ** 4 / 4;
    const inits: [number, number][] = [[2.5, 0], [-1.2, 0.5], [0.2, 2.2], [3, 0], [-2.8, 0.3], [1.6, -0.4]];
    const sim = simulate({ accel: (q, v) => a * q - b * q ** 3 - c * v, inits, dt: 0.01, seconds: 30, noise: 0.003, bits: 14, seed: 11 });
    const before = sim.recording.runs.map((r) => Float64Array.from(r.q));
    const m = learnEnergy(sim.recording);
    sim.recording.runs.forEach((r, k) => expect(r.q).toEqual(before[k])); // inputs are never mutated
    expect(m.status).toBe('ok');
    const e = modelEvaluator(m);
    const hMax = Math.max(...inits.map(([q, v]) => Htrue(q, v)));
    expect(gridR2(e.H, Htrue, [-3, 3], [-3, 3], hMax)).toBeGreaterThanOrEqual(0.9999);
    const wells = m.landscape!.wells;
    expect(wells.length).toBe(2);
    expect(Math.abs(wells[0].q + 2) / 2).toBeLessThan(0.01);
    expect(Math.abs(wells[1].q - 2) / 2).toBeLessThan(0.01);
    // H is normalised to unit mass (v^2 coefficient 1/2), the simulated mass, so energies compare directly.
    const barrier = m.landscape!.barriers[0];
    expect(Math.abs(barrier.q)).toBeLessThan(0.02);
    expect(Math.abs(barrier.V - Math.min(wells[0].V, wells[1].V) - 2) / 2).toBeLessThan(0.01);
    expect(m.metrics.nullSpaceDimension).toBe(1);
    expect(m.structure.separable).toBe(true);
    // The derivative form must agree with the weak form (cross-check).
    expect(m.metrics.derivativeForm!.agreement).toBeGreaterThan(0.999);
  });

  it('learns the pendulum energy from wrapped angles, including a run over the top', () => {
    // q'' = -(g/l) sin q - c q': H = v^2/2 - (g/l) cos q (elementary mechanics), g/l = 9.81/0.42 (references.md §5).
    const w2 = 9.81 / 0.42, c = 0.05;
    const Htrue = (q: number, v: number) => v * v / 2 - w2 * Math.cos(q);
    const inits: [number, number][] = [[0.3, 0], [0.8, 0], [-1.5, 0], [2.5, 0], [0, 11], [0, -4]];
    const sim = simulate({ accel: (q, v) => -w2 * Math.sin(q) - c * v, inits, dt: 0.005, seconds: 12, noise: 0.003, bits: 12, seed: 5, angle: true, wrap: true });
    const m = learnEnergy(sim.recording);
    expect(m.status).toBe('ok');
    const e = toEnergyFunction(m);
    expect(gridR2(e.H, Htrue, [-Math.PI, Math.PI], [-11, 11], Htrue(0, 11))).toBeGreaterThanOrEqual(0.9999);
    // Degree growth stops at 2, where H lives, before degree 4 where H^2 would also fit.
    expect(m.library.degree).toBe(2);
    // One well at the bottom, the barrier at the top, 2 g/l above it (unit inertia).
    const L = m.landscape!;
    expect(L.periodic).toBe(true);
    expect(L.wells.length).toBe(1);
    expect(Math.abs(L.wells[0].q)).toBeLessThan(0.01);
    expect(Math.abs(Math.abs(L.barriers[0].q) - Math.PI)).toBeLessThan(0.01);
    expect(Math.abs(L.barriers[0].V - 2 * w2) / (2 * w2)).toBeLessThan(0.01);
    // H = v^2/2 + V(q) is separable; replaying each run from its initial state through the derived
    // equations of motion follows the recording (RMS within 5 % of the range over three periods).
    expect(m.structure.separable).toBe(true);
    expect(m.replay.length).toBe(inits.length);
    expect(Math.max(...m.replay.map((r) => r.relativeError))).toBeLessThan(0.05);
  });

  it('reports a damping ratio within 10% of the simulated one, consistent with the log decrement', () => {
    // Small swings of a pendulum with zeta = 0.02: lambda ~ -2 zeta omega_n (design.md §2) and the
    // log decrement zeta = delta / sqrt(4 pi^2 + delta^2) (references.md §2).
    const w2 = 9.81 / 0.42, zeta = 0.02, c = 2 * zeta * Math.sqrt(w2);
    const inits: [number, number][] = [[0.3, 0], [0.5, 0], [-0.4, 0.5], [0.2, -1], [-0.6, 0]];
    const sim = simulate({ accel: (q, v) => -w2 * Math.sin(q) - c * v, inits, dt: 0.005, seconds: 10, noise: 0.002, bits: 14, seed: 8, angle: true });
    const m = learnEnergy(sim.recording);
    expect(m.status).toBe('ok');
    expect(Math.abs(m.damping.zetaFromLambda - zeta) / zeta).toBeLessThan(0.1);
    expect(m.damping.zetaLogDecrement).not.toBeNull();
    expect(Math.abs(m.damping.zetaLogDecrement! - zeta) / zeta).toBeLessThan(0.1);
    expect(Math.abs(m.damping.zetaFromLambda - m.damping.zetaLogDecrement!) / zeta).toBeLessThan(0.15);
    // The derivative form's lambda is reported beside it and agrees.
    expect(Math.abs(m.damping.lambdaDerivativeForm! - m.lambda) / Math.abs(m.lambda)).toBeLessThan(0.2);
  });

  it('records the range the recordings covered: a pendulum swung to 30 degrees reaches m g l (1 - cos 30 deg)', () => {
    // Pendulum m = 0.5 kg, l = 0.42 m (references.md §5), inertia given: H in joules. The largest run
    // starts at rest at 30 degrees, so its energy is m g l (1 - cos 30 deg) (elementary mechanics),
    // its turning points +-30 degrees and its top speed at the bottom sqrt(2 (g/l) (1 - cos 30 deg)).
    const m = 0.5, l = 0.42, g = 9.81, I = m * l * l, deg = Math.PI / 180;
    const sim = simulate({
      accel: (q, v) => -(g / l) * Math.sin(q) - 0.02 * v, inits: [[30 * deg, 0], [-22 * deg, 0], [15 * deg, 0.3], [-8 * deg, -0.5], [26 * deg, 0]],
      dt: 0.005, seconds: 10, noise: 0.002, bits: 12, seed: 21, angle: true,
    });
    const model = learnEnergy(sim.recording, { mass: I });
    expect(model.status).toBe('ok');
    const c = model.coverage!;
    const top = m * g * l * (1 - Math.cos(30 * deg));
    expect(Math.abs(c.energyMax / top - 1)).toBeLessThan(0.02);
    // The bottom of the range is the smallest run (8 degrees, pushed at 0.5 rad/s) at its end: with
    // viscous damping c, dE/dt = -c I v^2 averages to -c E over a small swing, so E(10 s) = E0 exp(-10 c)
    // (elementary mechanics, small-amplitude averaging).
    const smallest = m * g * l * (1 - Math.cos(8 * deg)) + I * 0.5 ** 2 / 2;
    expect(Math.abs(c.energyMin / (smallest * Math.exp(-0.02 * 10)) - 1)).toBeLessThan(0.03);
    expect(Math.abs(c.qMax / (30 * deg) - 1)).toBeLessThan(0.05);
    expect(Math.abs(c.qMin / (-30 * deg) - 1)).toBeLessThan(0.05);
    expect(Math.abs(c.vMaxAbs / Math.sqrt((2 * g / l) * (1 - Math.cos(30 * deg))) - 1)).toBeLessThan(0.03);
    expect(c.joulesPerModelUnit).toBe(model.scale.joulesPerModelUnit);
  });

  it('gives the "no lightly damped energy" verdict for zeta = 0.4', () => {
    // Linear oscillator with zeta = 0.4: an energy-like eigenfunction exists but decays at 2 zeta omega_n.
    const w = 5, zeta = 0.4;
    const inits: [number, number][] = [[1, 0], [-0.8, 2], [0.5, -3], [0.9, 1], [-1, -1], [0.3, 4]];
    const sim = simulate({ accel: (q, v) => -w * w * q - 2 * zeta * w * v, inits, dt: 0.005, seconds: 4, noise: 0.002, bits: 14, seed: 3 });
    const m = learnEnergy(sim.recording);
    expect(m.status).toBe('no-energy');
    expect(m.verdict.code).toBe('heavy-damping');
    expect(m.verdict.reason).toMatch(/no lightly damped energy/);
    expect(m.coverage).toBeUndefined(); // a rejected fit records no range
    expect(() => toEnergyFunction(m)).toThrow(/no conserved energy/);
  });

  it('refuses a driven system whose drive is not recorded (chaotic forced Duffing)', () => {
    // q'' = q - q^3 - 0.25 q' + 0.3 cos t: the forced double-well oscillator in its chaotic regime
    // (Guckenheimer & Holmes 1983, §2.2, from memory); no function of (q, v) alone is conserved.
    const sim = simulate({ accel: (q, v, t) => q - q ** 3 - 0.25 * v + 0.3 * Math.cos(t), inits: [[1, 0], [-1, 0.2], [0.5, 0.5], [1.5, 0], [-0.2, 0.3]], dt: 0.01, seconds: 60, noise: 0.002, bits: 14, seed: 4 });
    const m = learnEnergy(sim.recording);
    expect(m.status).toBe('no-energy');
    expect(m.verdict.code).toBe('not-conserved');
    expect(m.verdict.advice).toMatch(/--input/);
    // The rejected fit is not handed out.
    expect(m.formula).toBe('');
    expect(m.coefficients.every((c) => c === 0)).toBe(true);
  });

  it('gives a clear verdict for a single short run', () => {
    // 1.5 periods of a 1 Hz oscillator: fewer than the three periods required (LEARN_LIMITS).
    const sim = simulate({ accel: (q) => -((2 * Math.PI) ** 2) * q, inits: [[1, 0]], dt: 0.01, seconds: 1.5, noise: 0.002, bits: 14 });
    const m = learnEnergy(sim.recording);
    expect(m.status).toBe('no-energy');
    expect(m.verdict.code).toBe('too-little-data');
    expect(m.verdict.advice).toMatch(/record more/);
  });

  it('gives a clear verdict for a recording of noise only', () => {
    const g = rng(4);
    const n = 5000;
    const rec: Recording = { coordinate: 'linear', runs: [0, 1, 2].map((k) => ({ name: `noise ${k}`, source: '', t: Float64Array.from({ length: n }, (_, i) => i * 0.01), q: Float64Array.from({ length: n }, () => Math.round(g.normal() * 1000) / 1000) })) };
    const m = learnEnergy(rec);
    expect(m.status).toBe('no-energy');
    expect(m.verdict.code).toBe('noise-only');
  });

  it('names the run and field for unusable input', () => {
    const rec: Recording = { coordinate: 'linear', runs: [{ name: 'a', source: '', t: Float64Array.from([0, 0.1, 0.3]), q: Float64Array.from([0, 1, 2]) }] };
    expect(() => learnEnergy(rec)).toThrow(/runs\[0\] \(a\)\.t: sampling is not uniform/);
    expect(() => learnEnergy(rec, { maxDegree: 0 })).toThrow(/options\.maxDegree must be an integer in 1\.\.12, got 0/);
    expect(() => learnEnergy(rec, { mass: -1 })).toThrow(/options\.mass must be a positive number/);
  });
});
