import { describe, expect, it } from 'vitest';
import { rk4Fixed } from '../../../src-main/engine/ode/rk4.ts';
import { compileFormula, differentiate, parseFormula } from '../../../src-main/engine/formula/index.ts';
import { BUILTIN_PLANT_NAMES, builtinPlant, type Plant } from '../../../src-main/engine/plant/index.ts';

/** d(q'')/dq as a function of (q, v), by symbolic differentiation of the plant's own formula. */
function stiffness(p: Plant): (q: number, v: number) => number {
  const d = compileFormula(differentiate(parseFormula(p.spec.acceleration), 'q'), ['q', 'v', 'u', 't'], { constants: p.params });
  const x = new Float64Array(4);
  return (q, v) => { x[0] = q; x[1] = v; return d.eval(x); };
}

/** Largest deviation of H from H(0) along an RK4 run, and the tolerance for it (see below). */
function energyDrift(p: Plant, y0: number[], h: number, T: number): { drift: number; tol: number } {
  const steps = Math.round(T / h);
  const r = rk4Fixed(p.rhs(), 0, y0, h, steps);
  const H = p.energy!;
  const k = stiffness(p);
  const H0 = H(r.y[0], r.y[1]);
  let drift = 0, omega = 0, kinetic = 0;
  for (let i = 0; i <= steps; i++) {
    const q = r.y[2 * i], v = r.y[2 * i + 1];
    drift = Math.max(drift, Math.abs(H(q, v) - H0));
    omega = Math.max(omega, Math.sqrt(Math.abs(k(q, v))));
    kinetic = Math.max(kinetic, H(q, v) - H(q, 0));
  }
  // Tolerance from the step: one RK4 step on y' = z y multiplies y by R(z) = 1 + z + z^2/2 +
  // z^3/6 + z^4/24 (direct computation from the method's tableau, rk4.ts), and expanding gives
  // |R(i w h)|^2 = 1 - (w h)^6/72 + (w h)^8/576, so on a linear oscillator the energy drifts by E (w h)^5 (w T)/72 over a
  // time T. We use w = the largest linearised frequency sqrt|dq''/dq| met on the orbit, E the
  // largest kinetic energy, and a factor 4 for the nonlinearity (measured ratio drift/estimate:
  // 0.15 to 0.54 for these orbits).
  const tol = (4 * kinetic * Math.pow(omega * h, 5) * omega * T) / 72;
  return { drift, tol };
}

const START: Record<string, number[]> = {
  pendulum: [2.5, 0], // a large swing (143 degrees)
  duffing: [1.5, 0.5],
  'double-well': [0.3, 1.2], // over the barrier: visits both wells
  quartic: [1.2, 0],
};

