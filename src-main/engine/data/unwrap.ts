// Phase unwrapping of a sampled angle: where consecutive samples jump by more than pi, the jump is
// taken as a wrap and removed by adding the nearest multiple of 2 pi (the standard rule, as in
// Itoh, "Analysis of the phase unwrapping algorithm", Applied Optics 21 (1982) 2470). Valid when
// the true angle moves by less than pi per sample.

const TWO_PI = 2 * Math.PI;

export interface Unwrapped {
  /** The unwrapped angle (a new array; the input is not changed). */
  q: Float64Array;
  /** Number of 2 pi wraps removed (a jump of several turns counts each turn). */
  wraps: number;
}

/**
 * Unwraps `angle` into a new array, or into `out` when given (same length; may be `angle` itself
 * when the caller owns that array).
 */
export function unwrapAngle(angle: ArrayLike<number>, out?: Float64Array): Unwrapped {
  const n = angle.length;
  if (out !== undefined && out.length !== n) throw new RangeError(`unwrapAngle: out must have the length of angle (${n}), got ${out.length}`);
  const q = out ?? new Float64Array(n);
  if (n === 0) return { q, wraps: 0 };
  let turns = 0; // integer count of 2 pi added so far, so the offset never drifts
  let wraps = 0;
  let prev = angle[0];
  q[0] = prev;
  for (let i = 1; i < n; i++) {
    const a = angle[i]; // read before writing: out may alias angle
    const d = a - prev;
    if (d > Math.PI || d < -Math.PI) {
      const k = Math.round(d / TWO_PI);
      turns -= k;
      wraps += Math.abs(k);
    }
    q[i] = a + turns * TWO_PI;
    prev = a;
  }
  return { q, wraps };
}
