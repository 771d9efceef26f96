// Level-hold designer (issue 4, "The level-hold controller"; design.md §2 "SDRE on the energy
// coordinate"): from an energy model, a one-stage ControllerDesign that brings the rig to an
// energy level H* and holds it there.
// - Target: an energy; a swing amplitude A about the bottom of a well (H* = V(q_well + A),
//   V(q) = H(q, 0): the turning-point energy, design.md "Wells and hops"); or at rest (H* = the
//   well-bottom energy). The well is the one nearest the centre of the recorded range unless given.
//   Targets outside what the model knows are refused with the reason and the range (DesignRefusal).
// - Known range: the energies the recordings reached (model.coverage, robust extremes of H over
//   the free runs, engine/learn/coverage.ts). A target may lie up to COVERAGE_ALLOWANCE (5%) above
//   the recorded top: H is zero at the deepest well, so that is 5% of the recorded height, a small
//   extrapolation that also absorbs the recorded top being a percentile, slightly below the
//   highest swing (our choice); beyond it the design is refused. Model files without coverage (learned before it was
//   recorded) keep the range derived from the landscape: up to the highest barrier for angles,
//   the lower of V at the recorded ends for displacements; the check's detail says which applies.
// - Units: the law computes u in the input's physical unit, so a model per unit mass ('J/kg', no
//   mass, no forced run) is refused unless a mass (H is rescaled to joules, g = 1/m) or an input
//   gain g (acceleration per unit input) is given.
// - <b^2> on the orbit at H* by meanSquareInputGain on the model's own undamped equations of
//   motion (motion.ts), for the loss compensation u_ff = -lambda H* b / <b^2>.
// - Default weights (our choice, Bryson's rule): R = 1, Q = k^2 with k = sqrt(Q/R) = u_ref / z_sat:
//   the law asks for u_ref at an energy error z_sat = 15% of the level above the well bottom (of the
//   known depth of the well for a target at rest). u_ref = u_max when given, otherwise the input
//   that would move the energy by that level in one swing period T at the orbit's RMS authority,
//   E / (T sqrt(<b^2>)). At rest (no orbit) the orbit halfway up the known range of the well is
//   the reference for T and <b^2>.
// - eps (sign regularisation, unit of b) = 3 |g| M(q_well) sigma_v, with sigma_v the velocity noise
//   of a least-squares slope over the model's Savitzky-Golay window, sigma_q sqrt(12 / (N (N^2 - 1))) / dt
//   (N = 2 halfWindow + 1; standard error of a regression slope, common practice), but at least
//   1% of the reference orbit's RMS b.
// - Integral action (optional): Qw = Q / (2 T)^2, i.e. w = integral of z weighted like z held for
//   two periods; conditional anti-windup.
// - The check u_max vs losses: holding H* against damping needs on average the power |lambda H*|;
//   the loss-compensating input -lambda H* b / <b^2> has RMS |lambda H*| / sqrt(<b^2>) over the orbit.
//   Since any |u| <= u_max delivers at most u_max <|b|> <= u_max sqrt(<b^2>) (Cauchy-Schwarz), u_max
//   below that RMS cannot hold the level at all; the check reports it (ok = false), never hides it.
import type { EnergyModel } from '../engine/learn/index.ts';
import { modelEvaluator } from '../engine/learn/index.ts';
import { coverageEnergyFactor, termFromSpec } from '../engine/learn/model.ts';
import { termLabel } from '../engine/learn/library.ts';
import { meanSquareInputGain } from '../engine/control/index.ts';
import { SAFETY_CAUTIONS, SAFETY_DEFERENCE } from '../safety.ts';
import { APP_VERSION } from '../version.ts';
import { compileDesignEnergy } from './energy.ts';
import { motionFromEnergy } from './motion.ts';
import { DesignRefusal } from './refusal.ts';
import { readDesign } from './validate.ts';
import { DESIGN_FORMAT, DESIGN_VERSION, type ControllerDesign, type TargetSpec } from './types.ts';

