import { describe, it, expect } from 'vitest';
import { brentRoot } from '../../../src-main/engine/ode/brent.ts';

describe('brentRoot', () => {
  it('finds the cube root of 2 to the requested tolerance', () => {
    const f = (x: number): number => x ** 3 - 2;
    const x = brentRoot(f, 0, 2, f(0), f(2), 1e-14);
    expect(Math.abs(x - Math.cbrt(2))).toBeLessThan(1e-13); // Math.cbrt: independent
  });

  it('finds the fixed point of cos (the Dottie number) with the bracket given in either order', () => {
    const f = (x: number): number => Math.cos(x) - x;
    const dottie = 0.7390851332151607; // root of cos x = x (well-known constant, from memory)
    expect(Math.abs(brentRoot(f, 0, 1, f(0), f(1), 1e-15) - dottie)).toBeLessThan(1e-15);
    expect(Math.abs(brentRoot(f, 1, 0, f(1), f(0), 1e-15) - dottie)).toBeLessThan(1e-15);
  });

  it('converges on a flat, badly scaled function where secant steps alone stall', () => {
    // f(x) = (x - 0.3)^9 is tiny near its root; bisection safeguarding must still shrink the bracket.
    const f = (x: number): number => (x - 0.3) ** 9;
    let evals = 0;
    const g = (x: number): number => { evals++; return f(x); };
    const x = brentRoot(g, -1, 1, f(-1), f(1), 1e-12);
    expect(Math.abs(x - 0.3)).toBeLessThan(1e-11);
    expect(evals).toBeLessThan(200);
  });

  it('returns an end point that is already a root', () => {
    const f = (x: number): number => x - 1;
    expect(brentRoot(f, 1, 3, 0, 2, 1e-12)).toBe(1);
    expect(brentRoot(f, -2, 1, -3, 0, 1e-12)).toBe(1);
  });
});
