// Shared test designs: a pendulum of mass m = 0.5 kg on l = 0.42 m (docs/plant-format.md's
// built-in pendulum), H = m l^2 v^2 / 2 + m g l (1 - cos q) in joules (elementary mechanics:
// kinetic plus potential energy, zero at the bottom), torque input with gain g = 1 / (m l^2).
import { DESIGN_FORMAT, DESIGN_VERSION, type ControllerDesign } from '../../src-main/design/types.ts';

export const M = 0.5, L = 0.42, G = 9.81;
export const I = M * L * L;
export const MGL = M * G * L;

export function pendulumDesign(overrides: Partial<ControllerDesign> = {}): ControllerDesign {
  return {
    format: DESIGN_FORMAT,
    version: DESIGN_VERSION,
    kind: 'level-hold',
    app: 'test',
    source: 'tests/design/fixtures.ts',
    model: {
      coordinate: 'angle',
      energy: `${I / 2}*v^2 + ${MGL}*(1 - cos(q))`,
      units: 'J',
      lambda: -0.05,
      acceleration: `-${G / L}*sin(q) - 0.05*v + u/${I}`,
      validRange: { qMin: -Math.PI, qMax: Math.PI, energyMin: 0, energyMax: 2 * MGL },
      wells: [{ index: 1, q: 0, energy: 0 }],
      barriers: [{ q: -Math.PI, energy: 2 * MGL, between: [1, 1] }],
    },
    input: { gain: 1 / I, unit: 'N m' },
    law: { Q: 1, R: 1, eps: 0.01, lambda: -0.05, uMax: 0.5, rateMax: 50, integral: null, lossCompensation: true },
    sampleRateHz: 1000,
    delaySamples: 0,
    stages: [{ index: 1, name: 'hold', target: { kind: 'energy', energy: 0.5 }, meanB2: 40 }],
    transitions: [],
    initialStage: 1,
    cautions: ['test caution'],
    checks: [],
    ...overrides,
  };
}