export type LevelTargetRequest =
  | { kind: 'energy'; energy: number; well?: number }
  | { kind: 'amplitude'; amplitude: number; well?: number }
  | { kind: 'at-rest'; well?: number };

export interface LevelHoldOptions {
  target: LevelTargetRequest;
  /** Weights of z^2 and u^2; default from the target orbit (see the header). */
  weights?: { Q: number; R: number };
  /** |u| <= uMax in the input unit; null or absent = no limit. */
  uMax?: number | null;
  /** Controller sample rate, Hz. Default 1000. */
  rateHz?: number;
  /** Output delay in whole samples. Default 0. */
  delaySamples?: number;
  /** |du/dt| <= rateMax; null or absent = none. */
  rateMax?: number | null;
  /** Integral action (2x2 SDRE per sample). */
  integral?: boolean;
  /** Mass (kg) or moment of inertia (kg m^2) of the rig: H in joules, u a force or torque. */
  mass?: number;
  /** Input gain g (acceleration per unit input, v' = f + g u) for a model without mass. */
  inputGain?: number;
  /** Free text stored in design.source. */
  source?: string;
}

/** The default law reaches u_ref (u_max when given) at an energy error of this share of the level above the well bottom. */
export const SATURATION_BAND = 0.15;

/** A target may lie this share of the recorded top energy above it (models with coverage). */
export const COVERAGE_ALLOWANCE = 0.05;

const fmt = (x: number) => (Number.isFinite(x) ? Number(x.toPrecision(4)).toString() : String(x));

