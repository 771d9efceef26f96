// Judges one closed-loop run of a plan, sample by sample (design.md §2 "Wells and hops": stage 2
// must bring the energy below the barrier before the state can return to it). For each hop leg:
// the switch into its settle stage is recorded with whether q was past the last barrier inside
// the target well (angles: inside whichever copy of the target well it entered, from either side); from then on the run fails if q leaves the target well ('returned' over the
// barrier it came from, 'overshot' over the far one) before H drops below the well's lowest
// barrier (captured). After the last leg is captured the run is 'settled' once |H - H*| stays
// within the plan's band for `settleTime`. Rotation plans: the rig must go over the top
// ('no-rotation' otherwise); with turns, stage 2 must capture it in a copy of the start well
// and settle it; without, the rotation level must settle.
import type { HopPlan, WellBounds } from './types.ts';

const TWO_PI = 2 * Math.PI;

function shifted(w: WellBounds, d: number): WellBounds {
  return d === 0 ? w : { ...w, q: w.q + d, left: w.left && { q: w.left.q + d, V: w.left.V }, right: w.right && { q: w.right.q + d, V: w.right.V } };
}
import { insideBasin } from './well-bounds.ts';

export type RunStatus =
  | 'settled' | 'captured'
  | 'no-switch' | 'returned' | 'overshot' | 'not-captured' | 'escaped'
  | 'no-rotation' | 'rotating' | 'not-stopped' | 'diverged';

export interface SwitchRecord { leg: number; t: number; q: number; v: number; inside: boolean }

export interface RunOutcome {
  status: RunStatus;
  /** Every leg captured (or, for rotations, the rotation reached and, with turns, stopped), and every switch inside its target well. */
  ok: boolean;
  settled: boolean;
  switches: SwitchRecord[];
  /** Time each leg was captured (hop plans). */
  captureTimes: number[];
  t: number;
  q: number;
  v: number;
  H: number;
}

export interface Judge {
  observe(t: number, q: number, v: number, stage: number): boolean;
  /** Verdict after the run; `diverged` when the loop diverged. */
  finish(t: number, q: number, v: number, diverged: boolean): RunOutcome;
}

export function judgePlan(plan: HopPlan, H: (q: number, v: number) => number, settleTime: number): Judge {
  return plan.kind === 'rotation' ? judgeRotation(plan, H, settleTime) : judgeHop(plan, H, settleTime);
}

function judgeHop(plan: HopPlan, H: (q: number, v: number) => number, settleTime: number): Judge {
  const legs = plan.legs;
  let h = 0;
  let phase: 'raise' | 'bleed' | 'settle' = 'raise';
  let since = NaN;
  let status: RunStatus | null = null;
  const switches: SwitchRecord[] = [];
  const captureTimes: number[] = [];
  // The target well's copy this leg entered (angles: the copy nearest the switch) and the direction it came in.
  let target = legs[0].target;
  let dir: number = legs[0].direction;
  return {
    observe(t, q, v, stage) {
      const leg = legs[h];
      if (phase === 'raise') {
        if (stage !== plan.entryStages[h]) return true;
        const b = leg.crossed[leg.crossed.length - 1];
        if (plan.periodic) {
          target = shifted(leg.target, TWO_PI * Math.round((q - leg.target.q) / TWO_PI));
          dir = v > 0 ? 1 : -1;
          switches.push({ leg: h + 1, t, q, v, inside: insideBasin(target, q) });
        } else {
          target = leg.target;
          dir = leg.direction;
          switches.push({ leg: h + 1, t, q, v, inside: insideBasin(target, q) && (q - b.q) * leg.direction > 0 });
        }
        phase = 'bleed';
      }
      const E = H(q, v);
      if (!insideBasin(target, q)) {
        const back = dir > 0 ? target.left !== null && q <= target.left.q : target.right !== null && q >= target.right.q;
        status = phase === 'settle' ? 'escaped' : back ? 'returned' : 'overshot';
        return false;
      }
      if (phase === 'bleed') {
        if (E < target.rim) {
          captureTimes.push(t);
          if (h < legs.length - 1) { h++; phase = 'raise'; } else { phase = 'settle'; since = NaN; }
        }
        return true;
      }
      if (Math.abs(E - plan.finalEnergy) <= plan.settleBand) {
        if (since !== since) since = t;
        if (t - since >= settleTime) { status = 'settled'; return false; }
      } else since = NaN;
      return true;
    },
    finish(t, q, v, diverged) {
      const s: RunStatus = diverged ? 'diverged' : status ?? (phase === 'raise' ? 'no-switch' : phase === 'bleed' ? 'not-captured' : 'captured');
      const captured = s === 'settled' || s === 'captured';
      return { status: s, ok: captured && switches.every((x) => x.inside), settled: s === 'settled', switches, captureTimes, t, q, v, H: H(q, v) };
    },
  };
}

function judgeRotation(plan: HopPlan, H: (q: number, v: number) => number, settleTime: number): Judge {
  const rot = plan.rotation!;
  const turn = 2 * Math.PI;
  let phase: 'spin' | 'hold' | 'stop' | 'settle' = 'spin';
  let since = NaN;
  let status: RunStatus | null = null;
  const switches: SwitchRecord[] = [];
  return {
    observe(t, q, v, stage) {
      const E = H(q, v);
      if (phase === 'spin') {
        if (Math.abs(q - rot.start.q) < turn) return true;
        phase = rot.turns === null ? 'hold' : 'stop';
      }
      if (phase === 'hold') {
        if (Math.abs(E - plan.finalEnergy) <= plan.settleBand) {
          if (since !== since) since = t;
          if (t - since >= settleTime) { status = 'settled'; return false; }
        } else since = NaN;
        return true;
      }
      if (phase === 'stop') {
        if (stage === 2 && switches.length === 0) switches.push({ leg: 1, t, q, v, inside: Math.abs(q - rot.start.q) >= turn * rot.turns! });
        if (stage === 2 && E < rot.top.V) { phase = 'settle'; since = NaN; }
        return true;
      }
      if (Math.abs(E - plan.finalEnergy) <= plan.settleBand) {
        if (since !== since) since = t;
        if (t - since >= settleTime) { status = 'settled'; return false; }
      } else since = NaN;
      return true;
    },
    finish(t, q, v, diverged) {
      const s: RunStatus = diverged ? 'diverged' : status ?? (phase === 'spin' ? 'no-rotation' : phase === 'hold' ? 'rotating' : phase === 'stop' ? 'not-stopped' : 'captured');
      const ok = rot.turns === null ? s === 'settled' || s === 'rotating' : s === 'settled' || s === 'captured';
      return { status: s, ok: ok && switches.every((x) => x.inside), settled: s === 'settled', switches, captureTimes: [], t, q, v, H: H(q, v) };
    },
  };
}