describe('built-in plants', () => {
  it.each(BUILTIN_PLANT_NAMES)('%s without damping conserves its energy along RK4 to the step-derived tolerance', (name) => {
    const p = builtinPlant(name, { c: 0 });
    const coarse = energyDrift(p, START[name], 0.02, 20);
    const fine = energyDrift(p, START[name], 0.01, 20);
    expect(coarse.drift).toBeLessThan(coarse.tol);
    expect(fine.drift).toBeLessThan(fine.tol);
    // The drift is truncation error of RK4, not a mismatch between accel and energy: halving the
    // step divides it by 2^4..2^6 (a wrong energy formula would leave an O(1) drift).
    const ratio = coarse.drift / fine.drift;
    expect(ratio).toBeGreaterThan(16);
    expect(ratio).toBeLessThan(64);
  });

  it.each(BUILTIN_PLANT_NAMES)('%s with damping and input obeys the work-energy balance dH/dt = (u - c M v) v', (name) => {
    // Elementary mechanics (common practice): the power of the input and of the viscous force
    // changes the energy; M = m for the linear plants, m l^2 for the pendulum.
    const p = builtinPlant(name, { c: 0.3 });
    const M = name === 'pendulum' ? p.params.m * p.params.l ** 2 : p.params.m;
    const u = (t: number): number => 0.2 * Math.sin(1.7 * t);
    const h = 0.002, steps = 2000; // Simpson needs an even number of intervals
    const r = rk4Fixed(p.rhs((t) => u(t)), 0, START[name], h, steps);
    let work = 0;
    for (let i = 0; i <= steps; i++) {
      const v = r.y[2 * i + 1];
      const power = (u(r.t[i]) - p.params.c * M * v) * v;
      work += power * (i === 0 || i === steps ? 1 : i % 2 ? 4 : 2); // composite Simpson's rule (common practice)
    }
    work *= h / 3;
    const dH = p.energy!(r.y[2 * steps], r.y[2 * steps + 1]) - p.energy!(r.y[0], r.y[1]);
    expect(Math.abs(dH - work)).toBeLessThan(1e-8 * Math.max(1, Math.abs(dH)));
    expect(p.controlAffine).toBe(true);
    expect(p.inputGain(0.3, 0.1, 0, 0)).toBeCloseTo(1 / M, 14);
  });

  it('pendulum: the linearisation gives w0^2 = g/l (references.md §5: 23.357142857143 for l = 0.42, g = 9.81)', () => {
    const p = builtinPlant('pendulum', { c: 0, l: 0.42, g: 9.81 });
    expect(-stiffness(p)(0, 0)).toBeCloseTo(23.357142857143, 9);
  });

  it('pendulum: the period at 90 degrees amplitude is 1.180340599016 T0 (references.md §1, confirmed)', () => {
    const p = builtinPlant('pendulum', { c: 0, l: 0.42, g: 9.81 });
    const T0 = 1.300079798140; // references.md §5
    const h = 1e-3;
    const r = rk4Fixed(p.rhs(), 0, [Math.PI / 2, 0], h, 600);
    let k = 1;
    while (r.y[2 * k] > 0) k++;
    // First zero crossing of q (a quarter period): root of the cubic Hermite interpolant through
    // (q, v) at both ends of the step (common practice), by bisection.
    const q0 = r.y[2 * k - 2], v0 = r.y[2 * k - 1], q1 = r.y[2 * k], v1 = r.y[2 * k + 1];
    const hermite = (s: number): number =>
      (2 * s ** 3 - 3 * s ** 2 + 1) * q0 + (s ** 3 - 2 * s ** 2 + s) * h * v0 + (-2 * s ** 3 + 3 * s ** 2) * q1 + (s ** 3 - s ** 2) * h * v1;
    let lo = 0, hi = 1;
    for (let i = 0; i < 60; i++) { const mid = (lo + hi) / 2; if (hermite(mid) > 0) lo = mid; else hi = mid; }
    const T = 4 * (r.t[k - 1] + lo * h);
    expect(Math.abs(T / T0 - 1.180340599016)).toBeLessThan(1e-9);
  });

  it('double well: equilibria of the formula at 0 and +-sqrt(a/b), wells, barrier and frequencies as in references.md', () => {
    // references.md "Duffing double well": wells at +-sqrt(a/b), well-bottom energy -a^2/(4b)
    // (times m in our convention), barrier energy 0, small-oscillation frequency sqrt(2a),
    // saddle eigenvalues +-sqrt(a). Elementary calculus on V'(q) = -a q + b q^3.
    const a = 2, b = 0.5, m = 1.5;
    const p = builtinPlant('double-well', { a, b, m, c: 0 });
    const f = (q: number): number => p.accel(q, 0, 0, 0);
    const roots: number[] = [];
    const grid = 601;
    for (let i = 0; i < grid - 1; i++) {
      let lo = -5.01 + (10 * i) / (grid - 1), hi = -5.01 + (10 * (i + 1)) / (grid - 1);
      if (f(lo) === 0) { roots.push(lo); continue; } // a grid point on a root (q = 0 here)
      if (f(hi) === 0 || Math.sign(f(lo)) === Math.sign(f(hi))) continue;
      for (let j = 0; j < 80; j++) { const mid = (lo + hi) / 2; if (Math.sign(f(mid)) === Math.sign(f(lo))) lo = mid; else hi = mid; }
      roots.push((lo + hi) / 2);
    }
    expect(roots.length).toBe(3);
    const well = Math.sqrt(a / b); // 2
    expect(roots[0]).toBeCloseTo(-well, 12);
    expect(roots[1]).toBeCloseTo(0, 12);
    expect(roots[2]).toBeCloseTo(well, 12);
    const k = stiffness(p);
    expect(-k(well, 0)).toBeCloseTo(2 * a, 12); // w^2 in a well = 2a
    expect(-k(-well, 0)).toBeCloseTo(2 * a, 12);
    expect(k(0, 0)).toBeCloseTo(a, 12); // saddle: q'' = a q, eigenvalues +-sqrt(a)
    expect(p.energy!(well, 0)).toBeCloseTo(-m * a * a / (4 * b), 12);
    expect(p.energy!(0, 0)).toBe(0);
  });

  it('builtinPlant rejects unknown names and parameters, naming them', () => {
    expect(() => builtinPlant('pendulm')).toThrow('name: "pendulm" is not a built-in plant; expected one of pendulum, duffing, double-well, quartic');
    expect(() => builtinPlant('pendulum', { L: 1 })).toThrow('pendulum.params.L: no such parameter; expected one of m, l, g, c');
    expect(() => builtinPlant('quartic', { b: Infinity })).toThrow('quartic.params.b: expected a finite number, got Infinity');
  });
});