export function designLevelHold(model: EnergyModel, options: LevelHoldOptions): ControllerDesign {
  if (model === null || typeof model !== 'object') throw new TypeError('model: expected an EnergyModel');
  if (options === null || typeof options !== 'object') throw new TypeError('options: expected {target, ...}');
  const opt = checkOptions(options);
  if (model.status !== 'ok') throw new DesignRefusal(`the model holds no conserved energy (${model.verdict?.reason ?? model.status}); nothing to design on`);
  const angle = model.coordinate === 'angle';
  const checks: ControllerDesign['checks'] = [];

  // Calibration: the scale factor on H and the input gain g.
  let factor = 1, g: number, unit: string, units: 'J' | 'J/kg' = model.units, calibration: string;
  const modelMass = model.scale.mass;
  if (opt.mass !== undefined) {
    factor = model.units === 'J' && modelMass !== null ? opt.mass / modelMass : opt.mass;
    g = 1 / opt.mass; unit = angle ? 'N m' : 'N'; units = 'J';
    calibration = `mass ${fmt(opt.mass)} ${angle ? 'kg m^2' : 'kg'} given: H in joules, u in ${unit}, g = 1/m = ${fmt(g)}`
      + (model.units === 'J' && modelMass !== null ? ` (replaces the model's mass ${fmt(modelMass)})` : '');
  } else if (opt.inputGain !== undefined) {
    g = opt.inputGain; unit = 'input unit';
    calibration = `input gain g = ${fmt(g)} given: u in the input's unit, H in ${model.units}`;
  } else if (model.units === 'J' && modelMass !== null && modelMass > 0) {
    g = 1 / modelMass;
    unit = model.scale.massSource === 'forced-run' ? 'recorded input unit' : angle ? 'N m' : 'N';
    calibration = `model calibrated (${model.scale.massSource === 'forced-run' ? 'forced run' : 'mass given when learning'}): mass ${fmt(modelMass)}, g = ${fmt(g)}, u in ${unit}`;
  } else {
    throw new DesignRefusal('the model is not calibrated (energy per unit mass, no mass given, no forced run), and the law computes u in the input\'s physical unit: '
      + `give the rig's ${angle ? 'moment of inertia (--mass KG_M2)' : 'mass (--mass KG)'} or the input gain (--input-gain G, acceleration per unit input)`);
  }
  checks.push({ name: 'calibration', ok: true, detail: calibration });

  // The energy as an exact formula (shortest round-trip numbers) and as a function.
  const energy = energyFormula(model, factor);
  const H = compileDesignEnergy(energy, model.coordinate, model.lambda);
  crossCheck(model, factor, H.H);
  const V = (q: number) => H.H(q, 0);

  // Landscape and the range the model knows.
  const ls = model.landscape;
  if (!ls || ls.wells.length === 0) throw new DesignRefusal('the model has no potential well (its landscape V(q) = H(q, 0) has no minimum on the recorded range): there is no level to hold');
  const wells = ls.wells.map((w) => ({ index: w.index, q: w.q, energy: w.V * factor }));
  const barriers = ls.barriers.map((b) => ({ q: b.q, energy: b.V * factor, between: [b.between[0], b.between[1]] as [number, number] }));
  const cov = model.coverage;
  let energyMin: number, energyMax: number, rangeNote: string, validRange: ControllerDesign['model']['validRange'];
  /** Highest target accepted: the top of the known range, plus the allowance when it was recorded. */
  let limit: number;
  if (cov) {
    // Energies the recordings reached, in this design's units (the model's, times the mass factor).
    const f = coverageEnergyFactor(model) * factor;
    energyMin = cov.energyMin * f; energyMax = cov.energyMax * f;
    limit = energyMax + COVERAGE_ALLOWANCE * Math.abs(energyMax);
    const overTop = ls.periodic && barriers.length > 0 && energyMax >= Math.max(...barriers.map((b) => b.energy));
    const [qMin, qMax] = overTop || !(cov.qMax > cov.qMin) ? [ls.qMin, ls.qMax] : [cov.qMin, cov.qMax];
    validRange = { qMin, qMax, energyMin, energyMax };
    rangeNote = `the energies the recordings reached, 0.5th to 99.5th percentile per free run${overTop ? ', over the top' : ''}; targets up to ${COVERAGE_ALLOWANCE * 100}% above the top, ${fmt(limit)} ${units}, are accepted`;
  } else {
    energyMin = Math.min(...wells.map((w) => w.energy));
    const old = 'derived from the landscape: the model file does not record the energy range of its recordings (learned before coverage was recorded; learn again to record it)';
    if (ls.periodic) {
      energyMax = barriers.length ? Math.max(...barriers.map((b) => b.energy)) : maxOnGrid(V, -Math.PI, Math.PI);
      rangeNote = `librations up to the highest barrier, ${old}; rotations are not covered`;
    } else {
      energyMax = Math.min(V(ls.qMin), V(ls.qMax));
      rangeNote = `levels whose free swing stays inside the recorded positions ${fmt(ls.qMin)} .. ${fmt(ls.qMax)}, ${old}`;
    }
    limit = energyMax;
    validRange = { qMin: ls.qMin, qMax: ls.qMax, energyMin, energyMax };
  }
  const rangeText = `${fmt(energyMin)} .. ${fmt(energyMax)} ${units} (${rangeNote})`;

  // The well.
  const centre = 0.5 * (ls.qMin + ls.qMax);
  let well = wells.reduce((a, b) => (Math.abs(b.q - centre) < Math.abs(a.q - centre) ? b : a));
  const wantWell = opt.target.well;
  if (wantWell !== undefined) {
    if (!Number.isInteger(wantWell) || wantWell < 1 || wantWell > wells.length) throw new DesignRefusal(`well ${wantWell} does not exist: the model has ${wells.length} well${wells.length > 1 ? 's' : ''} (1..${wells.length}, from the most negative q)`);
    well = wells[wantWell - 1];
  }

  // Target energy.
  let target: TargetSpec;
  const t = opt.target;
  if (t.kind === 'energy') {
    target = { kind: 'energy', energy: t.energy };
  } else if (t.kind === 'amplitude') {
    const qT = well.q + t.amplitude;
    if (qT < ls.qMin || qT > ls.qMax) {
      throw new DesignRefusal(`the swing amplitude ${fmt(t.amplitude)} about the bottom of well ${well.index} (q = ${fmt(well.q)}) reaches q = ${fmt(qT)}, outside the recorded range ${fmt(ls.qMin)} .. ${fmt(ls.qMax)}: the model does not know the energy there`);
    }
    const lo = Math.min(well.q, qT), hi = Math.max(well.q, qT);
    const E = V(qT);
    const top = maxOnGrid(V, lo, hi);
    if (top > E * (1 + 1e-9) + 1e-12) throw new DesignRefusal(`a swing of amplitude ${fmt(t.amplitude)} about well ${well.index} would cross a barrier (V = ${fmt(top)} ${units} between q = ${fmt(well.q)} and q = ${fmt(qT)}, above V(q) = ${fmt(E)}): use a well hop`);
    // The swing must stay in the well: below the lowest barrier next to it (else its other turning point is beyond).
    const rim = barriers.filter((b) => b.between.includes(well.index)).reduce((a, b) => Math.min(a, b.energy), Infinity);
    if (E > rim * (1 + 1e-12) + 1e-15) throw new DesignRefusal(`a swing of amplitude ${fmt(t.amplitude)} about well ${well.index} has H* = V(${fmt(qT)}) = ${fmt(E)} ${units}, above the lowest barrier of that well (${fmt(rim)} ${units}): it would not stay in the well; use --target-energy for a swing over the barrier, or a well hop`);
    target = { kind: 'amplitude', amplitude: t.amplitude, energy: E };
  } else {
    target = { kind: 'at-rest', well: well.index, energy: well.energy };
  }
  const Hstar = target.energy;
  if (Hstar > limit * (1 + 1e-12) + 1e-15) {
    if (cov) {
      const what = target.kind === 'amplitude' ? ` (a swing of amplitude ${fmt(target.amplitude)}${angle ? ' rad' : ''} about well ${well.index})` : '';
      throw new DesignRefusal(`the target energy ${fmt(Hstar)} ${units}${what} is above what the model knows: the recordings reached ${fmt(energyMin)} .. ${fmt(energyMax)} ${units} `
        + `(0.5th to 99.5th percentile per free run), and a target may lie at most ${COVERAGE_ALLOWANCE * 100}% above that top (${fmt(limit)} ${units}); record swings up to that level, or choose a lower target`);
    }
    throw new DesignRefusal(`the target energy ${fmt(Hstar)} ${units} is above what the model knows: it covers ${rangeText}; lower the target or record larger swings`);
  }
  if (Hstar < well.energy - 1e-12 * Math.max(1, Math.abs(well.energy))) {
    throw new DesignRefusal(`the target energy ${fmt(Hstar)} ${units} is below the bottom of well ${well.index} (${fmt(well.energy)} ${units}): no state of that well has it; the model covers ${rangeText}`);
  }
  const beyond = cov && Hstar > energyMax ? ` (${fmt((100 * (Hstar - energyMax)) / Math.abs(energyMax))}% above the recorded top, inside the allowance)` : '';
  checks.push({ name: 'target in range', ok: true, detail: `H* = ${fmt(Hstar)} ${units} in well ${well.index} (bottom ${fmt(well.energy)} at q = ${fmt(well.q)})${beyond}; the model covers ${rangeText}` });

  // Equations of motion from H, the orbit at H*, the reference orbit.
  const qs = sampleQs(ls.qMin, ls.qMax, wells.map((w) => w.q));
  const motion = model.structure.separable
    ? motionFromEnergy(energy, model.lambda, g, qs)
    : `the model reports H is not separable (non-separable share ${fmt(model.structure.nonSeparableShare)})`;
  let acceleration: string | null = null;
  if (typeof motion === 'string') {
    checks.push({ name: 'equations of motion', ok: false, detail: `not derived: ${motion}; trials need --plant, and the loss compensation is off` });
  } else {
    acceleration = motion.acceleration;
    checks.push({ name: 'equations of motion', ok: true, detail: `from H = 1/2 M(q) v^2 + V(q): q'' = ${acceleration}` });
  }
  const orbit = (level: number) => typeof motion === 'string' ? null
    : meanSquareInputGain({ energy: H, accel: motion.undamped, inputGain: g, level, q0: well.q });
  let meanB2: number | null = null;
  let Tref = model.damping.period, bRef = NaN;
  let vAtBottom = NaN;
  if (target.kind !== 'at-rest' && Hstar > well.energy) {
    const o = orbit(Hstar);
    if (o && o.status === 'ok') {
      meanB2 = o.meanB2; Tref = o.period; bRef = Math.sqrt(o.meanB2); vAtBottom = o.v0;
      checks.push({ name: 'orbit average', ok: true, detail: `<b^2> = ${fmt(meanB2)} over the ${o.kind} at H* (period ${fmt(o.period)} s)` });
    } else {
      checks.push({ name: 'orbit average', ok: false, detail: o ? `<b^2> not computed: ${o.message}; the loss compensation is off` : '<b^2> not computed (no equations of motion); the loss compensation is off' });
    }
  }
  if (!(bRef > 0)) {
    const ref = well.energy + 0.5 * (Math.max(energyMax, well.energy) - well.energy);
    const o = ref > well.energy ? orbit(ref) : null;
    if (o && o.status === 'ok') { Tref = o.period; bRef = Math.sqrt(o.meanB2); }
    else {
      // Small-swing estimate: v at the bottom for half the known depth, b ~ |g| M v / sqrt(2).
      const Mw = typeof motion === 'string' ? 2 * (H.H(well.q, 1) - H.H(well.q, 0)) : motion.mass(well.q);
      bRef = Math.abs(g) * Mw * Math.sqrt(Math.max(2 * (ref - well.energy) / Mw, 0)) / Math.SQRT2;
    }
  }
  if (!(bRef > 0) || !(Tref > 0)) throw new DesignRefusal('the model gives no usable swing to scale the law on (no orbit above the well bottom inside the known range)');

  // Law parameters (Bryson's rule, Bryson & Ho, "Applied Optimal Control", 1975, §5.4, from memory:
  // R = 1/u_ref^2, Q = 1/z_sat^2, so sqrt(Q/R) = u_ref / z_sat).
  const eScale = Hstar - well.energy > 0 ? Hstar - well.energy : Math.max(energyMax - well.energy, 0);
  const zSat = SATURATION_BAND * (eScale > 0 ? eScale : Math.abs(Hstar) || 1);
  const uRef = opt.uMax ?? eScale / (Tref * bRef);
  const k = uRef > 0 ? uRef / zSat : 1 / (Tref * bRef);
  const Q = opt.weights?.Q ?? k * k, R = opt.weights?.R ?? 1;
  const Mwell = typeof motion === 'string' ? 2 * (H.H(well.q, 1) - H.H(well.q, 0)) : motion.mass(well.q);
  const N = 2 * Math.max(1, model.metrics.halfWindow) + 1;
  const sq = Number.isFinite(model.metrics.noiseSigma) && model.metrics.noiseSigma > 0 ? model.metrics.noiseSigma : 0;
  const sigmaV = (sq / model.metrics.dt) * Math.sqrt(12 / (N * (N * N - 1)));
  const eps = Math.max(3 * Math.abs(g) * Mwell * sigmaV, 0.01 * bRef);
  const lossCompensation = meanB2 !== null && model.lambda < 0;
  const uMax = opt.uMax ?? null;
  const law: ControllerDesign['law'] = {
    Q, R, eps, lambda: model.lambda, uMax, rateMax: opt.rateMax ?? null,
    integral: opt.integral ? { Qw: Q / (4 * Tref * Tref), antiWindup: 'conditional' } : null,
    lossCompensation,
  };
  checks.push({
    name: 'weights', ok: true,
    detail: opt.weights ? `given: Q = ${fmt(Q)}, R = ${fmt(R)}`
      : `default: R = 1, Q = ${fmt(Q)}: sqrt(Q/R) = u_ref / z_sat, the law asks for u_ref = ${fmt(uRef)} ${unit}${opt.uMax ? ' (u_max)' : ` (the input that moves the energy by ${fmt(eScale)} ${units} in one period of ${fmt(Tref)} s)`} at an energy error z_sat = ${fmt(zSat)} ${units} (${SATURATION_BAND * 100}% of the level above the well bottom); eps = ${fmt(eps)}`,
  });

  // Can u_max overcome the damping at H*?
  if (target.kind === 'at-rest' || !(model.lambda < 0) || Hstar === 0) {
    checks.push({ name: 'u_max vs losses', ok: true, detail: target.kind === 'at-rest' ? 'at rest no steady input is needed' : 'no damping losses to replace at the target' });
  } else if (meanB2 === null) {
    checks.push({ name: 'u_max vs losses', ok: false, detail: 'not checked: <b^2> at the target could not be computed' });
  } else {
    const loss = Math.abs(model.lambda * Hstar);
    const rms = loss / Math.sqrt(meanB2);
    const grad = new Float64Array(2);
    H.grad(well.q, vAtBottom, grad);
    const peak = loss * Math.abs(g * grad[1]) / meanB2;
    const base = `holding H* = ${fmt(Hstar)} ${units} against the losses (|lambda H*| = ${fmt(loss)} ${units}/s) needs a steady input of RMS ${fmt(rms)} ${unit} (peak ${fmt(peak)})`;
    if (uMax === null) checks.push({ name: 'u_max vs losses', ok: true, detail: `${base}; no u_max given` });
    else if (uMax < rms) checks.push({ name: 'u_max vs losses', ok: false, detail: `u_max = ${fmt(uMax)} ${unit} is too small to overcome the damping at the target: ${base}; raise u_max above ${fmt(rms)} (with room for the feedback) or lower the target` });
    else checks.push({ name: 'u_max vs losses', ok: true, detail: `${base}; u_max = ${fmt(uMax)} leaves ${fmt(uMax / rms)} times that${uMax < 2 * rms ? ' (little room for the feedback)' : ''}` });
  }
  const perPeriod = Tref * opt.rateHz;
  checks.push({ name: 'sample rate', ok: perPeriod >= 20, detail: `${fmt(perPeriod)} samples per swing period at ${fmt(opt.rateHz)} Hz${perPeriod < 20 ? ' (fewer than 20: the sampled law will lag the swing)' : ''}` });

  const design: ControllerDesign = {
    format: DESIGN_FORMAT, version: DESIGN_VERSION, kind: 'level-hold', app: `ergostat ${APP_VERSION}`,
    source: opt.source ?? 'energy model',
    model: { coordinate: model.coordinate, energy, units, lambda: model.lambda, acceleration, validRange, wells, barriers },
    input: { gain: g, unit },
    law,
    sampleRateHz: opt.rateHz, delaySamples: opt.delaySamples,
    stages: [{ index: 1, name: target.kind === 'at-rest' ? 'to rest' : 'level hold', target, meanB2 }],
    transitions: [], initialStage: 1,
    cautions: [...SAFETY_CAUTIONS, SAFETY_DEFERENCE],
    checks,
  };
  return readDesign(design, 'designLevelHold');
}

