// End to end on a learned model: free swings of a pendulum simulated, quantized and noisy, learned by
// engine/learn with the inertia given, then a level-hold design for a 90 degree swing checked
// against elementary mechanics and tried on the design's own equations of motion.
import { describe, expect, it } from 'vitest';
import { learnEnergy } from '../../src-main/engine/learn/index.ts';
import { rk4Fixed } from '../../src-main/engine/ode/rk4.ts';
import type { Recording } from '../../src-main/engine/types.ts';
import { designLevelHold } from '../../src-main/design/level-hold.ts';
import { DesignRefusal } from '../../src-main/design/refusal.ts';
import { controllerFromDesign } from '../../src-main/design/supervisor.ts';
import { compileFormula } from '../../src-main/engine/formula/index.ts';
import { simulate } from '../../src-main/engine/trial/simulate.ts';
import { trialMetrics } from '../../src-main/engine/trial/metrics.ts';

const m = 0.5, l = 0.42, g = 9.81, c = 0.05, I = m * l * l, MGL = m * g * l;

function recording(): Recording {
  const dt = 0.005, steps = 2400, step = (2 * Math.PI) / 4096; // 12-bit encoder
  let seed = 12345;
  const uni = () => { seed = (seed * 16807) % 2147483647; return seed / 2147483647; }; // Park-Miller (common practice)
  const normal = () => Math.sqrt(-2 * Math.log(uni())) * Math.cos(2 * Math.PI * uni()); // Box-Muller
  const runs = [0.4, 1.0, 1.6, 2.2, -1.3].map((q0, k) => {
    const r = rk4Fixed((_t, y, d) => { d[0] = y[1]; d[1] = -(g / l) * Math.sin(y[0]) - c * y[1]; }, 0, [q0, 0], dt / 4, steps * 4);
    const t = new Float64Array(steps + 1), q = new Float64Array(steps + 1);
    for (let i = 0; i <= steps; i++) { t[i] = i * dt; q[i] = Math.round((r.y[8 * i] + 1e-3 * normal()) / step) * step; }
    return { name: `swing ${k + 1}`, source: '', t, q };
  });
  return { coordinate: 'angle', runs };
}

describe('designLevelHold on a learned pendulum model', () => {
  it('targets H* = m g l (1 - cos 90 deg) within 1% and holds it on the learned equations of motion', () => {
    const model = learnEnergy(recording(), { mass: I });
    expect(model.status).toBe('ok');
    const A = Math.PI / 2;
    const d = designLevelHold(model, { target: { kind: 'amplitude', amplitude: A }, uMax: 0.2, integral: true });
    // Elementary mechanics: the turning-point energy above the bottom, m g l (1 - cos A).
    expect(Math.abs(d.stages[0].target.energy / (MGL * (1 - Math.cos(A))) - 1)).toBeLessThan(0.01);
    expect(d.input.unit).toBe('N m');
    expect(Math.abs(d.input.gain * I - 1)).toBeLessThan(0.01);
    expect(d.model.acceleration).not.toBeNull();
    const ctl = controllerFromDesign(d);
    const acc = compileFormula(d.model.acceleration!, ['q', 'v', 'u', 't']);
    const x = new Float64Array(4);
    // The true pendulum plant (not the learned one): q'' = -(g/l) sin q - c v + u / (m l^2).
    const plant = { coordinate: 'angle' as const, accel: (q: number, v: number, u: number) => -(g / l) * Math.sin(q) - c * v + u / I };
    const model2 = { coordinate: 'angle' as const, accel: (q: number, v: number, u: number) => { x[0] = q; x[1] = v; x[2] = u; return acc.eval(x); } };
    for (const p of [plant, model2]) {
      const r = simulate({ plant: p, energy: ctl.energy, controller: ctl, q0: 0.1, v0: 0, duration: 20, sensor: { bits: 12 } });
      const mt = trialMetrics(r.trace, { target: d.stages[0].target.energy });
      expect(mt.converged).toBe(true);
      expect(mt.peakU).toBeLessThanOrEqual(0.2);
    }
  });

  it('refuses a 120 degree swing on a model recorded only to 30 degrees, with the reason, and accepts 25 degrees', () => {
    // Free swings up to 30 degrees only (same pendulum, same sensor as above).
    const deg = Math.PI / 180, dt = 0.005, steps = 2000, step = (2 * Math.PI) / 4096;
    let seed = 777;
    const uni = () => { seed = (seed * 16807) % 2147483647; return seed / 2147483647; }; // Park-Miller (common practice)
    const normal = () => Math.sqrt(-2 * Math.log(uni())) * Math.cos(2 * Math.PI * uni()); // Box-Muller
    const runs = [30, -24, 17, -10].map((a, k) => {
      const r = rk4Fixed((_t, y, d) => { d[0] = y[1]; d[1] = -(g / l) * Math.sin(y[0]) - c * y[1]; }, 0, [a * deg, 0], dt / 4, steps * 4);
      const t = new Float64Array(steps + 1), q = new Float64Array(steps + 1);
      for (let i = 0; i <= steps; i++) { t[i] = i * dt; q[i] = Math.round((r.y[8 * i] + 1e-3 * normal()) / step) * step; }
      return { name: `small swing ${k + 1}`, source: '', t, q };
    });
    const model = learnEnergy({ coordinate: 'angle', runs }, { mass: I });
    expect(model.status).toBe('ok');
    // The recorded top: m g l (1 - cos 30 deg) (elementary mechanics), within 2%.
    const top30 = MGL * (1 - Math.cos(30 * deg));
    expect(Math.abs(model.coverage!.energyMax / top30 - 1)).toBeLessThan(0.02);

    // 120 degrees needs H* = m g l (1 - cos 120 deg) = 1.5 m g l, about 11 times the recorded top.
    let msg = '';
    try { designLevelHold(model, { target: { kind: 'amplitude', amplitude: 120 * deg }, uMax: 0.2 }); } catch (e) { expect(e).toBeInstanceOf(DesignRefusal); msg = (e as Error).message; }
    expect(msg).toMatch(/above what the model knows/);
    const stated = Number(/the target energy ([0-9.]+) J/.exec(msg)?.[1]);
    expect(Math.abs(stated / (1.5 * MGL) - 1)).toBeLessThan(0.01);
    expect(msg).toContain(`.. ${Number(model.coverage!.energyMax.toPrecision(4))} J`);
    expect(msg).toMatch(/record swings up to that level, or choose a lower target/);

    // 25 degrees lies inside: H* = m g l (1 - cos 25 deg) within 1%, the valid range is the recorded one.
    const d = designLevelHold(model, { target: { kind: 'amplitude', amplitude: 25 * deg }, uMax: 0.2 });
    expect(Math.abs(d.stages[0].target.energy / (MGL * (1 - Math.cos(25 * deg))) - 1)).toBeLessThan(0.01);
    expect(d.model.validRange.energyMax).toBe(model.coverage!.energyMax);
    expect(d.model.validRange.qMax).toBe(model.coverage!.qMax);
    expect(d.checks.find((x) => x.name === 'target in range')!.detail).toMatch(/the energies the recordings reached/);
  });
});
