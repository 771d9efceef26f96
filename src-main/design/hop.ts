// Well-hop designer (design.md §2 "Wells and hops", issue 5): from an energy model with its
// landscape, a staged ControllerDesign (kind 'well-hop') that raises the energy over the barrier,
// switches once past it heading into the target well, and bleeds the energy to the requested
// level there; multi-hop moves chain such stages; for angles, a rotation at a given speed over the
// top and, optionally, back to rest. Every stage is a level-hold (SDRE energy) law and every
// switch an explicit SwitchCondition, so the supervisor lives in the document (controllerFromDesign
// runs it) and nothing is left to the simulator. Before the design is accepted it is simulated on
// the model's own equations (motion.ts: H = 1/2 M(q) v^2 + V(q) gives M v' + 1/2 M' v^2 + V' = -c v + u,
// design.md §2 "A model to simulate from H") from a grid of start states at the given u_max,
// sample rate, delay and margin; when that fails the u_max and the margin that work are searched
// for (engine/plan/feasibility.ts) and written into design.checks.
//
// Law parameters (our choices, documented in docs/well-hops.md): R = 1, Q = (u_max / (gainBand dE))^2
// so the law saturates once |H - H*| exceeds gainBand (default 5%) of the smallest barrier height
// dE on the route (a stage should move the energy at full authority); eps = 2% of the typical
// |b| = |g dH/dv| at the well bottom with kinetic energy dE, or the velocity noise's share of b
// when larger (as in level-hold.ts); loss compensation on every stage whose
// orbit has a period (<b^2> by meanSquareInputGain), none at rest (<b^2> = 0 there).
//
// Known range (issue 4): when the model records the energies its free runs reached
// (model.coverage, engine/learn/coverage.ts), every barrier the route crosses (the top of the
// circle for a rotation) must lie within them, or the model has never seen a state over it and
// the design is refused; the raise stage's margin above a crossed barrier is then allowed. Every
// other stage level (the final level, a rotation's level) may lie at most COVERAGE_ALLOWANCE (5%)
// above the recorded top, as in level-hold.ts. Model files without coverage are planned as before,
// with the range taken from the landscape and the plan, and the check says so.
import type { EnergyModel, Landscape } from '../engine/learn/index.ts';
import { compileFormula } from '../engine/formula/index.ts';
import { meanSquareInputGain } from '../engine/control/index.ts';
import {
  buildHopPlan, buildRotationPlan, checkCandidate, searchMargin, searchUMax, startGrid, wellAt, wellBounds,
  type FeasibilityProblem, type GridCheck, type HopPlan, type LevelRequest, type SearchResult, type WellBounds,
} from '../engine/plan/index.ts';
import type { EnergyFunction } from '../engine/types.ts';
import { SAFETY_CAUTIONS, SAFETY_DEFERENCE } from '../safety.ts';
import { APP_VERSION } from '../version.ts';
import { compileDesignEnergy } from './energy.ts';
import { controllerFromDesign } from './supervisor.ts';
import { COVERAGE_ALLOWANCE, energyFormula } from './level-hold.ts';
import { coverageEnergyFactor } from '../engine/learn/model.ts';
import { DesignRefusal } from './refusal.ts';
import { motionFromEnergy } from './motion.ts';
import { readDesign } from './validate.ts';
import { DESIGN_FORMAT, DESIGN_VERSION, type ControllerDesign, type Stage } from './types.ts';

export interface WellHopOptions {
  /** Target well K (1-based, numbered from the most negative q). Give this or `rotation`. */
  toWell?: number;
  /** Level in the target well: an energy, an amplitude about the well bottom, or at rest (default). */
  level?: LevelRequest;
  /** Angles: rotate at `speed` rad/s over the top; with `turns`, come back to rest after that many revolutions. */
  rotation?: { speed: number; turns?: number | null };
  /** Start well; or `from`, a state whose well is taken. With neither, a two-well landscape starts in the other well. */
  fromWell?: number;
  from?: { q: number; v: number };
  /** Actuator limit |u| <= uMax, in the model's input unit (required). */
  uMax: number;
  /** Stage 1 raises to the barrier plus margin * (barrier - start well bottom). Default 0.1. */
  margin?: number;
  sampleRateHz?: number;
  delaySamples?: number;
  rateMax?: number | null;
  route?: 'stepwise' | 'direct';
  direction?: 1 | -1 | 'auto';
  switchFraction?: number;
  captureBand?: number;
  settleFraction?: number;
  /** Saturate once |H - H*| > gainBand * smallest barrier height. Default 0.05. */
  gainBand?: number;
  Q?: number;
  R?: number;
  eps?: number;
  /** Feasibility check by simulation; false skips it (the check is then recorded as not made). */
  feasibility?: false | {
    /** Fractions of the start well's depth for the start grid. Default [0.1, 0.45, 0.8]. */
    levels?: number[];
    maxDuration?: number;
    /** Search u_max and/or margin when infeasible. Default true (both). */
    search?: boolean | 'u_max' | 'margin';
    /** Relative bracket width at which the searches stop. Default 0.03. */
    relTol?: number;
  };
  source?: string;
}

