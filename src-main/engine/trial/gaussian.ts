// Standard normal deviates from a uniform source by the Box–Muller transform (Box & Muller,
// Ann. Math. Statist. 29 (1958) 610–611), both deviates of each pair used.

/** A source of uniform deviates in [0, 1) (e.g. a seeded PRNG). */
export type UniformSource = () => number;

export function gaussianSource(uniform: UniformSource): () => number {
  let spare = 0;
  let hasSpare = false;
  return () => {
    if (hasSpare) {
      hasSpare = false;
      return spare;
    }
    let u1 = uniform();
    while (u1 <= 0) u1 = uniform();
    const r = Math.sqrt(-2 * Math.log(u1));
    const a = 2 * Math.PI * uniform();
    spare = r * Math.sin(a);
    hasSpare = true;
    return r * Math.cos(a);
  };
}
