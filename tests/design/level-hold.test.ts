import { describe, expect, it } from 'vitest';
import { designLevelHold, energyFormula } from '../../src-main/design/level-hold.ts';
import { DesignRefusal } from '../../src-main/design/refusal.ts';
import { controllerFromDesign } from '../../src-main/design/supervisor.ts';
import { compileFormula } from '../../src-main/engine/formula/index.ts';
import { simulate } from '../../src-main/engine/trial/simulate.ts';
import { trialMetrics } from '../../src-main/engine/trial/metrics.ts';
import { LAMBDA, LEN, GRAV, W2, duffingModel, pendulumModel } from './models.ts';

const M = 0.5, I = M * LEN * LEN, MGL = M * GRAV * LEN;
const deg = Math.PI / 180;

/** <v^2> over the pendulum's libration of amplitude A, independently: with sin(q/2) = k sin(phi),
 * k = sin(A/2), the integral of v dq over a period is 16 w k^2 int_0^{pi/2} cos^2 / sqrt(1 - k^2 sin^2) dphi
 * and the period is 4 K(k^2) / w (elementary mechanics; references.md §1 for T). Midpoint rule. */
function meanV2(A: number): number {
  const w = Math.sqrt(W2), k = Math.sin(A / 2), n = 20000;
  let num = 0, K = 0;
  for (let i = 0; i < n; i++) {
    const p = ((i + 0.5) * Math.PI) / 2 / n, s = Math.sin(p), r = Math.sqrt(1 - k * k * s * s);
    num += (Math.cos(p) ** 2) / r; K += 1 / r;
  }
  num *= Math.PI / 2 / n; K *= Math.PI / 2 / n;
  return (16 * w * k * k * num) / ((4 * K) / w);
}

function refusal(f: () => unknown): string {
  try { f(); } catch (e) { expect(e).toBeInstanceOf(DesignRefusal); return (e as Error).message; }
  throw new Error('expected a refusal');
}