export interface WellHopResult {
  design: ControllerDesign;
  plan: HopPlan;
  /** The check at the requested u_max and margin (null when skipped). */
  check: GridCheck | null;
  uMaxSearch: SearchResult | null;
  marginSearch: SearchResult | null;
}

/** The design document only; see designWellHopDetailed for the plan and the feasibility runs. */
export function designWellHop(model: EnergyModel, options: WellHopOptions): ControllerDesign {
  return designWellHopDetailed(model, options).design;
}

const fmt = (x: number) => Number(x.toPrecision(4)).toString();
/** 4 significant digits rounded away from the infeasible side, so the printed value itself was verified or is safer. */
const fmtRound = (x: number, up: boolean) => {
  const p = 10 ** (Math.floor(Math.log10(Math.abs(x))) - 3);
  return Number(((up ? Math.ceil(x / p) : Math.floor(x / p)) * p).toPrecision(4)).toString();
};

interface ModelParts {
  energy: string;
  acceleration: string;
  conservative: (q: number, v: number) => number;
  accel: (q: number, v: number, u: number, t: number) => number;
  gain: number;
  unit: string;
  mass: (q: number) => number;
}

/**
 * H as an exact formula (level-hold.ts energyFormula) and the equations of motion it implies
 * (motion.ts motionFromEnergy: H = 1/2 M(q) v^2 + V(q), checked on the landscape's range). The
 * input gain is the model's calibrated one, else 1/M when M is constant.
 */
function modelParts(model: EnergyModel, land: Landscape): ModelParts {
  const energy = energyFormula(model);
  const qs = Array.from({ length: 21 }, (_, i) => land.qMin + ((land.qMax - land.qMin) * i) / 20);
  const probe = motionFromEnergy(energy, model.lambda, 1, qs);
  if (typeof probe === 'string') throw new RangeError(`model: ${probe}; the well-hop check simulates from the equations of motion this form gives`);
  let gain = model.scale?.inputGain ?? null;
  if (gain === null || !Number.isFinite(gain) || gain === 0) {
    const m0 = probe.mass(qs[0]);
    if (qs.some((q) => Math.abs(probe.mass(q) - m0) > 1e-12 * m0)) throw new RangeError('model.scale.inputGain: missing, and M(q) is not constant, so g = 1/M is not a number; calibrate the model with a forced run');
    gain = 1 / m0;
  }
  const motion = motionFromEnergy(energy, model.lambda, gain, qs) as Exclude<typeof probe, string>;
  const fAcc = compileFormula(motion.acceleration, ['q', 'v', 'u', 't']);
  const x4 = new Float64Array(4);
  return {
    energy, acceleration: motion.acceleration, gain,
    unit: model.units === 'J' ? (model.coordinate === 'angle' ? 'N m' : 'N') : '',
    conservative: motion.undamped,
    mass: motion.mass,
    accel: (q, v, u, t) => { x4[0] = q; x4[1] = v; x4[2] = u; x4[3] = t; return fAcc.eval(x4); },
  };
}

/** Small-oscillation period at the bottom of a well: 2 pi / sqrt(V'' / H_vv) by central differences. */
function wellPeriod(H: (q: number, v: number) => number, w: WellBounds): number {
  const d = 1e-4 * Math.max(1, Math.abs(w.q));
  const Vqq = (H(w.q + d, 0) - 2 * H(w.q, 0) + H(w.q - d, 0)) / (d * d);
  const Hvv = (H(w.q, 1e-3) - 2 * H(w.q, 0) + H(w.q, -1e-3)) / 1e-6;
  return Vqq > 0 && Hvv > 0 ? 2 * Math.PI / Math.sqrt(Vqq / Hvv) : NaN;
}

