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

export function unwrapAngle(angle: ArrayLike<number>): Unwrapped {
  const n = angle.length;
  const q = new Float64Array(n);
  if (n === 0) return { q, wraps: 0 };
  let turns = 0; // integer count of 2 pi added so far, so the offset never drifts
  let wraps = 0;
  q[0] = angle[0];
  for (let i = 1; i < n; i++) {
    const d = angle[i] - angle[i - 1];
    if (d > Math.PI || d < -Math.PI) {
      const k = Math.round(d / TWO_PI);
      turns -= k;
      wraps += Math.abs(k);
    }
    q[i] = angle[i] + turns * TWO_PI;
  }
  return { q, wraps };
}
