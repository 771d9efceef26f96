import { describe, it, expect } from 'vitest';
import { makeLevelHold, type LevelHoldDesign, type LevelHoldOutput } from '../../../src-main/engine/control/level-hold.ts';
import { solveCareScalar } from '../../../src-main/engine/control/care-scalar.ts';
import { meanSquareInputGain } from '../../../src-main/engine/control/orbit-average.ts';
import { targetFromAmplitude } from '../../../src-main/engine/control/targets.ts';
import { pendulumEnergy, simulatePendulum, W02, type SimTrace } from './pendulum-sim.ts';
import { expectClose } from './helpers.ts';

const DT = 0.01; // controller sample interval (100 Hz, zero-order hold)

function runLaw(design: LevelHoldDesign, sim: { q0: number; v0: number; seconds: number; c?: number; d?: number }): { tr: SimTrace; out: LevelHoldOutput[] } {
  const ctl = makeLevelHold(design);
  const out: LevelHoldOutput[] = [];
  const tr = simulatePendulum((q, v, t) => { const o = ctl.step({ q, v, t }, DT); out.push(o); return o.u; },
    { q0: sim.q0, v0: sim.v0, dt: DT, samples: Math.round(sim.seconds / DT), c: sim.c, d: sim.d });
  return { tr, out };
}

function energies(tr: SimTrace, H: (q: number, v: number) => number): number[] {
  return Array.from(tr.q, (q, i) => H(q, tr.v[i]));
}

/** Mean of the last `seconds` of a sampled signal. */
function tailMean(x: number[], seconds: number): number {
  const n = Math.round(seconds / DT);
  return x.slice(x.length - n).reduce((a, b) => a + b, 0) / n;
}