/** |b| = |g dH/dv| at the bottom of `w` moving with kinetic energy dE. */
function typicalB(e: EnergyFunction, g: number, w: WellBounds, dE: number): number {
  let lo = 0, hi = 1;
  for (let k = 0; k < 200 && e.H(w.q, hi) < w.V + dE; k++) { lo = hi; hi *= 2; }
  for (let k = 0; k < 100; k++) { const m = 0.5 * (lo + hi); if (e.H(w.q, m) < w.V + dE) lo = m; else hi = m; }
  const grad = new Float64Array(2);
  e.grad(w.q, 0.5 * (lo + hi), grad);
  return Math.abs(g * grad[1]);
}

/**
 * The plan against the energies the recordings reached (see the header): throws a DesignRefusal
 * naming the barrier or level the model has never seen; otherwise the check's detail, and the
 * design's validRange. Without coverage, the range comes from the landscape and the plan.
 * `unit` is the energy unit as printed (' J'), or ''.
 */
function knownRange(model: EnergyModel, land: Landscape, plan: HopPlan, unit: string): { detail: string; validRange: ControllerDesign['model']['validRange'] } {
  const cov = model.coverage;
  if (!cov) {
    return {
      detail: 'not checked against the recordings: the model file does not record the energy range of its recordings (learned before coverage was recorded; learn again to record it); the range is taken from the landscape and the plan',
      validRange: { qMin: land.qMin, qMax: land.qMax, energyMin: Math.min(...land.wells.map((w) => w.V)), energyMax: Math.max(plan.finalEnergy, ...plan.stages.map((s) => s.target.energy)) },
    };
  }
  const f = coverageEnergyFactor(model);
  const eMin = cov.energyMin * f, eMax = cov.energyMax * f;
  const limit = eMax + COVERAGE_ALLOWANCE * Math.abs(eMax);
  const reached = `the recordings reached ${fmt(eMin)} .. ${fmt(eMax)}${unit} (0.5th to 99.5th percentile per free run)`;
  const over = (what: string, E: number, advice: string) => new DesignRefusal(`${what} at H = ${fmt(E)}${unit}, but ${reached}: the model has never seen that energy; ${advice}`);
  const notes: string[] = [];
  const raises = new Set<number>();
  if (plan.kind === 'rotation') {
    const top = plan.rotation!.top;
    if (top.V > eMax) throw over('a rotation passes the top of the circle', top.V, 'record a free run over the top (a rotation) and learn again, or choose a hop or a level inside the well');
    notes.push(`the top of the circle (H = ${fmt(top.V)}) lies inside them`);
  } else {
    plan.legs.forEach((leg, h) => {
      if (leg.highest > eMax) {
        throw over(`the hop from well ${leg.from} to well ${leg.to} must raise the energy over the barrier`, leg.highest,
          `record free swings over that barrier (runs that pass from well ${leg.from} to well ${leg.to}) and learn again`);
      }
      raises.add(2 * h + 1);
    });
    const many = plan.legs.length > 1;
    notes.push(`${many ? 'the barriers crossed' : 'the barrier crossed'} (H = ${plan.legs.map((l) => fmt(l.highest)).join(', ')}) ${many ? 'lie' : 'lies'} inside them, so the raise ${many ? 'stages may target their margin above them' : 'stage may target its margin above it'}`);
  }
  for (const st of plan.stages) {
    if (raises.has(st.index)) continue;
    const E = st.target.energy;
    if (E > limit * (1 + 1e-12) + 1e-15) {
      throw new DesignRefusal(`stage ${st.index} (${st.name}) targets H = ${fmt(E)}${unit}, above what the model knows: ${reached}, and a level may lie at most ${COVERAGE_ALLOWANCE * 100}% above that top (${fmt(limit)}${unit}); record swings up to that level, or choose a lower target`);
    }
  }
  notes.push(`every other stage level is at most ${fmt(limit)}${unit} (${COVERAGE_ALLOWANCE * 100}% above the recorded top)`);
  // Angles: at energies over the highest barrier every angle is reached (rotations).
  const overTop = land.periodic && land.barriers.length > 0 && eMax >= Math.max(...land.barriers.map((b) => b.V));
  const wide = overTop || !(cov.qMax > cov.qMin);
  return {
    detail: `${reached}; ${notes.join('; ')}`,
    validRange: { qMin: wide ? land.qMin : cov.qMin, qMax: wide ? land.qMax : cov.qMax, energyMin: eMin, energyMax: eMax },
  };
}

