// Feasibility of a plan by simulation, and the search for the actuator limit or margin that
// makes it work (design.md §2 "Wells and hops"). A candidate (u_max, margin) is feasible when
// every state of the start grid ends captured in the target well with every switch inside it
// (judge.ts). Searches, counting every simulation:
//   u_max: bracket upward by doubling from the infeasible value (up to maxFactor times it),
//          then bisect the bracket geometrically until hi/lo - 1 <= relTol; the answer is the
//          bracket's upper end, which was itself verified feasible.
//   margin: bisect between margin * minFactor and the infeasible margin for the largest
//          feasible margin (a smaller margin leaves less energy to bleed after the switch).
// Bisection on a monotone predicate: Press et al., "Numerical Recipes", 3rd ed., §9.1 (bracketing
// and bisection). Feasibility is assumed monotone in u_max and in the margin; the answer is always
// a verified point, never an extrapolation.
import type { Controller } from '../trial/types.ts';
import type { HopPlan } from './types.ts';
import type { StartState } from './start-grid.ts';
import { runClosedLoop } from './closed-loop.ts';
import { judgePlan, type RunOutcome } from './judge.ts';

/** What one candidate runs: the model's acceleration, the controller and the plan it follows. */
export interface Candidate {
  accel: (q: number, v: number, u: number, t: number) => number;
  controller: Controller;
  plan: HopPlan;
  H: (q: number, v: number) => number;
}

export interface FeasibilityProblem {
  build(uMax: number, margin: number): Candidate;
  grid: StartState[];
  rateHz: number;
  delaySamples?: number;
  innerSteps?: number;
  /** Longest simulated time per start state, s. */
  maxDuration: number;
  /** Time |H - H*| must stay in the band to count as settled, s. */
  settleTime: number;
}

export interface GridCheck {
  uMax: number;
  margin: number;
  feasible: boolean;
  /** One per start state run (fewer when stopped at the first failure). */
  runs: { start: StartState; outcome: RunOutcome }[];
  simulations: number;
}

export function checkCandidate(p: FeasibilityProblem, uMax: number, margin: number, stopAtFirstFailure = false): GridCheck {
  const c = p.build(uMax, margin);
  const runs: GridCheck['runs'] = [];
  let feasible = true;
  for (const start of p.grid) {
    const judge = judgePlan(c.plan, c.H, p.settleTime);
    const r = runClosedLoop({
      accel: c.accel, controller: c.controller, q0: start.q, v0: start.v, rateHz: p.rateHz,
      delaySamples: p.delaySamples, innerSteps: p.innerSteps, maxDuration: p.maxDuration, observe: judge.observe,
    });
    const outcome = judge.finish(r.t, r.q, r.v, r.status === 'diverged');
    runs.push({ start, outcome });
    if (!outcome.ok) { feasible = false; if (stopAtFirstFailure) break; }
  }
  return { uMax, margin, feasible, runs, simulations: runs.length };
}

export interface SearchResult {
  status: 'found' | 'not-found';
  message: string;
  /** Smallest verified-feasible u_max, or largest verified-feasible margin; null when none was found. */
  found: number | null;
  /** Largest infeasible u_max (or smallest infeasible margin) seen. */
  bound: number;
  simulations: number;
  candidates: number;
  method: string;
}

export interface SearchOptions {
  /** u_max: give up above uMax * maxFactor (default 64). Margin: go down to margin * minFactor (default 1/64). */
  factor?: number;
  /** Stop when the bracket's relative width is below this (default 0.03). */
  relTol?: number;
  /** At most this many candidates (default 16). */
  maxCandidates?: number;
}

/** Smallest feasible u_max at or above the infeasible `uMax` (margin fixed). */
export function searchUMax(p: FeasibilityProblem, uMax: number, margin: number, o: SearchOptions = {}): SearchResult {
  const factor = o.factor ?? 64, relTol = o.relTol ?? 0.03, maxC = o.maxCandidates ?? 16;
  let sims = 0, cands = 0;
  const ok = (u: number) => { cands++; const r = checkCandidate(p, u, margin, true); sims += r.simulations; return r.feasible; };
  let lo = uMax, hi = NaN;
  for (let u = 2 * uMax; u <= uMax * factor * (1 + 1e-12) && cands < maxC; u *= 2) {
    if (ok(u)) { hi = u; break; }
    lo = u;
  }
  if (hi !== hi) {
    return { status: 'not-found', message: `no u_max up to ${lo} is feasible (${sims} simulations)`, found: null, bound: lo, simulations: sims, candidates: cands, method: 'doubling' };
  }
  while (hi / lo - 1 > relTol && cands < maxC) {
    const mid = Math.sqrt(lo * hi);
    if (ok(mid)) hi = mid; else lo = mid;
  }
  return { status: 'found', message: `feasible from u_max = ${hi}, infeasible at ${lo} (${sims} simulations)`, found: hi, bound: lo, simulations: sims, candidates: cands, method: 'doubling, then bisection' };
}

/** Largest feasible margin below the infeasible `margin` (u_max fixed). */
export function searchMargin(p: FeasibilityProblem, uMax: number, margin: number, o: SearchOptions = {}): SearchResult {
  const factor = o.factor ?? 1 / 64, relTol = o.relTol ?? 0.03, maxC = o.maxCandidates ?? 16;
  let sims = 0, cands = 0;
  const ok = (m: number) => { cands++; const r = checkCandidate(p, uMax, m, true); sims += r.simulations; return r.feasible; };
  let lo = margin * factor, hi = margin;
  if (!ok(lo)) {
    return { status: 'not-found', message: `no margin down to ${lo} is feasible (${sims} simulations)`, found: null, bound: lo, simulations: sims, candidates: cands, method: 'bisection' };
  }
  while (hi / lo - 1 > relTol && cands < maxC) {
    const mid = Math.sqrt(lo * hi);
    if (ok(mid)) lo = mid; else hi = mid;
  }
  return { status: 'found', message: `feasible up to margin ${lo}, infeasible at ${hi} (${sims} simulations)`, found: lo, bound: hi, simulations: sims, candidates: cands, method: 'bisection' };
}