describe('designLevelHold', () => {
  it('resolves a swing amplitude to H* = m g l (1 - cos A) on a pendulum with its mass given', () => {
    for (const A of [10, 45, 120, 150]) {
      const d = designLevelHold(pendulumModel(), { target: { kind: 'amplitude', amplitude: A * deg }, mass: I });
      // Elementary mechanics: the turning-point energy above the bottom.
      expect(d.stages[0].target.energy).toBeCloseTo(MGL * (1 - Math.cos(A * deg)), 12);
      expect(d.model.units).toBe('J');
      expect(d.input).toEqual({ gain: 1 / I, unit: 'N m' });
    }
  });

  it('writes the energy in joules and the equations of motion q\'\' = -(g/l) sin q + lambda v + u/(m l^2)', () => {
    const d = designLevelHold(pendulumModel(), { target: { kind: 'energy', energy: 0.5 }, mass: I });
    const H = compileFormula(d.model.energy, ['q', 'v']);
    const acc = compileFormula(d.model.acceleration!, ['q', 'v', 'u', 't']);
    for (const [q, v, u] of [[0.3, -1.2, 0.1], [2.5, 0.7, -0.4], [-1, 3, 0]]) {
      expect(H.eval(Float64Array.from([q, v]))).toBeCloseTo(I * v * v / 2 + MGL * (1 - Math.cos(q)), 12);
      // Pendulum equation of motion (elementary mechanics) with the learn engine's damping convention lambda v.
      expect(acc.eval(Float64Array.from([q, v, u, 0]))).toBeCloseTo(-W2 * Math.sin(q) + LAMBDA * v + u / I, 10);
    }
  });

  it('computes <b^2> at the target on the model\'s own equations (b = v for a torque input)', () => {
    const A = 120 * deg;
    const d = designLevelHold(pendulumModel(), { target: { kind: 'amplitude', amplitude: A }, mass: I });
    expect(d.stages[0].meanB2! / meanV2(A) - 1).toBeLessThan(1e-6);
    expect(d.stages[0].meanB2! / meanV2(A) - 1).toBeGreaterThan(-1e-6);
    expect(d.law.lossCompensation).toBe(true);
  });

  it('targets the well bottom at rest, the well nearest the centre or the one asked for', () => {
    const p = designLevelHold(pendulumModel(), { target: { kind: 'at-rest' }, mass: I });
    expect(p.stages[0].target).toEqual({ kind: 'at-rest', well: 1, energy: 0 });
    expect(p.stages[0].meanB2).toBeNull();
    const d = designLevelHold(duffingModel(), { target: { kind: 'at-rest', well: 2 } });
    expect(d.stages[0].target).toEqual({ kind: 'at-rest', well: 2, energy: 0 });
    expect(d.model.wells.map((w) => w.q)).toEqual([-1, 1]);
  });

  it('resolves an amplitude inside one Duffing well about its bottom: H* = (q^2 - 1)^2 / 4 at q = 1 + A', () => {
    const d = designLevelHold(duffingModel(), { target: { kind: 'amplitude', amplitude: 0.3, well: 2 } });
    // references.md "Duffing double well": V = q^4/4 - q^2/2 + 1/4 = (q^2 - 1)^2 / 4 with a = b = 1.
    expect(d.stages[0].target.energy).toBeCloseTo((1.3 ** 2 - 1) ** 2 / 4, 14);
    expect(d.model.validRange.energyMax).toBeCloseTo((1.8 ** 2 - 1) ** 2 / 4, 14);
  });

  it('refuses a target above the recorded range, with the reason and the range', () => {
    const msg = refusal(() => designLevelHold(pendulumModel(), { target: { kind: 'energy', energy: 3 * MGL }, mass: I }));
    expect(msg).toMatch(/above what the model knows/);
    expect(msg).toMatch(new RegExp(`0 \\.\\. ${Number((2 * MGL).toPrecision(4))} J`));
    const duff = refusal(() => designLevelHold(duffingModel(), { target: { kind: 'energy', energy: 3 } }));
    expect(duff).toMatch(/recorded positions -1\.8 \.\. 1\.8/);
    expect(refusal(() => designLevelHold(duffingModel(), { target: { kind: 'amplitude', amplitude: 1, well: 2 } }))).toMatch(/outside the recorded range/);
    expect(refusal(() => designLevelHold(duffingModel(), { target: { kind: 'amplitude', amplitude: -1.5, well: 2 } }))).toMatch(/cross a barrier/);
    expect(refusal(() => designLevelHold(duffingModel(), { target: { kind: 'energy', energy: -0.1 } }))).toMatch(/below the bottom of well 1/);
    // V(1.5) = (1.5^2 - 1)^2 / 4 = 0.390625 > 0.25, the barrier: the swing would not stay in well 2.
    expect(refusal(() => designLevelHold(duffingModel(), { target: { kind: 'amplitude', amplitude: 0.5, well: 2 } }))).toMatch(/H\* = V\(1\.5\) = 0\.3906 J, above the lowest barrier of that well \(0\.25 J\)/);
    expect(refusal(() => designLevelHold(duffingModel(), { target: { kind: 'at-rest', well: 3 } }))).toMatch(/well 3 does not exist/);
  });

  it('with a recorded range, refuses targets more than 5% above its top and says what to do', () => {
    // The pendulum recorded up to 40 degrees: top (g/l)(1 - cos 40 deg) per unit inertia (elementary
    // mechanics), as engine/learn would record it; the design's H is in joules with inertia I.
    const model = pendulumModel();
    const top = W2 * (1 - Math.cos(40 * deg));
    model.coverage = { energyMin: 0.1 * top, energyMax: top, qMin: -40 * deg, qMax: 40 * deg, vMaxAbs: Math.sqrt(2 * top), joulesPerModelUnit: 1 };
    const J = I * top;
    // 4% above the top is inside the 5% allowance; the check says so.
    const ok = designLevelHold(model, { target: { kind: 'energy', energy: 1.04 * J }, mass: I });
    expect(ok.stages[0].target.energy).toBe(1.04 * J);
    expect(ok.checks.find((c) => c.name === 'target in range')!.detail).toMatch(/4% above the recorded top, inside the allowance/);
    expect(ok.model.validRange).toEqual({ qMin: -40 * deg, qMax: 40 * deg, energyMin: 0.1 * J, energyMax: J });
    // 6% above is refused, with the target, the recorded range and the advice.
    const msg = refusal(() => designLevelHold(model, { target: { kind: 'energy', energy: 1.06 * J }, mass: I }));
    expect(msg).toContain(`the target energy ${Number((1.06 * J).toPrecision(4))} J is above what the model knows`);
    expect(msg).toContain(`the recordings reached ${Number((0.1 * J).toPrecision(4))} .. ${Number(J.toPrecision(4))} J`);
    expect(msg).toContain(`(${Number((1.05 * J).toPrecision(4))} J)`);
    expect(msg).toMatch(/record swings up to that level, or choose a lower target/);
    // A 120 degree swing is far above (the old landscape range would have let it through up to the top).
    expect(refusal(() => designLevelHold(model, { target: { kind: 'amplitude', amplitude: 120 * deg }, mass: I }))).toMatch(/a swing of amplitude 2\.094 rad about well 1\) is above what the model knows/);
    // At rest stays possible: the well bottom is below the recorded range, not above it.
    expect(designLevelHold(model, { target: { kind: 'at-rest' }, mass: I }).stages[0].target.energy).toBe(0);
  });

  it('rescales the recorded range with H: a calibrated model, another mass, a model rescaled since learning', () => {
    const top = W2 * (1 - Math.cos(40 * deg));
    const cov = { energyMin: 0, energyMax: top, qMin: -1, qMax: 1, vMaxAbs: 1, joulesPerModelUnit: 1 };
    // Learned per unit inertia, inertia 2 I given to the designer: range x 2 I.
    const a = pendulumModel();
    a.coverage = { ...cov };
    expect(designLevelHold(a, { target: { kind: 'at-rest' }, mass: 2 * I }).model.validRange.energyMax).toBeCloseTo(2 * I * top, 14);
    // Learned with inertia I (H and coverage in joules), the designer given 3 I: range x 3.
    const b = pendulumModel(I);
    b.coverage = { ...cov, energyMax: I * top, joulesPerModelUnit: I };
    expect(designLevelHold(b, { target: { kind: 'at-rest' }, mass: 3 * I }).model.validRange.energyMax).toBeCloseTo(3 * I * top, 14);
    // H rescaled by a tool after learning (per unit inertia -> inertia I, scale.joulesPerModelUnit updated, the coverage left as learned).
    const c = pendulumModel(I);
    c.coverage = { ...cov };
    expect(designLevelHold(c, { target: { kind: 'at-rest' } }).model.validRange.energyMax).toBeCloseTo(I * top, 14);
  });

  it('keeps the landscape-derived range for a model file without a recorded range, and says so', () => {
    // A 120 degree swing is below the barrier 2 m g l: accepted, as before the range was recorded.
    const d = designLevelHold(pendulumModel(), { target: { kind: 'amplitude', amplitude: 120 * deg }, mass: I });
    expect(d.model.validRange).toEqual({ qMin: -Math.PI, qMax: Math.PI, energyMin: 0, energyMax: 2 * MGL });
    expect(d.checks.find((c) => c.name === 'target in range')!.detail).toMatch(/derived from the landscape: the model file does not record the energy range of its recordings/);
  });

  it('refuses an uncalibrated model without a mass or an input gain, and accepts either', () => {
    const msg = refusal(() => designLevelHold(pendulumModel(), { target: { kind: 'energy', energy: 1 } }));
    expect(msg).toMatch(/not calibrated/);
    expect(msg).toMatch(/physical unit/);
    expect(msg).toMatch(/--mass/);
    const g = designLevelHold(pendulumModel(), { target: { kind: 'energy', energy: 1 }, inputGain: 4 });
    expect(g.model.units).toBe('J/kg');
    expect(g.input.gain).toBe(4);
    const c = designLevelHold(pendulumModel(I), { target: { kind: 'energy', energy: 0.5 } });
    expect(c.input.gain).toBeCloseTo(1 / I, 12);
    // A calibrated model given another inertia is rescaled to it: H* = 2 I (g/l)(1 - cos A) for inertia 2 I.
    const r = designLevelHold(pendulumModel(I), { target: { kind: 'amplitude', amplitude: 1 }, mass: 2 * I });
    expect(r.stages[0].target.energy).toBeCloseTo(2 * I * W2 * (1 - Math.cos(1)), 12);
    expect(r.input.gain).toBeCloseTo(1 / (2 * I), 12);
    expect(r.checks[0].detail).toMatch(/replaces the model's mass/);
  });

  it('reports a u_max too small to overcome the damping at the target (RMS |lambda H*| / sqrt(<v^2>))', () => {
    const A = 120 * deg, Hs = MGL * (1 - Math.cos(A));
    const need = Math.abs(LAMBDA * Hs) / Math.sqrt(meanV2(A)); // torque input: b = v
    const small = designLevelHold(pendulumModel(), { target: { kind: 'amplitude', amplitude: A }, mass: I, uMax: 0.5 * need });
    const c = small.checks.find((x) => x.name === 'u_max vs losses')!;
    expect(c.ok).toBe(false);
    expect(c.detail).toMatch(/too small to overcome the damping/);
    expect(c.detail).toContain(`RMS ${Number(need.toPrecision(4))}`);
    const big = designLevelHold(pendulumModel(), { target: { kind: 'amplitude', amplitude: A }, mass: I, uMax: 3 * need });
    expect(big.checks.find((x) => x.name === 'u_max vs losses')!.ok).toBe(true);
  });

  it('writes the model\'s energy with exact coefficients', () => {
    expect(energyFormula(duffingModel())).toBe('0.5*v^2 - 0.5*q^2 + 0.25*q^4 + 0.25');
  });

  it('gives a design whose supervisor pumps the pendulum from near rest to a 120 degree swing on its own equations', () => {
    const A = 120 * deg, Hs = MGL * (1 - Math.cos(A));
    const d = designLevelHold(pendulumModel(), { target: { kind: 'amplitude', amplitude: A }, mass: I, uMax: 0.3 });
    const ctl = controllerFromDesign(d);
    const acc = compileFormula(d.model.acceleration!, ['q', 'v', 'u', 't']);
    const x = new Float64Array(4);
    const plant = { coordinate: 'angle' as const, accel: (q: number, v: number, u: number) => { x[0] = q; x[1] = v; x[2] = u; return acc.eval(x); } };
    const r = simulate({ plant, energy: ctl.energy, controller: ctl, q0: 3 * deg, v0: 0, duration: 25, sensor: { bits: 12, noiseStd: 1e-4 }, random: mulberry(1) });
    const m = trialMetrics(r.trace, { target: Hs });
    expect(m.converged).toBe(true);
    expect(Math.abs(m.finalRelError)).toBeLessThan(0.02);
    expect(m.peakU).toBeLessThanOrEqual(0.3);
  });
});

/** Small deterministic uniform source for the sensor noise (mulberry32, common practice). */
function mulberry(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
