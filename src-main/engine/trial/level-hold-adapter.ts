// Adapter from the level-hold (SDRE energy) law of engine/control to the trial Controller
// interface: the law takes a state object and returns an output record; the simulator calls
// step(q, v, t, dt) -> u. One state object and one output record are reused (no allocation per sample).
import { makeLevelHold, type LevelHold, type LevelHoldDesign, type LevelHoldOutput } from '../control/index.ts';
import type { Controller } from './types.ts';

export interface LevelHoldController extends Controller {
  /** The wrapped law (its internal state and target). */
  readonly law: LevelHold;
  /** The law's last output (u, z, b, saturated, w, riccatiOk). */
  readonly last: LevelHoldOutput;
}

export function levelHoldController(design: LevelHoldDesign): LevelHoldController {
  const law = makeLevelHold(design);
  const state = { q: 0, v: 0, t: 0 };
  const last: LevelHoldOutput = { u: 0, z: 0, b: 0, saturated: false, w: 0, riccatiOk: true };
  return {
    law,
    last,
    reset() { law.reset(); },
    step(q, v, t, dt) {
      state.q = q; state.v = v; state.t = t;
      return law.step(state, dt, last).u;
    },
  };
}
