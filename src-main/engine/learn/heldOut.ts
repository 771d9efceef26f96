// Held-out conservation by k-fold cross-validation over segments (runs, or time blocks of a
// single run): fit on the other folds, measure mu on the held-out fold (common practice).
// Gram sets are additive, so a fold's training set is the pooled set minus the fold's.
import { addGramSet, emptyGramSet, type GramSet } from './gram.ts';
import { nonConservation, solveWeak } from './weakForm.ts';

/** Groups segment indices into at most k folds, round-robin. */
export function folds(segments: number, k = 6): number[][] {
  const f = Math.min(k, segments);
  const out: number[][] = Array.from({ length: f }, () => []);
  for (let i = 0; i < segments; i++) out[i % f].push(i);
  return out;
}

function subtract(pooled: GramSet, part: GramSet): GramSet {
  const neg = (x: Float64Array) => x.map((z) => -z);
  const minus: GramSet = {
    p: part.p, n: -part.n, sum: neg(part.sum), G: neg(part.G),
    lags: part.lags.map((l) => ({ lag: l.lag, count: -l.count, D0: neg(l.D0), Ffirst: neg(l.Ffirst), Flast: neg(l.Flast), sumFirst: neg(l.sumFirst), sumLast: neg(l.sumLast) })),
  };
  const out = emptyGramSet(pooled.p, pooled.lags.map((l) => l.lag));
  addGramSet(out, pooled);
  return addGramSet(out, minus);
}

/** Mean held-out mu of the weak-form solution on `active`; NaN when there are fewer than two folds. */
export function heldOutMu(segments: GramSet[], pooled: GramSet, dt: number, lambda: number, shift: Float64Array | null, active: number[]): number {
  const fs = folds(segments.length);
  if (fs.length < 2) return NaN;
  let s = 0, k = 0;
  for (const f of fs) {
    const test = emptyGramSet(pooled.p, pooled.lags.map((l) => l.lag));
    for (const i of f) addGramSet(test, segments[i]);
    if (test.lags.every((l) => l.count === 0) || test.n < 2) continue;
    const train = subtract(pooled, test);
    try {
      const sol = solveWeak(train, dt, lambda, shift, active);
      const m = nonConservation(test, dt, lambda, shift, sol.xi, train);
      if (Number.isFinite(m)) { s += m; k++; }
    } catch {
      // A fold whose training part is degenerate (a term constant on it) is skipped.
    }
  }
  return k ? s / k : NaN;
}
