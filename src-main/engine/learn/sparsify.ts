// Sparsity by sequential thresholding of scaled coefficients (the STLSQ idea of Brunton,
// Proctor & Kutz, PNAS 113 (2016) 3932, applied to the generalized eigenproblem): drop terms
// whose coefficient times the term's standard deviation is below eta * max, re-solve on the rest,
// repeat until the active set settles. The level eta is chosen on the Pareto front
// (terms vs. held-out non-conservation): the sparsest model within 25 % of the best held-out mu.
import type { GramSet } from './gram.ts';
import { heldOutMu } from './heldOut.ts';
import type { ParetoPoint } from './model.ts';
import { solveWeak, weakMatrices } from './weakForm.ts';

export const SPARSITY_LEVELS = [0, 1e-4, 3e-4, 1e-3, 3e-3, 1e-2, 3e-2, 0.1];

export interface SparseResult { active: number[]; threshold: number; pareto: ParetoPoint[] }

export function thresholdActive(pooled: GramSet, dt: number, lambda: number, shift: Float64Array | null, start: number[], eta: number): { active: number[]; mu: number } {
  let active = start.slice();
  const { C, p } = weakMatrices(pooled, dt, lambda, shift, start);
  const sd = new Map<number, number>();
  start.forEach((j, a) => sd.set(j, Math.sqrt(Math.max(C[a * p + a], 0))));
  let mu = NaN;
  for (let it = 0; it < 20; it++) {
    const sol = solveWeak(pooled, dt, lambda, shift, active);
    mu = sol.mu[0];
    let mx = 0;
    for (const j of active) mx = Math.max(mx, Math.abs(sol.xi[j]) * sd.get(j)!);
    const next = active.filter((j) => Math.abs(sol.xi[j]) * sd.get(j)! >= eta * mx);
    if (next.length === active.length || next.length === 0) break;
    active = next;
  }
  return { active, mu };
}

export function sparsify(segments: GramSet[], pooled: GramSet, dt: number, lambda: number, shift: Float64Array | null, start: number[], levels = SPARSITY_LEVELS): SparseResult {
  const pts: (ParetoPoint & { active: number[] })[] = [];
  for (const eta of levels) {
    const r = thresholdActive(pooled, dt, lambda, shift, start, eta);
    if (pts.length && pts[pts.length - 1].active.join() === r.active.join()) continue;
    const h = heldOutMu(segments, pooled, dt, lambda, shift, r.active);
    pts.push({ threshold: eta, terms: r.active.length, mu: r.mu, heldOut: h, active: r.active });
  }
  const score = (x: (typeof pts)[number]) => (Number.isFinite(x.heldOut) ? x.heldOut : x.mu);
  const best = Math.min(...pts.map(score));
  let pick = pts[0];
  for (const x of pts) if (score(x) <= 1.25 * best + 1e-15 && (x.terms < pick.terms || score(pick) > 1.25 * best + 1e-15)) pick = x;
  return { active: pick.active, threshold: pick.threshold, pareto: pts.map(({ threshold, terms, mu, heldOut }) => ({ threshold, terms, mu, heldOut })) };
}