/** H * factor as a formula: offset + sum of coefficient * term, numbers in shortest round-trip form. */
export function energyFormula(model: Pick<EnergyModel, 'library' | 'coefficients' | 'offset'>, factor = 1): string {
  const parts: string[] = [];
  model.library.terms.forEach((spec, j) => {
    const c = model.coefficients[j] * factor;
    if (c === 0) return;
    parts.push(`${c < 0 ? '-' : '+'} ${String(Math.abs(c))}*${termLabel(termFromSpec(spec))}`);
  });
  const off = model.offset * factor;
  if (off !== 0) parts.push(`${off < 0 ? '-' : '+'} ${String(Math.abs(off))}`);
  if (parts.length === 0) return '0';
  const s = parts.join(' ');
  return s.startsWith('+ ') ? s.slice(2) : `-${s.slice(2)}`;
}

/** The formula must reproduce the model's own evaluator (times factor) to rounding. */
function crossCheck(model: EnergyModel, factor: number, H: (q: number, v: number) => number): void {
  const ev = modelEvaluator(model);
  const lo = model.landscape?.qMin ?? -1, hi = model.landscape?.qMax ?? 1;
  for (let i = 0; i <= 8; i++) {
    const q = lo + ((hi - lo) * i) / 8, v = (i - 4) * 0.37;
    const a = ev.H(q, v) * factor, b = H(q, v);
    if (!(Math.abs(a - b) <= 1e-9 * (Math.abs(a) + Math.abs(model.offset * factor) + 1e-300))) {
      throw new Error(`designLevelHold: the energy formula disagrees with the model at q = ${q}, v = ${v} (${b} vs ${a}); this is a bug`);
    }
  }
}

