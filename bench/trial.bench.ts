// Closed-loop trial throughput and Monte Carlo wall time (issue 4, "Performance").
// 1. simulate(): RK4 steps per second of the pendulum under the level-hold law, scalar (plain)
//    and 2x2 integral (one CARE per controller sample), 1 kHz controller, 2 RK4 steps per sample,
//    12-bit encoder with noise, filtered-difference velocity; plant and energy written as closures.
//    Also the same scalar trial built from a plain-data spec (formula-compiled plant and energy).
// 2. Monte Carlo: trials of 60 s at 1 kHz with +-15% mismatch, on 1 and on 2 workers. The full
//    1000 trials take too long here, so a stated number of runs (argv[2], default 300; 0 skips) is timed and
//    the wall time extrapolated linearly to 1000 (worker start-up included once, so the
//    extrapolation slightly overstates it). Prints JSON lines {"name", "value", "unit", ...}.
import { simulate } from '../src-main/engine/trial/simulate.ts';
import { levelHoldController } from '../src-main/engine/trial/level-hold-adapter.ts';
import { runTrialSpec, type TrialSpec } from '../src-main/engine/trial/trial-spec.ts';
import { runMonteCarlo } from '../src-main/trial-workers/index.ts';
import { meanSquareInputGain } from '../src-main/engine/control/index.ts';
import { Pcg32 } from '../src-main/engine/signal/random.ts';
import type { EnergyFunction } from '../src-main/engine/types.ts';
import type { TrialPlant } from '../src-main/engine/trial/types.ts';
import { availableParallelism, loadavg } from 'node:os';
import { readFileSync } from 'node:fs';

function emit(name: string, value: number, unit: string, extra: Record<string, unknown> = {}): void {
  console.log(JSON.stringify({ name, value: Number(value.toPrecision(4)), unit, ...extra }));
}

/** CPU seconds (user + system, all threads of the process) since c0: on a shared machine this is what a core delivered. */
function cpuSeconds(c0: NodeJS.CpuUsage): number {
  const d = process.cpuUsage(c0);
  return (d.user + d.system) / 1e6;
}

const m = 0.5, l = 0.42, c = 0.0967, J = m * l * l;
const target = m * 9.81 * l * 1.5; // 120-degree swing
const plant: TrialPlant = { coordinate: 'angle', accel: (q, v, u) => -(9.81 / l) * Math.sin(q) - c * v + u / J };
const H: EnergyFunction = {
  coordinate: 'angle', lambda: -c,
  H: (q, v) => 0.5 * J * v * v + m * 9.81 * l * (1 - Math.cos(q)),
  grad: (q, v, o) => { o[0] = m * 9.81 * l * Math.sin(q); o[1] = J * v; },
};
const meanB2 = meanSquareInputGain({ energy: H, accel: (q) => -(9.81 / l) * Math.sin(q), inputGain: 1 / J, level: target, q0: 0 }).meanB2;
const design = { energy: H, inputGain: 1 / J, target, Q: (20 / target) ** 2, R: 1, eps: 0.2, uMax: 1, meanB2 };

function stepsPerSecond(name: string, makeController: () => ReturnType<typeof levelHoldController>): void {
  const run = () => {
    const rng = new Pcg32(1, 1);
    return simulate({ plant, energy: H, controller: makeController(), q0: 0.05, v0: 0, duration: 20, rateHz: 1000, sensor: { bits: 12, noiseStd: 5e-4 }, random: () => rng.uniform() });
  };
  run(); run(); // warm-up (JIT)
  let steps = 0, samples = 0;
  const t0 = performance.now();
  const c0 = process.cpuUsage();
  for (let i = 0; i < 8; i++) { const r = run(); steps += r.diagnostics.rk4Steps; samples += r.diagnostics.controllerSteps; }
  const s = (performance.now() - t0) / 1000;
  const cpu = cpuSeconds(c0);
  emit(`${name} rk4 steps per second`, steps / s, 'steps/s', { perCpuSecond: Math.round(steps / cpu), controllerSamplesPerSecond: Math.round(samples / s), innerSteps: 2 });
}

