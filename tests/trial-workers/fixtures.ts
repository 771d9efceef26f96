// A pendulum trial described as plain data, shared by the Monte Carlo tests: m = 0.5 kg,
// l = 0.42 m (references.md §5), viscous damping c = 0.0967 1/s (zeta = 0.01), pumped from 3 degrees
// to a 120-degree swing by the level-hold law with loss compensation; 12-bit encoder with noise.
import type { TrialSpec } from '../../src-main/engine/trial/trial-spec.ts';
import { meanSquareInputGain } from '../../src-main/engine/control/index.ts';
import { compileEnergySpec } from '../../src-main/engine/trial/trial-spec.ts';

export const m = 0.5, l = 0.42, c = 0.0967;
export const J = m * l * l;
export const target = m * 9.81 * l * (1 - Math.cos((120 * Math.PI) / 180));

const energy = { H: '0.5*m*l^2*v^2 + m*9.81*l*(1 - cos(q))', params: { m, l }, lambda: -c };
const orbit = meanSquareInputGain({
  energy: compileEnergySpec(energy, 'angle'), accel: (q) => -(9.81 / l) * Math.sin(q), inputGain: 1 / J, level: target, q0: 0,
});
if (orbit.status !== 'ok') throw new Error(`fixture: <b^2> failed: ${orbit.message}`);

export function pendulumTrial(duration: number, rateHz: number): TrialSpec {
  return {
    // Gravity is a constant of the formula, not a rig parameter: mismatch scales l, m and c.
    plant: { coordinate: 'angle', acceleration: '-(9.81/l)*sin(q) - c*v + u/(m*l^2)', params: { l, m, c } },
    energy,
    controller: { kind: 'level-hold', target, inputGain: 1 / J, Q: (20 / target) ** 2, R: 1, eps: 0.2, uMax: 1, meanB2: orbit.meanB2 },
    q0: (3 * Math.PI) / 180, v0: 0, duration, rateHz,
    sensor: { bits: 12, noiseStd: 5e-4 },
    metrics: { target },
  };
}
