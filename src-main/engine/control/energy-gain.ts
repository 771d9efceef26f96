// Feedback gain of the SDRE on the energy coordinate (design.md "SDRE on the energy coordinate";
// SDRE: Cloutier, D'Souza & Mracek 1996, from memory). With z = H - H*, dz/dt = lambda z + b u,
// the scalar Riccati 2 lambda p - (b^2/R) p^2 + Q = 0 gives u = -(b p / R) z
//   = -(lambda + sqrt(lambda^2 + Q b^2 / R)) z / b.
// Regularisation (ours): the Riccati equation is solved with beta^2 = b^2 + eps^2 in place of b^2
// and the input is applied along b, u = -(b p(beta) / R) z. For lambda = 0 this is exactly
// u = -sqrt(Q/R) (b / sqrt(b^2 + eps^2)) z, the energy-pumping law with regularised sign
// (Astrom & Furuta 2000, Automatica 36:287-295; references.md §6); eps = 0 is the plain law.
// For lambda < 0 the gain is written rationalised, Q b / (R (s - lambda)) with
// s = sqrt(lambda^2 + Q beta^2 / R), which never divides by b and tends to 0 with b.
// For lambda > 0 and beta = 0 there is no authority: the gain is taken as 0.

/** Gain k with u_feedback = -k z; pure function. */
export function levelHoldGain(lambda: number, b: number, Q: number, R: number, eps: number): number {
  if (lambda === 0) {
    // eps = 0: the plain law, sign(b) exactly (sign(0) = 0: no authority at a turning point).
    return eps === 0 ? Math.sqrt(Q / R) * Math.sign(b) : (Math.sqrt(Q / R) * b) / Math.hypot(b, eps);
  }
  const beta = eps === 0 ? Math.abs(b) : Math.hypot(b, eps);
  const s = Math.sqrt(lambda * lambda + (Q * beta * beta) / R);
  if (lambda < 0) return (Q * b) / (R * (s - lambda));
  if (beta === 0) return 0;
  return ((lambda + s) * (b / beta)) / beta;
}
