// CARE and level-hold throughput: microseconds per 2x2 CARE solve (allocation-free fast path vs
// the general ml-matrix solver, on the integral-action SDRE matrices with varying b), and
// closed-loop steps per second (one controller sample + one RK4 step of the pendulum) for the
// plain scalar law and for the 2x2 integral law. Prints JSON lines {"name", "value", "unit"}.
import { care2, care2Work, CARE2_OK } from '../src-main/engine/control/care2.ts';
import { solveCare } from '../src-main/engine/control/care.ts';
import { makeLevelHold, type LevelHoldDesign, type LevelHoldOutput } from '../src-main/engine/control/level-hold.ts';
import { rk4Step, rk4Work } from '../src-main/engine/ode/rk4.ts';
import type { EnergyFunction } from '../src-main/engine/types.ts';

function emit(name: string, value: number, unit: string, extra: Record<string, unknown> = {}): void {
  console.log(JSON.stringify({ name, value: Number(value.toPrecision(4)), unit, ...extra }));
}

function timeIt(fn: () => void, minMs = 300): { ms: number; runs: number } {
  fn(); // warm-up
  let runs = 0;
  const t0 = performance.now();
  let t = t0;
  while (t - t0 < minMs) { fn(); runs++; t = performance.now(); }
  return { ms: (t - t0) / runs, runs };
}

// --- 2x2 CARE: A = [[lambda, 0], [1, 0]], G = diag(b^2/R, 0), Q = diag(Qz, Qw) ---------------
const lambda = -0.05, Qz = 1, Qw = 0.5, R = 0.7;
const bs = Float64Array.from({ length: 1000 }, (_, i) => 0.05 + 3 * ((i * 0.618034) % 1));
const w = care2Work();
const x = new Float64Array(3);
const a = new Float64Array([lambda, 0, 1, 0]), g = new Float64Array(3), q = new Float64Array([Qz, 0, Qw]);
let sink = 0;
const fast = timeIt(() => {
  for (let i = 0; i < bs.length; i++) {
    g[0] = (bs[i] * bs[i]) / R;
    if (care2(a, g, q, x, w) !== CARE2_OK) throw new Error('care2 failed in the benchmark');
    sink += x[0];
  }
});
const fastUs = (fast.ms * 1000) / bs.length;
const general = timeIt(() => {
  for (let i = 0; i < 50; i++) {
    const r = solveCare({ A: [[lambda, 0], [1, 0]], B: [[bs[i]], [0]], Q: [[Qz, 0], [0, Qw]], R: [[R]] });
    if (r.status !== 'ok') throw new Error('solveCare failed in the benchmark');
    sink += r.X![0][0];
  }
});
const generalUs = (general.ms * 1000) / 50;
emit('care2x2.fast', fastUs, 'us/solve', { goal: 20 });
emit('care2x2.general', generalUs, 'us/solve');
emit('care2x2.speedup', generalUs / fastUs, 'x');

// --- closed loop: pendulum + level-hold law, one sample = one RK4 step (h = 1 ms) -----------
const W02 = 9.81 / 0.42;
const energy: EnergyFunction = {
  coordinate: 'angle', lambda: 0,
  H: (qq, v) => 0.5 * v * v + W02 * (1 - Math.cos(qq)),
  grad: (qq, v, out) => { out[0] = W02 * Math.sin(qq); out[1] = v; },
};

function closedLoop(design: LevelHoldDesign, steps: number): number {
  const ctl = makeLevelHold(design);
  const h = 1e-3;
  const y = new Float64Array([0.05, 0]);
  const ws = rk4Work(2);
  const state = { q: 0, v: 0, t: 0 };
  const out: LevelHoldOutput = { u: 0, z: 0, b: 0, saturated: false, w: 0, riccatiOk: true };
  let u = 0;
  const rhs = (_t: number, s: Float64Array, d: Float64Array): void => { d[0] = s[1]; d[1] = -W02 * Math.sin(s[0]) - 0.02 * s[1] + u; };
  const t0 = performance.now();
  for (let k = 0; k < steps; k++) {
    state.q = y[0]; state.v = y[1]; state.t = k * h;
    u = ctl.step(state, h, out).u;
    rk4Step(rhs, k * h, y, h, y, ws);
  }
  const ms = performance.now() - t0;
  sink += y[0];
  return steps / (ms / 1000);
}
const base: LevelHoldDesign = { energy, inputGain: 1, target: 10, Q: 1, R: 1, eps: 0.05, uMax: 3, rateMax: 500 };
closedLoop(base, 200_000); // warm-up
emit('levelhold.scalar+rk4', closedLoop(base, 2_000_000), 'steps/s', { goal: 2e6 });
const integral: LevelHoldDesign = { ...base, integral: { Qw: 1 } };
closedLoop(integral, 20_000);
emit('levelhold.integral2x2+rk4', closedLoop(integral, 300_000), 'steps/s');
if (!Number.isFinite(sink)) console.error('non-finite benchmark result');