let autogroup = 'unknown';
try { autogroup = readFileSync('/proc/sys/kernel/sched_autogroup_enabled', 'utf8').trim(); } catch { /* not Linux */ }
// With autogroup scheduling on a loaded machine, all threads of this session share one CPU share:
// a second worker then gains little wall time, and the speed-up below says nothing about idle cores.
console.error(`trial bench: ${availableParallelism()} cores, load average ${loadavg().map((x) => x.toFixed(1)).join(' ')}, sched_autogroup_enabled=${autogroup} (shared machine: timings are indicative)`);
stepsPerSecond('closed loop, scalar level-hold law', () => levelHoldController(design));
stepsPerSecond('closed loop, 2x2 integral level-hold law (CARE per sample)', () => levelHoldController({ ...design, integral: { Qw: 100 } }));

const energySpec = { H: '0.5*m*l^2*v^2 + m*9.81*l*(1 - cos(q))', params: { m, l }, lambda: -c };
const spec = (duration: number): TrialSpec => ({
  plant: { coordinate: 'angle', acceleration: '-(9.81/l)*sin(q) - c*v + u/(m*l^2)', params: { l, m, c } },
  energy: energySpec,
  controller: { kind: 'level-hold', target, inputGain: 1 / J, Q: (20 / target) ** 2, R: 1, eps: 0.2, uMax: 1, meanB2 },
  q0: 0.05, v0: 0, duration, rateHz: 1000, sensor: { bits: 12, noiseStd: 5e-4 }, metrics: { target },
});
{
  runTrialSpec(spec(20)); runTrialSpec(spec(20));
  const t0 = performance.now();
  const c0 = process.cpuUsage();
  let steps = 0;
  for (let i = 0; i < 8; i++) steps += runTrialSpec(spec(20)).result.diagnostics.rk4Steps;
  emit('closed loop from a plain-data spec (formula-compiled plant and energy), scalar law', steps / ((performance.now() - t0) / 1000), 'steps/s', { perCpuSecond: Math.round(steps / cpuSeconds(c0)) });
}

// 300 runs amortise the two workers' start-up (the tsx loader costs about a second of CPU each);
// with 40 the start-up dominated and the speed-up read below 1. A numeric argv[2] overrides
// (run-all passes its name filter there, which is not a number).
const runs = /^\d+$/.test(process.argv[2] ?? '') ? Number(process.argv[2]) : 300;
if (!Number.isInteger(runs) || (runs < 2 && runs !== 0)) throw new RangeError(`trial.bench: runs (argv[2]) must be 0 (skip the Monte Carlo part) or an integer >= 2, got ${process.argv[2]}`);
const wall: Record<number, number> = {};
for (const workers of runs > 0 ? [1, 2] : []) {
  const t0 = performance.now();
  const c0 = process.cpuUsage();
  const r = await runMonteCarlo({ trial: spec(60), runs, mismatch: 0.15, seed: 2026 }, { workers });
  const ms = performance.now() - t0;
  wall[workers] = ms;
  emit(`Monte Carlo ${runs} x 60 s at 1 kHz, ${workers} worker${workers > 1 ? 's' : ''}`, ms / 1000, 's', { cpuSeconds: Number(cpuSeconds(c0).toFixed(2)), convergedShare: r.convergedShare, status: r.status, loadAverage: loadavg()[0] });
  emit(`Monte Carlo 1000 x 60 s at 1 kHz, ${workers} worker${workers > 1 ? 's' : ''} (extrapolated from ${runs} runs)`, ((ms / runs) * 1000) / 1000, 's', { extrapolated: true });
}
if (runs > 0) emit('Monte Carlo speed-up, 2 workers vs 1', wall[1] / wall[2], 'x', { goal: 1.8, loadAverage: loadavg()[0] });
