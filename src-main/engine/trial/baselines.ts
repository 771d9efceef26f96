// Runs the designed controller and the baselines of design.md §2 on one trial setup and scores all
// of them on the same metrics: LQR about the equilibrium (only when the target is one), the plain
// energy-pumping law with the same gain and limit, and open loop (u = 0). Every run gets the same
// initial state, sensor and noise sequence (a fresh random source from the same factory).
import type { Controller, TrialPlant } from './types.ts';
import { simulate, type SimulateOptions } from './simulate.ts';
import { trialMetrics, type MetricsOptions, type TrialMetrics } from './metrics.ts';
import { energyPump, openLoop } from './energy-pump.ts';
import { lqrBaseline } from './lqr-baseline.ts';
import type { UniformSource } from './gaussian.ts';

export interface BaselineSetup {
  /** Everything simulate needs except the controller and the random source. */
  sim: Omit<SimulateOptions, 'controller' | 'random'>;
  /** A fresh random source per run (same seed each time), for the sensor noise. */
  makeRandom?: () => UniformSource;
  metrics: MetricsOptions;
  /** The designed controller, scored first (optional). */
  controller?: { name: string; controller: Controller };
  /** Energy-pumping baseline: gain k (e.g. sqrt(Q/R)), limit, input gain, sign regularisation. */
  gain: number;
  uMax?: number;
  inputGain?: number;
  eps?: number;
  /** When the target is an equilibrium (well bottom), its position: adds the LQR baseline. */
  equilibrium?: number;
  /** The model the LQR is designed on (default: the simulated plant). */
  model?: TrialPlant;
}

export interface BaselineRow {
  name: string;
  status: 'ok' | 'diverged' | 'failed';
  message: string;
  metrics: TrialMetrics | null;
}

export function compareWithBaselines(setup: BaselineSetup): BaselineRow[] {
  const { sim, metrics } = setup;
  const rows: BaselineRow[] = [];
  const run = (name: string, controller: Controller) => {
    const r = simulate({ ...sim, controller, random: setup.makeRandom?.() });
    rows.push({ name, status: r.status, message: r.message, metrics: r.trace.t.length >= 2 ? trialMetrics(r.trace, metrics) : null });
  };
  if (setup.controller) run(setup.controller.name, setup.controller.controller);
  if (setup.equilibrium !== undefined) {
    const lqr = lqrBaseline({ model: setup.model ?? sim.plant, energy: sim.energy, equilibrium: setup.equilibrium, Q: metrics.Q, R: metrics.R, uMax: setup.uMax });
    if (lqr.controller) run('lqr', lqr.controller);
    else rows.push({ name: 'lqr', status: 'failed', message: lqr.message, metrics: null });
  }
  run('energy-pump', energyPump({ energy: sim.energy, target: metrics.target, gain: setup.gain, uMax: setup.uMax, inputGain: setup.inputGain, eps: setup.eps }));
  run('open-loop', openLoop());
  return rows;
}