function positive(x: unknown, name: string): number {
  if (typeof x !== 'number' || !Number.isFinite(x) || !(x > 0)) throw new RangeError(`${name}: expected a positive finite number, got ${String(x)}`);
  return x;
}

export function designWellHopDetailed(model: EnergyModel, options: WellHopOptions): WellHopResult {
  if (model === null || typeof model !== 'object') throw new TypeError('model: expected an EnergyModel');
  if (model.status !== 'ok') throw new RangeError(`model.status: the model has no conserved energy (${model.verdict?.reason ?? model.status}); nothing to plan on`);
  const land = model.landscape;
  if (!land) throw new RangeError('model.landscape: missing; the model file has no wells and barriers to plan a hop on');
  if (options === null || typeof options !== 'object') throw new TypeError('options: expected {toWell | rotation, uMax, ...}');
  const uMax0 = positive(options.uMax, 'options.uMax');
  const margin0 = options.margin ?? 0.1;
  const rate = options.sampleRateHz === undefined ? 1000 : positive(options.sampleRateHz, 'options.sampleRateHz');
  const delay = options.delaySamples ?? 0;
  if (!Number.isInteger(delay) || delay < 0) throw new RangeError(`options.delaySamples: expected a whole number >= 0, got ${String(delay)}`);
  const gainBand = options.gainBand === undefined ? 0.05 : positive(options.gainBand, 'options.gainBand');
  if ((options.toWell === undefined) === (options.rotation === undefined)) throw new RangeError('options: give exactly one of toWell (a well number) or rotation ({speed, turns})');

  const parts = modelParts(model, land);
  const energy = compileDesignEnergy(parts.energy, model.coordinate, model.lambda, 'model energy');
  const H = (q: number, v: number) => energy.H(q, v);

  // Start well.
  let from = options.fromWell;
  if (from === undefined && options.from !== undefined) {
    const { q, v } = options.from;
    if (!Number.isFinite(q) || !Number.isFinite(v)) throw new RangeError(`options.from: expected finite {q, v}, got ${JSON.stringify(options.from)}`);
    from = wellAt(land, q);
    const b = wellBounds(land, from, q);
    if (!(H(q, v) < b.rim)) throw new RangeError(`options.from: the state (q = ${q}, v = ${v}) has H = ${fmt(H(q, v))}, above the barriers of well ${from} (${fmt(b.rim)}); it is in no single well`);
  }
  if (from === undefined) {
    if (options.toWell !== undefined && land.wells.length === 2 && !land.periodic) from = options.toWell === 1 ? 2 : 1;
    else if (options.rotation !== undefined && land.wells.length === 1) from = 1;
    else throw new RangeError('options.fromWell: the start well is needed (give fromWell or from) when the landscape has more than two wells');
  }

  const planFor = (margin: number): HopPlan => options.rotation !== undefined
    ? buildRotationPlan(land, H, { from: from!, speed: options.rotation.speed, turns: options.rotation.turns ?? null, settleFraction: options.settleFraction })
    : buildHopPlan(land, H, {
      from: from!, to: options.toWell!, level: options.level, margin, switchFraction: options.switchFraction,
      captureBand: options.captureBand, settleFraction: options.settleFraction, mode: options.route, direction: options.direction,
    });
  const plan0 = planFor(margin0);
  const unit = parts.unit ? ` ${parts.unit}` : '';
  const range = knownRange(model, land, plan0, ` ${model.units}`);
  const startWell = plan0.kind === 'rotation' ? plan0.rotation!.start : plan0.legs[0].start;

  // Energy scale of the move: the smallest barrier height met (or the top, for rotations).
  const heights = plan0.kind === 'rotation'
    ? [plan0.rotation!.top.V - startWell.V]
    : plan0.legs.flatMap((l) => [l.highest - l.start.V, ...(Number.isFinite(l.target.rim) ? [l.target.rim - l.target.V] : [])]);
  const dE = Math.min(...heights);
  const g = parts.gain;
  // eps: at least the velocity noise seen through b, as designLevelHold takes it: 3 |g| M sigma_v with
  // sigma_v the noise of a least-squares slope over the model's Savitzky-Golay window (common practice).
  const met = model.metrics;
  const N = 2 * Math.max(1, met?.halfWindow ?? 1) + 1;
  const sq = met && Number.isFinite(met.noiseSigma) && met.noiseSigma > 0 && met.dt > 0 ? met.noiseSigma : 0;
  const sigmaV = sq > 0 ? (sq / met.dt) * Math.sqrt(12 / (N * (N * N - 1))) : 0;
  const eps = options.eps ?? Math.max(0.02 * typicalB(energy, g, startWell, dE), 3 * Math.abs(g) * parts.mass(startWell.q) * sigmaV);
  const R = options.R ?? 1;

  // <b^2> per stage on its own orbit (through the bottom of the stage's well).
  const notes: string[] = [];
  const stageWell = (p: HopPlan, i: number): WellBounds => p.kind === 'rotation' ? p.rotation!.start
    : i % 2 === 0 ? p.legs[i / 2].start : p.legs[(i - 1) / 2].target;
  const meanB2 = (p: HopPlan): (number | null)[] => p.stages.map((s, i) => {
    const w = stageWell(p, i);
    if (s.target.kind === 'at-rest' || !(s.target.energy > w.V)) return null;
    const r = meanSquareInputGain({ energy, accel: (q, v) => parts.conservative(q, v), inputGain: g, level: s.target.energy, q0: w.q }, { stepsPerPeriod: 2000 });
    if (r.status !== 'ok') { notes.push(`stage ${s.index}: no loss compensation (${r.message})`); return null; }
    return r.meanB2;
  });

  const documentFor = (uMax: number, margin: number): { design: ControllerDesign; plan: HopPlan } => {
    const plan = margin === margin0 ? plan0 : planFor(margin);
    const b2 = meanB2(plan);
    const stages: Stage[] = plan.stages.map((s, i) => ({ index: s.index, name: s.name, target: { ...s.target }, meanB2: b2[i] }));
    const Q = options.Q ?? R * (uMax / (gainBand * dE)) ** 2;
    const design: ControllerDesign = {
      format: DESIGN_FORMAT,
      version: DESIGN_VERSION,
      kind: 'well-hop',
      app: `ergostat ${APP_VERSION}`,
      source: options.source ?? 'energy model',
      model: {
        coordinate: model.coordinate,
        energy: parts.energy,
        units: model.units,
        lambda: model.lambda,
        acceleration: parts.acceleration,
        validRange: model.coverage ? { ...range.validRange } : knownRange(model, land, plan, '').validRange,
        wells: land.wells.map((w) => ({ index: w.index, q: w.q, energy: w.V })),
        barriers: land.barriers.map((b) => ({ q: b.q, energy: b.V, between: [b.between[0], b.between[1]] as [number, number] })),
      },
      input: { gain: g, unit: parts.unit },
      law: { Q, R, eps, lambda: model.lambda, uMax, rateMax: options.rateMax ?? null, integral: null, lossCompensation: true },
      sampleRateHz: rate,
      delaySamples: delay,
      stages,
      transitions: plan.transitions.map((t) => ({ from: t.from, to: t.to, when: { ...t.when }, reason: t.reason })),
      initialStage: plan.initialStage,
      cautions: [...SAFETY_CAUTIONS, SAFETY_DEFERENCE],
      checks: [],
    };
    return { design, plan };
  };

  const first = documentFor(uMax0, margin0);
  const design = first.design;
  const route = plan0.kind === 'rotation'
    ? `rotation from well ${from} at ${fmt(options.rotation!.speed)} rad/s over the top (H* = ${fmt(plan0.rotation!.energy)})${plan0.rotation!.turns ? `, back to rest after ${plan0.rotation!.turns} revolution(s)` : ''}`
    : `wells ${[plan0.legs[0].from, ...plan0.legs.map((l) => l.to)].join(' -> ')}, barriers ${plan0.legs.map((l) => fmt(l.highest)).join(', ')}, final level ${fmt(plan0.finalEnergy)}`;
  design.checks.push({ name: 'route', ok: true, detail: route });
  design.checks.push({ name: 'target in range', ok: true, detail: range.detail });
  for (const n of notes) design.checks.push({ name: 'loss compensation', ok: false, detail: n });

  let check: GridCheck | null = null, uSearch: SearchResult | null = null, mSearch: SearchResult | null = null;
  if (options.feasibility !== false) {
    const fo = options.feasibility ?? {};
    const target = plan0.kind === 'rotation' ? plan0.rotation!.start : plan0.legs[plan0.legs.length - 1].target;
    const settleTime = plan0.kind === 'rotation' && plan0.rotation!.turns === null
      ? 2 * Math.PI / options.rotation!.speed
      : wellPeriod(H, target) || 1;
    const grid = startGrid(startWell, H, fo.levels);
    // Time budget (a heuristic): the energy to move at a fifth of full power |b| u_max, three times over, plus settling.
    const work = plan0.kind === 'rotation' ? 2 * (plan0.rotation!.energy - startWell.V)
      : plan0.legs.reduce((s, l) => s + 2 * (l.highest - l.start.V) * (1 + margin0) + (l.highest - l.target.V), 0);
    const maxDuration = fo.maxDuration ?? Math.min(600, 3 * work / (0.2 * uMax0 * typicalB(energy, g, startWell, dE)) + 20 * settleTime);
    const problem: FeasibilityProblem = {
      build: (u, m) => {
        const d = documentFor(u, m);
        return { accel: parts.accel, controller: controllerFromDesign(d.design, { energy }), plan: d.plan, H };
      },
      grid, rateHz: rate, delaySamples: delay, maxDuration, settleTime,
    };
    check = checkCandidate(problem, uMax0, margin0);
    const n = check.runs.length;
    const good = check.runs.filter((r) => r.outcome.ok).length;
    const settled = check.runs.filter((r) => r.outcome.settled).length;
    const where = plan0.kind === 'rotation' ? 'reached the rotation' + (plan0.rotation!.turns ? ' and came back to rest' : '') : `were captured in well ${target.index}`;
    if (check.feasible) {
      design.checks.push({ name: 'feasibility', ok: true, detail: `feasible at u_max = ${fmt(uMax0)}${unit}, margin ${fmt(margin0)}: ${good}/${n} start states ${where} (${settled} settled within ${fmt(maxDuration)} s), ${check.simulations} simulations at ${fmt(rate)} Hz, delay ${delay}` });
    } else {
      const counts = new Map<string, number>();
      for (const r of check.runs) if (!r.outcome.ok) counts.set(r.outcome.status, (counts.get(r.outcome.status) ?? 0) + 1);
      const why = [...counts].map(([k, c]) => `${c} ${k}`).join(', ');
      let detail = `infeasible at u_max = ${fmt(uMax0)}${unit}, margin ${fmt(margin0)} (${n - good}/${n} start states failed: ${why}; ${check.simulations} simulations)`;
      if (fo.search !== false) {
        if (fo.search !== 'margin') {
          uSearch = searchUMax(problem, uMax0, margin0, { relTol: fo.relTol });
          detail += uSearch.found !== null
            ? `; feasible from u_max = ${fmtRound(uSearch.found, true)}${unit} (found by ${uSearch.method}, ${uSearch.simulations} simulations)`
            : `; no u_max up to ${fmt(uSearch.bound)}${unit} works (${uSearch.simulations} simulations)`;
        }
        if (plan0.kind === 'hop' && fo.search !== 'u_max') {
          mSearch = searchMargin(problem, uMax0, margin0, { relTol: fo.relTol });
          detail += mSearch.found !== null
            ? `; at u_max = ${fmt(uMax0)}${unit} a margin of ${fmtRound(mSearch.found, false)} works (found by ${mSearch.method}, ${mSearch.simulations} simulations)`
            : `; no margin down to ${fmt(mSearch.bound)} works at u_max = ${fmt(uMax0)}${unit} (${mSearch.simulations} simulations)`;
        }
      }
      design.checks.push({ name: 'feasibility', ok: false, detail });
    }
  } else {
    design.checks.push({ name: 'feasibility', ok: false, detail: 'not checked (feasibility: false)' });
  }
  // The document must read back as a valid design file (validate.ts), as every design does.
  return { design: readDesign(design, 'designWellHop'), plan: plan0, check, uMaxSearch: uSearch, marginSearch: mSearch };
}
