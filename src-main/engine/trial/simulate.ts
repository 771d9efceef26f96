// Sampled-data closed-loop simulation: the plant q'' = accel(q, v, u, t) integrated by classic RK4
// (Hairer, Nørsett & Wanner, "Solving ODEs I", §II.1, Table 1.2) at an inner step h = T / innerSteps
// (T the controller period; default 2 inner steps, h = T/2), with u held constant over each period
// (zero-order hold; Franklin, Powell & Workman, "Digital Control of Dynamic Systems", §4.3).
// Per period k (t_k = t0 + k T): read the sensor, update the velocity estimate, run the controller,
// push its output through a delay line of `delaySamples` whole periods (zero before it fills),
// then integrate the plant over [t_k, t_k + T] with the delayed input.
// The RK4 step is written out for the two-state system (q, v) rather than calling ode/rk4.ts:
// same formula, no closure or array traffic in the innermost loop.
import { rk4HeldStep } from '../ode/rk4-held.ts';
import type { EnergyFunction } from '../types.ts';
import type { Controller, EstimatorOptions, SensorOptions, Trace, TrialPlant } from './types.ts';
import { makeSensor } from './sensor.ts';
import { makeVelocityEstimator } from './velocity-estimator.ts';
import type { UniformSource } from './gaussian.ts';

export interface SimulateOptions {
  plant: TrialPlant;
  /** The model's energy: recorded in the trace (H column) and used by the metrics. */
  energy: EnergyFunction;
  controller: Controller;
  q0: number;
  v0: number;
  /** Simulated time in seconds; the trace has round(duration * rateHz) rows. */
  duration: number;
  /** Controller sample rate, Hz. Default 1000. */
  rateHz?: number;
  /** RK4 steps per controller period. Default 2. */
  innerSteps?: number;
  /** Delay of the controller output in whole controller periods. Default 0. */
  delaySamples?: number;
  /** Position sensor. Default: no quantization, no noise (still wrapped for angles). */
  sensor?: SensorOptions;
  /** Velocity estimation. Default { kind: 'difference' } (10 Hz low-pass). */
  estimator?: EstimatorOptions;
  /** Uniform [0, 1) source for the sensor noise; required when sensor.noiseStd > 0. */
  random?: UniformSource;
  /** Record every k-th controller period. Default 1. */
  decimation?: number;
  /** Start time. Default 0. */
  t0?: number;
}

export interface SimulateResult {
  status: 'ok' | 'diverged';
  message: string;
  trace: Trace;
  /** Final true state. */
  final: { t: number; q: number; v: number };
  diagnostics: {
    controllerSteps: number;
    rk4Steps: number;
    /** Inner RK4 step, s. */
    h: number;
    /** Controller period, s. */
    T: number;
    /** Quantization step of the sensor (0 = none). */
    sensorStep: number;
    /** Largest |u| applied. */
    peakU: number;
  };
}

function checkFinite(name: string, x: unknown): number {
  if (typeof x !== 'number' || !Number.isFinite(x)) throw new RangeError(`simulate: ${name} must be a finite number, got ${String(x)}`);
  return x;
}

function checkInt(name: string, x: unknown, min: number): number {
  if (typeof x !== 'number' || !Number.isInteger(x) || x < min) throw new RangeError(`simulate: ${name} must be an integer >= ${min}, got ${String(x)}`);
  return x;
}

