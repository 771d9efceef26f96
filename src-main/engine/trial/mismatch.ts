// Parameter mismatch for Monte Carlo trials: run i scales every plant parameter by its own factor
// drawn uniformly from [1 - p, 1 + p]. The draws of run i come from PCG32 stream 2 i + 1 of the
// seed (O'Neill 2014; engine/signal/random.ts), parameters taken in sorted name order, so a run's
// parameters depend only on (seed, i, p): never on how many workers ran or in what order.
import { Pcg32 } from '../signal/random.ts';

export function mismatchFactors(names: readonly string[], p: number, seed: number, run: number): Record<string, number> {
  if (!(p >= 0 && p < 1)) throw new RangeError(`mismatch: p must be in [0, 1), got ${p}`);
  if (!Number.isSafeInteger(seed) || seed < 0) throw new RangeError(`seed: expected a non-negative integer, got ${seed}`);
  if (!Number.isSafeInteger(run) || run < 0) throw new RangeError(`run: expected a non-negative integer, got ${run}`);
  const rng = new Pcg32(seed, 2 * run + 1);
  const out: Record<string, number> = {};
  for (const name of [...names].sort()) out[name] = 1 + p * (2 * rng.uniform() - 1);
  return out;
}

/** The noise stream of run i (even streams; the odd ones are the parameter draws). */
export function noiseStream(run: number): number {
  return 2 * run + 2;
}
