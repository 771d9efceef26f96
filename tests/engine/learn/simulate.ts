// Test data: simulated position-only recordings with Gaussian noise and quantization.
import { rk4Fixed } from '../../../src-main/engine/ode/rk4.ts';
import type { Recording, Run } from '../../../src-main/engine/types.ts';

/** Small deterministic PRNG (mulberry32, public-domain construction) with Box–Muller normals. */
export function rng(seed: number) {
  let a = seed >>> 0;
  const uni = () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  return { uni, normal: () => Math.sqrt(-2 * Math.log(uni() + 1e-300)) * Math.cos(2 * Math.PI * uni()) };
}

export interface SimSpec {
  /** Acceleration f(q, v, t). */
  accel: (q: number, v: number, t: number) => number;
  inits: [number, number][];
  dt: number;
  seconds: number;
  /** Noise standard deviation as a fraction of the recording's position range. */
  noise: number;
  /** Quantization bits over the range. */
  bits: number;
  angle?: boolean;
  /** Wrap angles to [-pi, pi) as a DAQ would. */
  wrap?: boolean;
  seed?: number;
  input?: (t: number, run: number) => number;
  /** Input gain g in v' = f + g u (1/mass); default 1. */
  gain?: number;
}

export interface SimResult { recording: Recording; truth: { q: Float64Array; v: Float64Array }[]; range: number }

export function simulate(s: SimSpec): SimResult {
  const steps = Math.round(s.seconds / s.dt);
  const sub = 4;
  const truth = s.inits.map(([q0, v0], k) => {
    const r = rk4Fixed((t, y, d) => { d[0] = y[1]; d[1] = s.accel(y[0], y[1], t) + (s.input ? (s.gain ?? 1) * s.input(t, k) : 0); }, 0, [q0, v0], s.dt / sub, steps * sub);
    const q = new Float64Array(steps + 1), v = new Float64Array(steps + 1);
    for (let i = 0; i <= steps; i++) { q[i] = r.y[2 * i * sub]; v[i] = r.y[2 * i * sub + 1]; }
    return { q, v };
  });
  let lo = Infinity, hi = -Infinity;
  for (const t of truth) for (const x of t.q) { lo = Math.min(lo, x); hi = Math.max(hi, x); }
  const range = s.wrap ? 2 * Math.PI : hi - lo;
  const step = range / 2 ** s.bits;
  const g = rng(s.seed ?? 1);
  const runs: Run[] = truth.map((tr, k) => {
    const t = new Float64Array(steps + 1);
    const q = new Float64Array(steps + 1);
    for (let i = 0; i <= steps; i++) {
      t[i] = i * s.dt;
      let x = tr.q[i] + s.noise * range * g.normal();
      if (s.wrap) x = x - 2 * Math.PI * Math.floor((x + Math.PI) / (2 * Math.PI));
      q[i] = Math.round(x / step) * step;
    }
    const run: Run = { name: `sim run ${k + 1}`, source: '', t, q };
    if (s.input) run.u = Float64Array.from(t, (tt) => s.input!(tt, k));
    return run;
  });
  return { recording: { coordinate: s.angle ? 'angle' : 'linear', runs }, truth, range };
}

/** R^2 of the best affine fit f ~ a g + c over paired samples. */
export function affineR2(f: ArrayLike<number>, g: ArrayLike<number>): number {
  const n = f.length;
  let mf = 0, mg = 0;
  for (let i = 0; i < n; i++) { mf += f[i]; mg += g[i]; }
  mf /= n; mg /= n;
  let sfg = 0, sff = 0, sgg = 0;
  for (let i = 0; i < n; i++) { sfg += (f[i] - mf) * (g[i] - mg); sff += (f[i] - mf) ** 2; sgg += (g[i] - mg) ** 2; }
  return (sfg * sfg) / (sff * sgg);
}