describe('level-hold law (SDRE on the energy coordinate)', () => {
  it('with lambda = 0, eps = 0 reproduces the energy-pumping law u = -k sign(b) (H - H*) trajectory for trajectory', () => {
    // Classic law (Astrom & Furuta, Automatica 36 (2000) 287-295; references.md §6), written here
    // independently with k = sqrt(Q/R), saturated at uMax; pendulum H = v^2/2 - w0^2 cos q, g_in = 1.
    const E = pendulumEnergy(0);
    const Q = 0.36, R = 1, uMax = 2, k = Math.sqrt(Q / R);
    const Hs = targetFromAmplitude(1.0, E).energy;
    const sim = { q0: 0.1, v0: 0, seconds: 15 };
    const ours = runLaw({ energy: E, inputGain: 1, target: Hs, Q, R, eps: 0, uMax }, sim).tr;
    const classic = simulatePendulum((q, v) => {
      const u = -k * Math.sign(v) * (E.H(q, v) - Hs);
      return Math.max(-uMax, Math.min(uMax, u));
    }, { q0: sim.q0, v0: sim.v0, dt: DT, samples: Math.round(sim.seconds / DT) });
    let worst = 0;
    for (let i = 0; i < ours.q.length; i++) worst = Math.max(worst, Math.abs(ours.q[i] - classic.q[i]), Math.abs(ours.v[i] - classic.v[i]));
    expect(worst).toBeLessThanOrEqual(1e-12);
    // and the law did something: H reached the target (not a test that cannot fail)
    const H = energies(ours, E.H);
    expect(Math.abs(H[H.length - 1] - Hs)).toBeLessThan(1e-3 * (Hs + W02));
  });

  it('its gain equals the scalar CARE solution with a = lambda, b = b(x): u = -(b p / R) z (design.md)', () => {
    const lambda = -0.07, Q = 2, R = 0.4, g = 1.5;
    const E = pendulumEnergy(lambda, W02);
    const ctl = makeLevelHold({ energy: E, inputGain: g, target: 5, Q, R });
    for (const [q, v] of [[0.3, 1.2], [-1, -0.4], [2, 3]]) {
      const b = g * v, z = E.H(q, v) - 5;
      const p = solveCareScalar(lambda, b, Q, R).x;
      ctl.reset();
      expectClose(ctl.step({ q, v, t: 0 }, DT).u, -(b * p / R) * z, 1e-13, `q=${q} v=${v}`);
    }
  });

  it('pumps a pendulum from near rest to H* (rk4Fixed plant, 100 Hz ZOH controller)', () => {
    const E = pendulumEnergy(0, W02); // V = 0 at the bottom
    const Hs = targetFromAmplitude(1.2, E).energy;
    const { tr } = runLaw({ energy: E, inputGain: 1, target: Hs, Q: 1, R: 1, eps: 0.05, uMax: 3 }, { q0: 0.05, v0: 0, seconds: 25 });
    const H = energies(tr, E.H);
    expect(H[0]).toBeLessThan(0.01 * Hs);
    for (const h of H.slice(H.length - 500)) expect(Math.abs(h - Hs)).toBeLessThan(1e-6 * Hs); // last 5 s
    // the amplitude is the requested one: the largest |q| over the last 5 s
    expectClose(Math.max(...Array.from(tr.q.slice(tr.q.length - 500), Math.abs)), 1.2, 1e-5, 'amplitude');
  });

  it('stays finite and tends to 0 at the turning point b -> 0 when lambda < 0', () => {
    const E = pendulumEnergy(-0.05, W02);
    const ctl = makeLevelHold({ energy: E, inputGain: 1, target: 20, Q: 1, R: 1 });
    let prev = Infinity;
    for (const v of [1e-2, 1e-5, 1e-9, 1e-300, 0]) {
      ctl.reset();
      const o = ctl.step({ q: 0.5, v, t: 0 }, DT);
      expect(Number.isFinite(o.u)).toBe(true);
      expect(Math.abs(o.u)).toBeLessThanOrEqual(prev);
      prev = Math.abs(o.u);
    }
    expect(prev).toBe(0);
  });

  it('respects the saturation |u| <= uMax and the rate limit |du| <= rateMax dt at every sample', () => {
    const E = pendulumEnergy(0, W02);
    const uMax = 0.8, rateMax = 20;
    for (const integral of [undefined, { Qw: 1 }]) {
      const { out } = runLaw({ energy: E, inputGain: 1, target: 15, Q: 4, R: 0.1, eps: 0.05, uMax, rateMax, integral }, { q0: 0.2, v0: 0, seconds: 10 });
      let prev = 0, sawSat = false, sawRate = false;
      for (const o of out) {
        expect(Math.abs(o.u)).toBeLessThanOrEqual(uMax);
        expect(Math.abs(o.u - prev)).toBeLessThanOrEqual(rateMax * DT * (1 + 1e-12));
        if (Math.abs(o.u) === uMax) sawSat = true;
        if (Math.abs(Math.abs(o.u - prev) - rateMax * DT) < 1e-12) sawRate = true;
        prev = o.u;
      }
      expect(sawSat && sawRate).toBe(true); // both limits were active, so the checks above had teeth
    }
  });

  it('integral action removes the steady-state error that unmodelled damping leaves with the plain law', () => {
    // Plant damping c = 0.05 1/s, design lambda = 0 (damping not modelled). For the plain law the
    // energy balance c <v^2> = k <|v|> |z| predicts a steady offset (derived by hand).
    const E = pendulumEnergy(0, W02);
    const Hs = targetFromAmplitude(1.0, E).energy;
    const base = { energy: E, inputGain: 1, target: Hs, Q: 1, R: 1, eps: 0.05, uMax: 3 };
    const sim = { q0: 0.05, v0: 0, seconds: 40, c: 0.05 };
    const plain = tailMean(energies(runLaw(base, sim).tr, E.H), 10) - Hs;
    const withI = tailMean(energies(runLaw({ ...base, integral: { Qw: 1 } }, sim).tr, E.H), 10) - Hs;
    expect(Math.abs(plain)).toBeGreaterThan(0.01 * Hs);
    expect(Math.abs(withI)).toBeLessThan(0.01 * Math.abs(plain));
  });

  it('loss compensation u_ff = -lambda H* b / <b^2> (with <b^2> from the orbit) removes most of the damping offset', () => {
    const c = 0.05;
    const E = pendulumEnergy(-c, W02); // for light damping lambda ~ -c on this H (design.md: -2 zeta w_n)
    const Hs = targetFromAmplitude(0.6, E).energy;
    const avg = meanSquareInputGain({ energy: E, accel: (q) => -W02 * Math.sin(q), inputGain: 1, level: Hs, q0: 0 });
    expect(avg.status).toBe('ok');
    const base = { energy: E, inputGain: 1, target: Hs, Q: 1, R: 1, eps: 0.05, uMax: 3, lambda: -c };
    const sim = { q0: 0.05, v0: 0, seconds: 40, c };
    const without = tailMean(energies(runLaw(base, sim).tr, E.H), 10) - Hs;
    const withFf = tailMean(energies(runLaw({ ...base, meanB2: avg.meanB2 }, sim).tr, E.H), 10) - Hs;
    expect(Math.abs(withFf)).toBeLessThan(0.1 * Math.abs(without));
  });

  it('conditional integration (anti-windup) prevents the overshoot of a wound-up integrator under tight saturation', () => {
    const E = pendulumEnergy(0, W02);
    const Hs = targetFromAmplitude(1.0, E).energy;
    const base = { energy: E, inputGain: 1, target: Hs, Q: 1, R: 1, eps: 0.05, uMax: 0.5 };
    const sim = { q0: 0.05, v0: 0, seconds: 40, c: 0.05 };
    const over = (aw: 'conditional' | 'none'): number => Math.max(...energies(runLaw({ ...base, integral: { Qw: 1, antiWindup: aw } }, sim).tr, E.H)) - Hs;
    const clamped = over('conditional'), wound = over('none');
    expect(clamped).toBeLessThan(0.01 * Hs);
    expect(wound).toBeGreaterThan(0.2 * Hs);
  });

  it('reset() clears u_prev and w; step writes into a caller-supplied output object', () => {
    const E = pendulumEnergy(0, W02);
    const ctl = makeLevelHold({ energy: E, inputGain: 1, target: 10, Q: 1, R: 1, eps: 0.1, integral: { Qw: 1 } });
    const o: LevelHoldOutput = { u: 0, z: 0, b: 0, saturated: false, w: 0, riccatiOk: true };
    expect(ctl.step({ q: 0.2, v: 1, t: 0 }, DT, o)).toBe(o);
    expect(o.z).toBe(E.H(0.2, 1) - 10);
    expect(ctl.internal.w).toBe(o.z * DT); // forward Euler from w = 0
    expect(ctl.internal.uPrev).toBe(o.u);
    ctl.reset();
    expect(ctl.internal).toEqual({ uPrev: 0, w: 0 });
  });

  it('names bad design fields', () => {
    const E = pendulumEnergy(0);
    const ok = { energy: E, inputGain: 1, target: 1, Q: 1, R: 1 };
    expect(() => makeLevelHold({ ...ok, R: 0 })).toThrow(/design\.R: expected a positive/);
    expect(() => makeLevelHold({ ...ok, inputGain: 0 })).toThrow(/design\.inputGain/);
    expect(() => makeLevelHold({ ...ok, eps: -1 })).toThrow(/design\.eps/);
    expect(() => makeLevelHold({ ...ok, target: { kind: 'energy', energy: NaN } })).toThrow(/design\.target\.energy/);
    expect(() => makeLevelHold({ ...ok, integral: { Qw: -1 } })).toThrow(/design\.integral\.Qw/);
    expect(() => makeLevelHold(ok).step({ q: 0, v: 0, t: 0 }, 0)).toThrow(/dt: expected a positive/);
  });
});
