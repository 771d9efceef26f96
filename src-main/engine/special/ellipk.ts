// Complete elliptic integral of the first kind K(m), parameter m = k^2 (A&S 17.2, DLMF 19.2.8),
// by the arithmetic–geometric mean: K(m) = pi / (2 AGM(1, sqrt(1 - m))) (A&S 17.6, DLMF 19.8.5).
// The complementary form K in terms of p = 1 - m keeps full relative accuracy as m -> 1, where
// forming 1 - m from m would cancel.
// Also the pendulum period, which is K at m = sin^2(theta0/2) (see pendulumPeriod below).

/** AGM(a, b) for a, b >= 0 (quadratic convergence; stops when the means agree to rounding). */
function agm(a: number, b: number): number {
  for (let i = 0; i < 64; i++) {
    if (Math.abs(a - b) <= 2 * Number.EPSILON * a) break;
    const an = 0.5 * (a + b);
    b = Math.sqrt(a * b);
    a = an;
  }
  return 0.5 * (a + b);
}

/** K(m) for m < 1 (m may be negative); K(1) = Infinity. Throws for m > 1 or a non-number. */
export function ellipK(m: number): number {
  if (typeof m !== 'number' || Number.isNaN(m) || m > 1) throw new RangeError(`ellipK: m must be a number <= 1 (the parameter m = k^2), got ${m}`);
  return ellipKm1(1 - m);
}

/** K(1 - p) for the complementary parameter p = 1 - m >= 0; accurate for tiny p. K(m = 1) at p = 0 is Infinity. */
export function ellipKm1(p: number): number {
  if (typeof p !== 'number' || Number.isNaN(p) || p < 0) throw new RangeError(`ellipKm1: p = 1 - m must be a number >= 0, got ${p}`);
  if (p === 0) return Infinity;
  if (p === Infinity) return 0;
  return Math.PI / (2 * agm(1, Math.sqrt(p)));
}

// Period of the undamped pendulum theta'' = -(g/l) sin(theta) released from rest at amplitude theta0:
// T = 4 sqrt(l/g) K(m), m = sin^2(theta0/2) (standard result, e.g. Landau & Lifshitz, Mechanics, §11,
// problem 1 — from memory). Uses p = 1 - m = cos^2(theta0/2) directly, so large amplitudes keep
// their accuracy.
/** Period in seconds for amplitude theta0 (radians, |theta0| < pi), gravity g (m/s^2) and length l (m). */
export function pendulumPeriod(theta0: number, g: number, l: number): number {
  if (typeof theta0 !== 'number' || !(Math.abs(theta0) < Math.PI)) {
    throw new RangeError(`pendulumPeriod: theta0 must be an amplitude in radians with |theta0| < pi (a swing, not a rotation), got ${theta0}`);
  }
  if (typeof g !== 'number' || !(g > 0) || !Number.isFinite(g)) throw new RangeError(`pendulumPeriod: g must be a positive finite number (m/s^2), got ${g}`);
  if (typeof l !== 'number' || !(l > 0) || !Number.isFinite(l)) throw new RangeError(`pendulumPeriod: l must be a positive finite number (m), got ${l}`);
  const c = Math.cos(0.5 * theta0);
  return 4 * Math.sqrt(l / g) * ellipKm1(c * c);
}
