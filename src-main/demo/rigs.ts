// The demo rigs: two invented test stands, simulated with our own integrator and recorded
// through a simulated sensor (quantization and white noise) as their DAQs would write them.
// Deterministic (seeded), so the demo and the tests see the same data every time.
//
//  - "Larkspur lab pendulum": a rod pendulum on a 12-bit absolute encoder (angle wrapped to
//    [-pi, pi)), 200 Hz, five free swings (one starts fast enough to go over the top) and one
//    run driven by its torque motor; the DAQ logs the torque command on every run (0 when the
//    drive is disabled).
//  - "Tamsin bistable strip": a buckled steel strip clamped on a shaker table, tip displacement
//    from a laser triangulation sensor (14-bit over +-10 mm), 1 kHz; four free runs from both
//    wells and from above the barrier, and one run with the shaker's drive force.
// Everything about these rigs is invented for the demo.
import { solveDopri5 } from '../engine/ode/index.ts';
import { builtinPlant, type Plant, type PlantSpec } from '../engine/plant/index.ts';
import { Pcg32 } from '../engine/signal/index.ts';

export type DemoRig = 'pendulum' | 'strip';

export interface DemoFile {
  /** File name, e.g. "larkspur-pendulum-free.csv". */
  name: string;
  text: string;
}

export interface DemoRecording {
  rig: DemoRig;
  title: string;
  description: string;
  /** The plant the data was simulated from (for tests and for comparing what was learned). */
  plant: PlantSpec;
  /** Column mapping for the import. */
  mapping: { time: string; position: string; run: string; input: string; angle: boolean };
  /** One file: free runs (input 0) and a driven run, with a run column and the input channel. */
  file: DemoFile;
  /** Mass to pass to learning when the user knows it (kg), for the pendulum the bob mass. */
  mass: number;
}

interface Sensor {
  /** Quantization step of the sensor (rad or m). */
  step: number;
  /** White noise standard deviation (rad or m), before quantization. */
  noise: number;
  /** Wrap the reading to [-pi, pi) (absolute angle encoder). */
  wrap: boolean;
}

function simulate(plant: Plant, q0: number, v0: number, duration: number, rate: number, input?: (t: number) => number): { t: Float64Array; q: Float64Array } {
  const n = Math.round(duration * rate) + 1;
  const tEval = new Float64Array(n);
  for (let i = 0; i < n; i++) tEval[i] = i / rate;
  const rhs = plant.rhs(input ? (t) => input(t) : undefined);
  const r = solveDopri5(rhs, [0, tEval[n - 1]], [q0, v0], { rtol: 1e-10, atol: 1e-12, tEval, hMax: 2 / rate });
  if (r.status !== 'done') throw new Error(`demo simulation failed: ${r.message}`);
  const q = new Float64Array(n);
  for (let i = 0; i < n; i++) q[i] = r.y[2 * i];
  return { t: tEval, q };
}

function measure(q: Float64Array, s: Sensor, rng: Pcg32): Float64Array {
  const out = new Float64Array(q.length);
  for (let i = 0; i < q.length; i++) {
    let x = q[i] + s.noise * rng.normal();
    if (s.wrap) x = x - 2 * Math.PI * Math.floor((x + Math.PI) / (2 * Math.PI));
    out[i] = Math.round(x / s.step) * s.step;
  }
  return out;
}

function fmt(x: number, digits: number): string {
  const s = x.toFixed(digits);
  return s === `-${(0).toFixed(digits)}` ? (0).toFixed(digits) : s;
}

/** A smooth band-limited drive: a few incommensurate sines with a slow on/off envelope. */
function drive(amplitude: number, freqs: number[], duration: number): (t: number) => number {
  return (t) => {
    const env = Math.sin((Math.PI * Math.min(Math.max(t, 0), duration)) / duration) ** 2;
    let s = 0;
    freqs.forEach((f, k) => (s += Math.sin(2 * Math.PI * f * t + 1.7 * k)));
    return (amplitude * env * s) / freqs.length;
  };
}

