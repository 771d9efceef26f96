// One classic RK4 step (Hairer, Nørsett & Wanner, "Solving ODEs I", §II.1, Table 1.2) of a
// second-order plant q' = v, v' = f(q, v, u, t) with the input u held over the step (zero-order
// hold). Shared by the trial simulator, its model observer and the hop planner's closed loop.

export type HeldAccel = (q: number, v: number, u: number, t: number) => number;

/** Advances (q, v) from t by h with u held; writes the new q, v into out[0], out[1]. */
export function rk4HeldStep(f: HeldAccel, q: number, v: number, u: number, t: number, h: number, out: Float64Array): void {
  const a1 = f(q, v, u, t);
  const q2 = q + 0.5 * h * v, v2 = v + 0.5 * h * a1;
  const a2 = f(q2, v2, u, t + 0.5 * h);
  const q3 = q + 0.5 * h * v2, v3 = v + 0.5 * h * a2;
  const a3 = f(q3, v3, u, t + 0.5 * h);
  const q4 = q + h * v3, v4 = v + h * a3;
  const a4 = f(q4, v4, u, t + h);
  out[0] = q + (h / 6) * (v + 2 * v2 + 2 * v3 + v4);
  out[1] = v + (h / 6) * (a1 + 2 * a2 + 2 * a3 + a4);
}
