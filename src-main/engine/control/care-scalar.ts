// Scalar CARE 2 a x - (b^2 / r) x^2 + q = 0 in closed form: the stabilizing root is
// x = (a r + sqrt(a^2 r^2 + q r b^2)) / b^2 (the quadratic formula; references.md §3 scalar rows,
// from memory), evaluated without cancellation as x = q r / (sqrt(a^2 r^2 + q r b^2) - a r) when
// a r <= 0, which also covers b = 0 with a < 0 (x = -q / (2a)). The closed loop is
// a - b^2 x / r = -sqrt(a^2 + q b^2 / r).

export interface ScalarCareResult {
  status: 'ok' | 'no-stabilizing-solution';
  message: string;
  /** Stabilizing solution (NaN when none). */
  x: number;
  /** Gain k = b x / r; u = -k state. */
  k: number;
  /** Closed-loop pole a - b k. */
  closedLoop: number;
}

export function solveCareScalar(a: number, b: number, q: number, r: number): ScalarCareResult {
  for (const [name, v] of [['a', a], ['b', b], ['q', q], ['r', r]] as const) {
    if (typeof v !== 'number' || !Number.isFinite(v)) throw new RangeError(`${name}: expected a finite number, got ${String(v)}`);
  }
  if (!(r > 0)) throw new RangeError(`r: expected a positive input weight, got ${r}`);
  const none = (message: string): ScalarCareResult => ({ status: 'no-stabilizing-solution', message, x: NaN, k: NaN, closedLoop: NaN });
  if (b === 0) {
    if (a < 0) return { status: 'ok', message: 'b = 0 and a < 0: x = -q / (2a)', x: -q / (2 * a), k: 0, closedLoop: a };
    return none(`b = 0 and a = ${a} >= 0: the pair (a, b) is not stabilizable`);
  }
  const d = a * a * r * r + q * r * b * b;
  if (!(d > 0)) return none(`a^2 r^2 + q r b^2 = ${d} <= 0: the Hamiltonian has eigenvalues on the imaginary axis`);
  const s = Math.sqrt(d);
  const x = a * r > 0 ? (a * r + s) / (b * b) : (q * r) / (s - a * r);
  const k = (b * x) / r;
  return { status: 'ok', message: 'closed form', x, k, closedLoop: -s / r };
}
