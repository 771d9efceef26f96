// Test designs for the exports. The pendulum comes from tests/design/fixtures.ts; the Duffing
// double well H = v^2/2 - a q^2/2 + b q^4/4 (m = 1; references.md "Duffing double well": wells
// at +-sqrt(a/b), well-bottom energy -a^2/(4b), barrier energy 0 at q = 0) is written here.
import { DESIGN_FORMAT, DESIGN_VERSION, type ControllerDesign } from '../../src-main/design/types.ts';
import { pendulumDesign } from '../design/fixtures.ts';

export { pendulumDesign };
export const DA = 1, DB = 1, DC = 0.02;

/** Duffing energy written by hand (not through the formula parser). */
export const duffingH = (q: number, v: number): number => 0.5 * v * v - (DA / 2) * q * q + (DB / 4) * q ** 4;

export function duffingDesign(overrides: Partial<ControllerDesign> = {}): ControllerDesign {
  return {
    format: DESIGN_FORMAT,
    version: DESIGN_VERSION,
    kind: 'level-hold',
    app: 'test',
    source: 'tests/export/fixtures.ts (Duffing double well)',
    model: {
      coordinate: 'linear',
      energy: `0.5*v^2 - ${DA / 2}*q^2 + ${DB / 4}*q^4`,
      units: 'J/kg',
      lambda: -0.02,
      acceleration: `${DA}*q - ${DB}*q^3 - ${DC}*v + u`,
      validRange: { qMin: -1.6, qMax: 1.6, energyMin: -0.25, energyMax: 0.6 },
      wells: [{ index: 1, q: -1, energy: -0.25 }, { index: 2, q: 1, energy: -0.25 }],
      barriers: [{ q: 0, energy: 0, between: [1, 2] }],
    },
    input: { gain: 1, unit: 'N' },
    law: { Q: 4, R: 1, eps: 0.02, lambda: -0.02, uMax: 0.3, rateMax: 20, integral: null, lossCompensation: true },
    sampleRateHz: 500,
    delaySamples: 0,
    stages: [{ index: 1, name: 'hold', target: { kind: 'energy', energy: -0.1 }, meanB2: 0.2 }],
    transitions: [],
    initialStage: 1,
    cautions: ['test caution'],
    checks: [],
    ...overrides,
  };
}

/** Two-stage hop from well 2 (q = 1) to well 1 (q = -1): raise over the barrier, switch past it heading left, settle. */
export function duffingHop(): ControllerDesign {
  return duffingDesign({
    kind: 'well-hop',
    stages: [
      { index: 1, name: 'raise', target: { kind: 'energy', energy: 0.08 }, meanB2: null },
      { index: 2, name: 'settle', target: { kind: 'at-rest', well: 1, energy: -0.2 }, meanB2: 0.05 },
    ],
    transitions: [{ from: 1, to: 2, when: { qBelow: -0.3, vSign: -1 }, reason: 'past the barrier at q = 0, heading into well 1' }],
    law: { Q: 4, R: 1, eps: 0.02, lambda: -0.02, uMax: 0.25, rateMax: 5, integral: null, lossCompensation: true },
  });
}
