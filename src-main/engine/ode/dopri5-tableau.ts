// Dormand–Prince 5(4) Butcher tableau and its continuous extension.
// Coefficients: J. R. Dormand & P. J. Prince, "A family of embedded Runge–Kutta formulae",
// J. Comput. Appl. Math. 6 (1980) 19–26; as tabulated in Hairer, Nørsett & Wanner,
// "Solving Ordinary Differential Equations I" (2nd ed.), §II.5 (Table 5.2; table number from memory).
// Dense output (order 4): HNW §II.6, the continuous extension of DOPRI5 (due to Shampine, 1986, as
// used in Hairer's DOPRI5 code; attribution from memory), written in the compact form with the five
// coefficient vectors r1..r5 below. The tests check the order conditions and the interpolation order.

/** Nodes c2..c6 (c1 = 0, c7 = 1). */
export const C2 = 1 / 5, C3 = 3 / 10, C4 = 4 / 5, C5 = 8 / 9;

export const A21 = 1 / 5;
export const A31 = 3 / 40, A32 = 9 / 40;
export const A41 = 44 / 45, A42 = -56 / 15, A43 = 32 / 9;
export const A51 = 19372 / 6561, A52 = -25360 / 2187, A53 = 64448 / 6561, A54 = -212 / 729;
export const A61 = 9017 / 3168, A62 = -355 / 33, A63 = 46732 / 5247, A64 = 49 / 176, A65 = -5103 / 18656;
/** Fifth-order weights b (also the last stage row a7j: the FSAL property, b2 = b7 = 0). */
export const B1 = 35 / 384, B3 = 500 / 1113, B4 = 125 / 192, B5 = -2187 / 6784, B6 = 11 / 84;
/** Fourth-order embedded weights b̂ (used only through E = b - b̂ below, and by the order test). */
export const BH1 = 5179 / 57600, BH3 = 7571 / 16695, BH4 = 393 / 640, BH5 = -92097 / 339200, BH6 = 187 / 2100, BH7 = 1 / 40;
/** Error weights e = b - b̂ (HNW §II.5: the local error estimate is h Σ e_i k_i). */
export const E1 = 71 / 57600, E3 = -71 / 16695, E4 = 71 / 1920, E5 = -17253 / 339200, E6 = 22 / 525, E7 = -1 / 40;
/** Dense-output weights d_i of the θ²(1-θ)² term (HNW §II.6, DOPRI5 continuous extension). */
export const D1 = -12715105075 / 11282082432, D3 = 87487479700 / 32700410799, D4 = -10690763975 / 1880347072,
  D5 = 701980252875 / 199316789632, D6 = -1453857185 / 822651844, D7 = 69997945 / 29380423;

/**
 * Evaluates the continuous extension at θ = (t - tOld)/h for one step whose coefficients are stored
 * as five consecutive length-n blocks r = [r1 | r2 | r3 | r4 | r5] starting at r[off]:
 *   r1 = y0, r2 = y1 - y0, r3 = h k1 - r2, r4 = r2 - h k7 - r3, r5 = h Σ d_i k_i,
 *   u(θ) = r1 + θ (r2 + (1-θ) (r3 + θ (r4 + (1-θ) r5))).
 * Writes n values into out.
 */
export function dopri5Interp(r: Float64Array, off: number, n: number, theta: number, out: Float64Array): void {
  const th1 = 1 - theta;
  for (let i = 0; i < n; i++) {
    const j = off + i;
    out[i] = r[j] + theta * (r[j + n] + th1 * (r[j + 2 * n] + theta * (r[j + 3 * n] + th1 * r[j + 4 * n])));
  }
}
