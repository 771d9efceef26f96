// Test vectors for an exported controller: the engine's own supervisor (design/supervisor.ts
// controllerFromDesign, which runs engine/control makeLevelHold per stage) stepped along a
// closed-loop trajectory, sample by sample from reset, recording exactly what it was given
// (t, q, v) and what it returned (u, with H and the stage). The trajectory comes from simulating
// the design's own plant formula (model.acceleration) or a given plant with classic RK4 at the
// controller's sample rate (engine/trial/simulate.ts, ideal sensing); without either it is a
// sweep of states across the valid range (an input sequence, not a motion).
// Where the measured velocity changes sign, the sample is fed v = 0 exactly, so the table holds
// samples with b = 0 (no authority), as a sensor reading at a turning point would give.
// A sample whose state lies within 1e-9 (relative) of a switching threshold is nudged off it, so
// that rounding differences between the engine and a port cannot decide a switch.
import type { ControllerDesign, SwitchCondition } from '../../design/types.ts';
import { controllerFromDesign, wrapAngle } from '../../design/supervisor.ts';
import { compileFormula } from '../../engine/formula/index.ts';
import { simulate } from '../../engine/trial/simulate.ts';
import type { Controller, TrialPlant } from '../../engine/trial/types.ts';

export interface VectorOptions {
  /** Plant to close the loop on; default: the design's model.acceleration. */
  plant?: TrialPlant;
  /**
   * Initial state. Default: a few candidates are tried (at rest, 10 % of the valid range to either
   * side of each well, or of the middle of the range) and the one whose table exercises the most
   * (switches, saturation, rate limit, b = 0) is kept.
   */
  q0?: number;
  v0?: number;
  /** Number of controller samples (rows). Default 3000. */
  samples?: number;
}

export interface VectorTable {
  t: Float64Array; q: Float64Array; v: Float64Array; u: Float64Array; H: Float64Array; stage: Int32Array;
  /** Where the states came from. */
  source: 'plant' | 'model-acceleration' | 'sweep';
  /** What the table exercises: rows at |u| = uMax, rows changed by the rate limit only, rows with b = 0, stage switches, rows whose CARE failed. */
  coverage: { rows: number; saturated: number; rateLimited: number; zeroB: number; switches: number; riccatiFailures: number; nudged: number };
}

function margin(c: SwitchCondition, q: number, v: number, h: number, angle: boolean): number {
  const qq = angle && c.wrapped === true ? wrapAngle(q) : q;
  let m = Infinity;
  const rel = (x: number, c0: number) => Math.abs(x - c0) / Math.max(1, Math.abs(c0));
  if (c.qAbove !== undefined) m = Math.min(m, rel(qq, c.qAbove));
  if (c.qBelow !== undefined) m = Math.min(m, rel(qq, c.qBelow));
  if (c.vSign !== undefined) m = Math.min(m, Math.abs(v) === 0 ? Infinity : Math.abs(v));
  if (c.energyAbove !== undefined) m = Math.min(m, rel(h, c.energyAbove));
  if (c.energyBelow !== undefined) m = Math.min(m, rel(h, c.energyBelow));
  return m;
}

/** The engine's test vectors for the design (see the header and VectorOptions). */
export function computeVectors(design: ControllerDesign, opts: VectorOptions = {}): VectorTable {
  if (opts.q0 !== undefined || opts.v0 !== undefined) return vectorsFrom(design, opts);
  const vr = design.model.validRange;
  const span = vr.qMax - vr.qMin;
  const centres = design.model.wells.length > 0 ? design.model.wells.slice(0, 4).map((w) => w.q) : [0.5 * (vr.qMin + vr.qMax)];
  let best: VectorTable | null = null, bestScore = -1;
  for (const c of centres) {
    for (const side of [1, -1]) {
      const tab = vectorsFrom(design, { ...opts, q0: c + side * 0.1 * span, v0: 0 });
      const k = tab.coverage;
      const score = [k.switches, k.saturated, k.rateLimited, k.zeroB].filter((x) => x > 0).length * 1e7 + Math.min(k.switches, 9) * 1e6 + k.rows;
      if (score > bestScore) { best = tab; bestScore = score; }
    }
  }
  return best as VectorTable;
}