function maxOnGrid(f: (q: number) => number, lo: number, hi: number): number {
  let m = -Infinity;
  for (let i = 0; i <= 400; i++) m = Math.max(m, f(lo + ((hi - lo) * i) / 400));
  return m;
}

function sampleQs(lo: number, hi: number, extra: number[]): number[] {
  const qs = [...extra];
  for (let i = 0; i <= 16; i++) qs.push(lo + ((hi - lo) * i) / 16);
  return qs;
}

interface CheckedOptions {
  target: LevelTargetRequest; weights?: { Q: number; R: number }; uMax?: number | null; rateHz: number;
  delaySamples: number; rateMax?: number | null; integral: boolean; mass?: number; inputGain?: number; source?: string;
}

function checkOptions(o: LevelHoldOptions): CheckedOptions {
  const pos = (x: unknown, name: string) => {
    if (typeof x !== 'number' || !Number.isFinite(x) || !(x > 0)) throw new RangeError(`options.${name}: expected a positive finite number, got ${String(x)}`);
    return x;
  };
  const t = o.target;
  if (t === null || typeof t !== 'object') throw new TypeError('options.target: expected {kind: "energy" | "amplitude" | "at-rest", ...}');
  if (t.kind === 'energy') { if (!Number.isFinite(t.energy)) throw new RangeError(`options.target.energy: expected a finite energy, got ${t.energy}`); }
  else if (t.kind === 'amplitude') { if (!Number.isFinite(t.amplitude) || t.amplitude === 0) throw new RangeError(`options.target.amplitude: expected a finite non-zero amplitude, got ${t.amplitude}`); }
  else if (t.kind !== 'at-rest') throw new RangeError(`options.target.kind: expected "energy", "amplitude" or "at-rest", got ${String((t as { kind: unknown }).kind)}`);
  if (t.well !== undefined && (!Number.isInteger(t.well) || t.well < 1)) throw new RangeError(`options.target.well: expected a well index >= 1, got ${t.well}`);
  if (o.weights !== undefined) { pos(o.weights?.Q, 'weights.Q'); pos(o.weights?.R, 'weights.R'); }
  if (o.uMax !== undefined && o.uMax !== null) pos(o.uMax, 'uMax');
  if (o.rateMax !== undefined && o.rateMax !== null) pos(o.rateMax, 'rateMax');
  if (o.mass !== undefined) pos(o.mass, 'mass');
  if (o.inputGain !== undefined && (!Number.isFinite(o.inputGain) || o.inputGain === 0)) throw new RangeError(`options.inputGain: expected a finite non-zero number, got ${o.inputGain}`);
  if (o.mass !== undefined && o.inputGain !== undefined) throw new RangeError('options.mass, options.inputGain: give one or the other, not both');
  const rateHz = o.rateHz === undefined ? 1000 : pos(o.rateHz, 'rateHz');
  const delaySamples = o.delaySamples ?? 0;
  if (!Number.isInteger(delaySamples) || delaySamples < 0) throw new RangeError(`options.delaySamples: expected an integer >= 0, got ${delaySamples}`);
  return { ...o, rateHz, delaySamples, integral: o.integral === true };
}
