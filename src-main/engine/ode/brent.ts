// Root of a scalar function on a sign-changing bracket by Brent's method (bisection safeguarding
// secant and inverse quadratic interpolation): R. P. Brent, "Algorithms for Minimization without
// Derivatives" (1973), ch. 4. Used to place events on the dense-output interpolant.

/**
 * Finds x in [a, b] (either order) with f(x) = 0, given fa = f(a), fb = f(b) of opposite signs
 * (or one of them zero). Stops when the bracket is narrower than 2 (xtol + 2 eps |x|) or f(x) = 0.
 * Returns the iterate with the smaller |f| of the final bracket ends.
 */
export function brentRoot(f: (x: number) => number, a: number, b: number, fa: number, fb: number, xtol: number, maxIter = 200): number {
  if (fa === 0) return a;
  if (fb === 0) return b;
  // b: best iterate; a: previous iterate; c: the point with f of opposite sign to f(b).
  let c = a, fc = fa;
  let d = b - a, e = d;
  for (let iter = 0; iter < maxIter; iter++) {
    if ((fb > 0) === (fc > 0)) { c = a; fc = fa; d = b - a; e = d; }
    if (Math.abs(fc) < Math.abs(fb)) { a = b; b = c; c = a; fa = fb; fb = fc; fc = fa; }
    const tol = 2 * Number.EPSILON * Math.abs(b) + xtol;
    const m = 0.5 * (c - b);
    if (Math.abs(m) <= tol || fb === 0) return b;
    if (Math.abs(e) >= tol && Math.abs(fa) > Math.abs(fb)) {
      // Interpolation step: secant if only two distinct points, else inverse quadratic.
      const s = fb / fa;
      let p: number, q: number;
      if (a === c) {
        p = 2 * m * s;
        q = 1 - s;
      } else {
        const qa = fa / fc, r = fb / fc;
        p = s * (2 * m * qa * (qa - r) - (b - a) * (r - 1));
        q = (qa - 1) * (r - 1) * (s - 1);
      }
      if (p > 0) q = -q; else p = -p;
      // Accept the interpolated step only if it falls well inside the bracket and shrinks fast enough.
      if (2 * p < Math.min(3 * m * q - Math.abs(tol * q), Math.abs(e * q))) { e = d; d = p / q; }
      else { d = m; e = m; }
    } else {
      d = m; e = m;
    }
    a = b; fa = fb;
    b += Math.abs(d) > tol ? d : (m > 0 ? tol : -tol);
    fb = f(b);
  }
  return b;
}