function vectorsFrom(design: ControllerDesign, opts: VectorOptions): VectorTable {
  const samples = opts.samples ?? 3000;
  if (!Number.isInteger(samples) || samples < 2 || samples > 200_000) throw new RangeError(`options.samples: expected an integer from 2 to 200000, got ${samples}`);
  const sup = controllerFromDesign(design);
  const rate = design.sampleRateHz;
  const dt = 1 / rate;
  const angle = design.model.coordinate === 'angle';
  const vr = design.model.validRange;
  const span = vr.qMax - vr.qMin;
  const q0 = opts.q0 ?? 0.5 * (vr.qMin + vr.qMax) + 0.1 * span, v0 = opts.v0 ?? 0;
  if (!Number.isFinite(q0) || !Number.isFinite(v0)) throw new RangeError(`options.q0/v0: expected finite numbers, got ${q0}, ${v0}`);

  const tab = {
    t: new Float64Array(samples), q: new Float64Array(samples), v: new Float64Array(samples),
    u: new Float64Array(samples), H: new Float64Array(samples), stage: new Int32Array(samples),
  };
  const cov = { rows: 0, saturated: 0, rateLimited: 0, zeroB: 0, switches: 0, riccatiFailures: 0, nudged: 0 };
  const uMax = design.law.uMax ?? Infinity;
  const leaving = (st: number) => design.transitions.filter((tr) => tr.from === st);
  let row = 0;
  let vLast = NaN;

  function record(q: number, v: number, t: number): number {
    if (row >= samples) return 0;
    // A sign change of v: feed the turning point itself.
    if (row > 0 && v !== 0 && vLast !== 0 && Math.sign(v) !== Math.sign(vLast)) v = 0;
    // Keep clear of switching thresholds.
    for (let tries = 0; tries < 8; tries++) {
      const out = leaving(sup.stage());
      if (out.length === 0) break;
      const h = sup.energy.H(q, v);
      if (!out.some((tr) => margin(tr.when, q, v, h, angle) < 1e-9)) break;
      q += 1e-7 * Math.max(1, Math.abs(q)); v += 1e-7 * Math.max(1, Math.abs(v));
      cov.nudged++;
    }
    const before = sup.switches().length;
    const u = sup.step(q, v, t, dt);
    const last = sup.last;
    tab.t[row] = t; tab.q[row] = q; tab.v[row] = v; tab.u[row] = u;
    tab.H[row] = sup.energy.H(q, v); tab.stage[row] = sup.stage();
    if (Math.abs(u) === uMax) cov.saturated++;
    else if (last.saturated) cov.rateLimited++;
    if (last.b === 0) cov.zeroB++;
    if (!last.riccatiOk) cov.riccatiFailures++;
    cov.switches += sup.switches().length - before;
    vLast = v;
    row++;
    return u;
  }

  let source: VectorTable['source'];
  let plant = opts.plant;
  if (!plant && design.model.acceleration !== null) {
    const f = compileFormula(design.model.acceleration, ['q', 'v', 'u', 't']);
    const x = new Float64Array(4);
    plant = { coordinate: design.model.coordinate, accel(q, v, u, t) { x[0] = q; x[1] = v; x[2] = u; x[3] = t; return f.eval(x); } };
    source = 'model-acceleration';
  } else {
    source = plant ? 'plant' : 'sweep';
  }
  if (plant) {
    const ctl: Controller = { reset: () => sup.reset(), step: (q, v, t) => record(q, v, t), stage: () => sup.stage() };
    simulate({ plant, energy: sup.energy, controller: ctl, q0, v0, duration: samples / rate, rateHz: rate, estimator: { kind: 'ideal' } });
    // A diverged simulation stops early: the rows so far are still valid vectors.
  } else {
    sup.reset();
    // Sweep: an oscillation about the start with growing amplitude, 5 cycles over the table.
    const center = 0.5 * (vr.qMin + vr.qMax);
    const w = (2 * Math.PI * 5) / (samples * dt);
    for (let k = 0; k < samples; k++) {
      const t = k * dt;
      const a = (0.05 + 0.9 * (k / samples)) * 0.5 * span;
      record(center + a * Math.sin(w * t), a * w * Math.cos(w * t), t);
    }
  }
  cov.rows = row;
  const cut = <T extends Float64Array | Int32Array>(a: T): T => (row === samples ? a : (a.slice(0, row) as T));
  return { t: cut(tab.t), q: cut(tab.q), v: cut(tab.v), u: cut(tab.u), H: cut(tab.H), stage: cut(tab.stage), source, coverage: cov };
}