export function simulate(options: SimulateOptions): SimulateResult {
  const { plant, energy, controller } = options;
  if (!plant || typeof plant.accel !== 'function') throw new TypeError('simulate: plant must have accel(q, v, u, t)');
  if (!energy || typeof energy.H !== 'function') throw new TypeError('simulate: energy must be an EnergyFunction with H(q, v)');
  if (!controller || typeof controller.step !== 'function' || typeof controller.reset !== 'function') throw new TypeError('simulate: controller must have reset() and step(q, v, t, dt)');
  const q0 = checkFinite('q0', options.q0);
  const v0 = checkFinite('v0', options.v0);
  const duration = checkFinite('duration', options.duration);
  if (duration <= 0) throw new RangeError(`simulate: duration must be > 0 s, got ${duration}`);
  const rate = checkFinite('rateHz', options.rateHz ?? 1000);
  if (rate <= 0) throw new RangeError(`simulate: rateHz must be > 0, got ${rate}`);
  const inner = checkInt('innerSteps', options.innerSteps ?? 2, 1);
  const delay = checkInt('delaySamples', options.delaySamples ?? 0, 0);
  const dec = checkInt('decimation', options.decimation ?? 1, 1);
  const t0 = checkFinite('t0', options.t0 ?? 0);
  const T = 1 / rate;
  const h = T / inner;
  const n = Math.round(duration * rate);
  if (n < 1) throw new RangeError(`simulate: duration ${duration} s is shorter than one controller period (${T} s)`);

  const estOpt: EstimatorOptions = options.estimator ?? { kind: 'difference' };
  const ideal = estOpt.kind === 'ideal';
  const sensor = makeSensor(options.sensor ?? {}, plant.coordinate, options.random);
  const est = ideal ? null : makeVelocityEstimator(estOpt, T, plant.coordinate);
  const hasStage = typeof controller.stage === 'function';

  const rows = Math.floor((n - 1) / dec) + 1;
  const tr: Trace = {
    t: new Float64Array(rows), q: new Float64Array(rows), v: new Float64Array(rows),
    u: new Float64Array(rows), H: new Float64Array(rows),
  };
  if (hasStage) tr.stage = new Float64Array(rows);

  const qv = new Float64Array(2);

  const line = new Float64Array(delay + 1); // delay line, ring buffer
  let head = 0;
  let q = q0, v = v0, t = t0;
  let uPrev = 0;
  let peakU = 0;
  let row = 0;
  let status: SimulateResult['status'] = 'ok';
  let message = 'completed';
  let k = 0;
  const acc = (qq: number, vv: number, uu: number, tt: number) => plant.accel(qq, vv, uu, tt);
  controller.reset();
  for (; k < n; k++) {
    t = t0 + k * T;
    // Sensor and estimator: the controller sees the reading and the estimated velocity.
    let qc: number, vc: number;
    if (ideal) {
      qc = q; vc = v;
    } else {
      const y = sensor.measure(q);
      if (k === 0) est!.reset(y); else est!.update(y, uPrev, t);
      qc = est!.q; vc = est!.v;
    }
    const cmd = controller.step(qc, vc, t, T);
    if (!Number.isFinite(cmd)) {
      status = 'diverged';
      message = `controller returned a non-finite u (${cmd}) at t = ${t} s`;
      break;
    }
    line[head] = cmd;
    head = head === delay ? 0 : head + 1;
    const u = delay === 0 ? cmd : line[head]; // oldest entry = command from k - delay (0 before the line fills)
    if (Math.abs(u) > peakU) peakU = Math.abs(u);
    if (k % dec === 0) {
      tr.t[row] = t; tr.q[row] = q; tr.v[row] = v; tr.u[row] = u; tr.H[row] = energy.H(q, v);
      if (tr.stage) tr.stage[row] = controller.stage!();
      row++;
    }
    // Plant over one controller period with u held: `inner` RK4 steps.
    for (let j = 0; j < inner; j++) {
      rk4HeldStep(acc, q, v, u, t + j * h, h, qv);
      q = qv[0];
      v = qv[1];
    }
    uPrev = u;
    if (!Number.isFinite(q) || !Number.isFinite(v)) {
      status = 'diverged';
      message = `the plant state became non-finite in the period starting at t = ${t} s`;
      k++;
      break;
    }
  }
  const trace = row === rows ? tr : truncate(tr, row);
  return {
    status,
    message,
    trace,
    final: { t: t0 + k * T, q, v },
    diagnostics: { controllerSteps: k, rk4Steps: k * inner, h, T, sensorStep: sensor.step, peakU },
  };
}

function truncate(tr: Trace, rows: number): Trace {
  const out: Trace = { t: tr.t.slice(0, rows), q: tr.q.slice(0, rows), v: tr.v.slice(0, rows), u: tr.u.slice(0, rows), H: tr.H.slice(0, rows) };
  if (tr.stage) out.stage = tr.stage.slice(0, rows);
  return out;
}