function pendulumDemo(): DemoRecording {
  const plant = builtinPlant('pendulum', { m: 0.35, l: 0.42, g: 9.81, c: 0.06 });
  const rate = 200;
  const sensor: Sensor = { step: (2 * Math.PI) / 4096, noise: 0.0008, wrap: true };
  const rng = new Pcg32(20261201, 1);
  const starts: [number, number, number][] = [
    // q0 [rad], v0 [rad/s], duration [s]
    [0.5, 0, 40],
    [1.4, 0, 40],
    [-2.4, 0, 40],
    [0, 10.2, 40], // over the top: rotates a few turns, then settles into swinging
    [2.8, -0.5, 40],
  ];
  const lines = ['time,angle,torque,run'];
  starts.forEach(([q0, v0, dur], k) => {
    const { t, q } = simulate(plant, q0, v0, dur, rate);
    const m = measure(q, sensor, rng);
    for (let i = 0; i < t.length; i++) lines.push(`${fmt(t[i], 3)},${fmt(m[i], 6)},0,swing-${k + 1}`);
  });
  const torque = drive(0.12, [0.55, 0.83, 1.31], 40);
  const forcedRun = simulate(plant, 0.3, 0, 40, rate, torque);
  const fm = measure(forcedRun.q, sensor, rng);
  for (let i = 0; i < fm.length; i++) lines.push(`${fmt(forcedRun.t[i], 3)},${fmt(fm[i], 6)},${fmt(torque(forcedRun.t[i]), 6)},driven-1`);
  return {
    rig: 'pendulum',
    title: 'Larkspur lab pendulum',
    description: 'Rod pendulum (0.35 kg, 0.42 m) on a 12-bit absolute encoder, 200 Hz; five free swings and one torque-driven run.',
    plant: plant.spec as PlantSpec,
    mapping: { time: 'time', position: 'angle', run: 'run', input: 'torque', angle: true },
    file: { name: 'larkspur-pendulum.csv', text: lines.join('\n') + '\n' },
    mass: 0.35,
  };
}

function stripDemo(): DemoRecording {
  // Double well per unit mass: wells at +-sqrt(a/b) = +-4 mm, in-well frequency sqrt(2a)/(2 pi) = 6 Hz.
  const wIn = 2 * Math.PI * 6;
  const a = (wIn * wIn) / 2;
  const b = a / (0.004 * 0.004);
  const plant = builtinPlant('double-well', { m: 0.02, a, b, c: 0.5 });
  const rate = 1000;
  const sensor: Sensor = { step: 0.02 / 16384, noise: 8e-6, wrap: false };
  const rng = new Pcg32(20261201, 2);
  const starts: [number, number, number][] = [
    [-0.0052, 0, 12],
    [0.0031, 0, 12],
    [-0.0075, 0, 16], // above the barrier: snaps through a few times, then settles in one well
    [0.0069, 0.05, 16],
  ];
  const lines = ['time,tip_displacement,drive_force,run'];
  starts.forEach(([q0, v0, dur], k) => {
    const { t, q } = simulate(plant, q0, v0, dur, rate);
    const m = measure(q, sensor, rng);
    for (let i = 0; i < t.length; i++) lines.push(`${fmt(t[i], 4)},${fmt(m[i], 8)},0,free-${k + 1}`);
  });
  const force = drive(0.6, [4.7, 5.9, 7.3], 16);
  const forcedRun = simulate(plant, 0.004, 0, 16, rate, force);
  const fm = measure(forcedRun.q, sensor, rng);
  for (let i = 0; i < fm.length; i++) lines.push(`${fmt(forcedRun.t[i], 4)},${fmt(fm[i], 8)},${fmt(force(forcedRun.t[i]), 6)},driven-1`);
  return {
    rig: 'strip',
    title: 'Tamsin bistable strip',
    description: 'Buckled steel strip (0.02 kg effective) on a shaker table, laser tip displacement (14-bit, +-10 mm), 1 kHz; four free runs and one driven run.',
    plant: plant.spec as PlantSpec,
    mapping: { time: 'time', position: 'tip_displacement', run: 'run', input: 'drive_force', angle: false },
    file: { name: 'tamsin-strip.csv', text: lines.join('\n') + '\n' },
    mass: 0.02,
  };
}

export function demoRecording(rig: DemoRig): DemoRecording {
  if (rig === 'pendulum') return pendulumDemo();
  if (rig === 'strip') return stripDemo();
  throw new RangeError(`demo rig: expected "pendulum" or "strip", got ${JSON.stringify(rig)}`);
}
