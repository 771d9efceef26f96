// Well hops end to end (issue 5): designWellHop plans on an energy model, the design document
// runs through the supervisor (controllerFromDesign) and the trial simulator (engine/trial
// simulate) drives the plant — a plant written independently of the design's own equations
// (engine/plant built-ins or a formula plant), so the trial is not the planner's check replayed.
// Energy models here are written down analytically (tests/engine/plan/fixtures.ts), not learned.
import { describe, expect, it } from 'vitest';
import { designWellHop, designWellHopDetailed } from '../../src-main/design/hop.ts';
import { controllerFromDesign } from '../../src-main/design/supervisor.ts';
import { readDesign } from '../../src-main/design/validate.ts';
import { builtinPlant, compilePlant } from '../../src-main/engine/plant/index.ts';
import { startGrid, wellBounds } from '../../src-main/engine/plan/index.ts';
import { simulate } from '../../src-main/engine/trial/simulate.ts';
import { Pcg32 } from '../../src-main/engine/signal/random.ts';
import type { TrialPlant } from '../../src-main/engine/trial/types.ts';
import type { ControllerDesign } from '../../src-main/design/types.ts';
import { DesignRefusal } from '../../src-main/design/refusal.ts';
import { analyticModel, doubleWellModel, pendulumModel } from '../engine/plan/fixtures.ts';

/** One trial of a design on a plant from (q0, v0): the trace, the supervisor's switch log. */
function trial(design: ControllerDesign, plant: TrialPlant, q0: number, v0: number, duration: number, rateHz = design.sampleRateHz) {
  const sup = controllerFromDesign(design);
  const r = simulate({ plant, energy: sup.energy, controller: sup, q0, v0, duration, rateHz, estimator: { kind: 'ideal' } });
  expect(r.status).toBe('ok');
  return { ...r, switches: sup.switches() };
}

/** Rows where the recorded stage changes, with q and v there. */
function stageChanges(tr: { stage?: Float64Array; q: Float64Array; v: Float64Array }) {
  const out: { row: number; from: number; to: number; q: number; v: number }[] = [];
  for (let k = 1; k < tr.q.length; k++) if (tr.stage![k] !== tr.stage![k - 1]) out.push({ row: k, from: tr.stage![k - 1], to: tr.stage![k], q: tr.q[k], v: tr.v[k] });
  return out;
}

describe('double-well Duffing hop (H = v^2/2 - a q^2/2 + b q^4/4, a = b = 1)', () => {
  // Wells at q = +-1 (V = -1/4 in the plant's energy), saddle at 0 (V = 0): references.md, Duffing double well.
  const model = doubleWellModel(1, 1, 0.02);
  const plant = builtinPlant('double-well', { m: 1, a: 1, b: 1, c: 0.02 });
  const trueH = (q: number, v: number) => plant.energy!(q, v) + 0.25; // zero at the well bottoms, 1/4 at the saddle
  const opts = { uMax: 0.2, sampleRateHz: 100, feasibility: { levels: [0.3, 0.7] } };

  for (const [from, to, side] of [[1, 2, 1], [2, 1, -1]] as const) {
    it(`goes from every state of a grid in well ${from} to rest in well ${to}, switching only inside well ${to}`, () => {
      const design = designWellHop(model, { ...opts, fromWell: from, toWell: to });
      expect(design.kind).toBe('well-hop');
      expect(design.checks.find((c) => c.name === 'feasibility')).toMatchObject({ ok: true });
      expect(readDesign(JSON.parse(JSON.stringify(design)), 'design.json').stages).toHaveLength(2); // a valid design file
      // The trial grid (ours, not the planner's): positions across well `from`, three speeds.
      let n = 0;
      for (const qa of [1.6, 1.3, 1.0, 0.7, 0.3]) { // |q|; 4 x 3 minus the equilibrium and states above the barrier
        for (const v0 of [-0.5, 0, 0.5]) {
          const q0 = -side * qa;
          if (!(trueH(q0, v0) < 0.25) || (qa === 1 && v0 === 0)) continue; // inside the well; not the equilibrium (b = 0 there)
          n++;
          const r = trial(design, plant, q0, v0, 30);
          const ch = stageChanges(r.trace);
          expect(ch.map((c) => [c.from, c.to])).toEqual([[1, 2]]);
          expect(ch[0].q * side).toBeGreaterThan(0); // past the saddle, inside the target well
          expect(ch[0].q * side).toBeLessThan(1.0);
          expect(ch[0].v * side).toBeGreaterThan(0); // heading in
          expect(r.switches[0].t).toBe(r.trace.t[ch[0].row]);
          for (let k = ch[0].row; k < r.trace.q.length; k++) expect(r.trace.q[k] * side).toBeGreaterThan(0); // never back over the barrier
          expect(r.final.q * side).toBeGreaterThan(0.8);
          expect(trueH(r.final.q, r.final.v)).toBeLessThan(0.02 * 0.25); // at rest: within 2% of the barrier height
        }
      }
      expect(n).toBe(9);
    });
  }

  it('still hops with a quantized, noisy sensor, one sample of delay and the filtered-difference velocity', () => {
    const design = designWellHop(model, { ...opts, sampleRateHz: 200, delaySamples: 1, fromWell: 1, toWell: 2 });
    expect(design.checks.find((c) => c.name === 'feasibility')).toMatchObject({ ok: true });
    for (const [q0, v0, seed] of [[-1.3, 0, 7], [-0.7, 0.3, 8]]) {
      const sup = controllerFromDesign(design);
      const rng = new Pcg32(seed, 1);
      const r = simulate({
        plant, energy: sup.energy, controller: sup, q0, v0, duration: 40, rateHz: 200, delaySamples: 1,
        sensor: { step: 1e-3, noiseStd: 3e-4 }, random: () => rng.uniform(), // default estimator: filtered difference, 10 Hz
      });
      const ch = stageChanges(r.trace);
      expect(ch.map((c) => [c.from, c.to])).toEqual([[1, 2]]);
      expect(ch[0].q).toBeGreaterThan(0);
      expect(r.final.q).toBeGreaterThan(0.8);
      expect(trueH(r.final.q, r.final.v)).toBeLessThan(0.02 * 0.25);
    }
  });

  it('ends at a requested level (an energy) inside the target well', () => {
    const design = designWellHop(model, { ...opts, fromWell: 1, toWell: 2, level: { kind: 'energy', energy: 0.1 }, feasibility: false });
    const r = trial(design, plant, -1.3, 0, 50);
    const tr = r.trace;
    let s = 0, m = 0, qMin = Infinity;
    for (let k = tr.t.length - 2000; k < tr.t.length; k++) { s += trueH(tr.q[k], tr.v[k]); m++; qMin = Math.min(qMin, tr.q[k]); }
    expect(Math.abs(s / m - 0.1)).toBeLessThan(0.005); // mean over the last 10 s within 5% of the target
    expect(qMin).toBeGreaterThan(0); // and held inside well 2
  });
});

describe('asymmetric three-well plant written as a formula', () => {
  // V'(q) = (q + 1.5)(q + 0.7)(q - 0.1)(q - 0.9)(q - 1.6): wells at -1.5, 0.1, 1.6 and barriers at
  // -0.7, 0.9 by construction (closed form); V is its integral with V(0) = 0, shifted so the deepest well is 0.
  const roots = [-1.5, -0.7, 0.1, 0.9, 1.6];
  let dV = [1];
  for (const r of roots) { const p = new Array(dV.length + 1).fill(0); dV.forEach((c, i) => { p[i + 1] += c; p[i] -= r * c; }); dV = p; }
  const Vc = [0, ...dV.map((c, i) => c / (i + 1))]; // ascending powers
  const Vraw = (q: number) => Vc.reduceRight((acc, c) => acc * q + c, 0); // Horner
  const offset = -Math.min(Vraw(-1.5), Vraw(0.1), Vraw(1.6));
  const V = (q: number) => Vraw(q) + offset;
  const model = analyticModel({
    coordinate: 'linear',
    terms: [{ kind: 'mono', a: 0, b: 2 }, ...Vc.slice(1).map((_, i) => ({ kind: 'mono' as const, a: i + 1, b: 0 }))],
    coefficients: [0.5, ...Vc.slice(1)], offset, lambda: -0.02, range: [-2.2, 2.3],
  });
  const dVformula = dV.map((c, i) => `${c}*q^${i}`).join(' + ');
  const plant = compilePlant({ coordinate: 'linear', acceleration: `-(${dVformula}) - c*v + u/m`, params: { c: 0.02, m: 1 } }, 'three-well');

  it("finds the wells and barriers at the potential's critical points, energies within 0.5%", () => {
    const design = designWellHop(model, { fromWell: 1, toWell: 3, uMax: 0.3, feasibility: false });
    const wells = design.model.wells, barriers = design.model.barriers;
    expect(wells.map((w) => w.index)).toEqual([1, 2, 3]);
    const scale = Math.min(V(-0.7), V(0.9)); // the lower barrier: the tolerance's scale for the zero-energy well
    for (const [k, r] of [roots[0], roots[2], roots[4]].entries()) {
      expect(wells[k].q).toBeCloseTo(r, 6);
      expect(Math.abs(wells[k].energy - V(r))).toBeLessThanOrEqual(0.005 * Math.max(Math.abs(V(r)), scale));
    }
    for (const [k, r] of [roots[1], roots[3]].entries()) {
      expect(barriers[k].q).toBeCloseTo(r, 6);
      expect(Math.abs(barriers[k].energy - V(r)) / V(r)).toBeLessThanOrEqual(0.005);
      expect(barriers[k].between).toEqual([k + 1, k + 2]);
    }
  });

  it('makes a two-hop move from well 1 to rest in well 3 through well 2', () => {
    const { design, check } = designWellHopDetailed(model, { fromWell: 1, toWell: 3, uMax: 0.3, sampleRateHz: 100, feasibility: { levels: [0.3, 0.7] } });
    expect(check!.feasible).toBe(true);
    expect(design.stages.map((s) => s.target.kind)).toEqual(['energy', 'at-rest', 'energy', 'at-rest']);
    for (const [q0, v0] of [[-1.8, 0], [-1.2, 0], [-1.5, 0.6], [-1.5, -0.6]]) {
      const r = trial(design, plant, q0, v0, 45);
      const ch = stageChanges(r.trace);
      expect(ch.map((c) => [c.from, c.to])).toEqual([[1, 2], [2, 3], [3, 4]]);
      expect(ch[0].q).toBeGreaterThan(-0.7); // first switch inside well 2 (between the barriers)
      expect(ch[0].q).toBeLessThan(0.9);
      expect(ch[1].q).toBeGreaterThan(-0.7); // captured in well 2
      expect(ch[1].q).toBeLessThan(0.9);
      expect(ch[2].q).toBeGreaterThan(0.9); // second switch inside well 3
      for (let k = ch[2].row; k < r.trace.q.length; k++) expect(r.trace.q[k]).toBeGreaterThan(0.9);
      expect(r.final.q).toBeGreaterThan(1.2);
      expect(V(r.final.q) + r.final.v ** 2 / 2 - V(1.6)).toBeLessThan(0.02 * (V(0.9) - V(1.6)));
    }
  });
});

describe('two wells on a circle (angle coordinate, periodic copies)', () => {
  // V(q) = (1 - cos 2q) + 0.3 (1 - cos q), unit inertia: wells at 0 (V = 0) and pi (V = 0.6), barriers where
  // cos q = -0.075 (V' = sin q (4 cos q + 0.3) = 0), V = 2 - 2(0.075)^2 + 0.3 * 1.075 (trigonometry).
  const model = analyticModel({
    coordinate: 'angle', terms: [{ kind: 'mono', a: 0, b: 2 }, { kind: 'trig', fn: 'cos', k: 2, b: 0 }, { kind: 'trig', fn: 'cos', k: 1, b: 0 }],
    coefficients: [0.5, -1, -0.3], offset: 1.3, lambda: -0.03, range: [-Math.PI, Math.PI],
  });
  const plant = compilePlant({ coordinate: 'angle', acceleration: '-2*sin(2*q) - 0.3*sin(q) - c*v + u', params: { c: 0.03 } }, 'two-well circle');
  const qb = Math.acos(-0.075), Vb = 2 - 2 * 0.075 ** 2 + 0.3 * 1.075;

  it('hops from the well at 0 into a copy of the other well at +-pi, over whichever barrier the rig meets', () => {
    const land = model.landscape!;
    expect(land.wells.map((w) => w.q)).toEqual([expect.closeTo(-Math.PI, 6), expect.closeTo(0, 6)]);
    expect(land.barriers.map((b) => b.V)).toEqual([expect.closeTo(Vb, 9), expect.closeTo(Vb, 9)]);
    const design = designWellHop(model, { from: { q: 0.3, v: 0 }, toWell: 1, uMax: 0.5, sampleRateHz: 200, feasibility: { levels: [0.3, 0.7] } });
    expect(design.checks.find((c) => c.name === 'feasibility')).toMatchObject({ ok: true });
    // On the wrapped angle, entering the other well over either barrier (the rig may leave its well either way).
    const qs = qb + 0.1 * (Math.PI - qb);
    expect(design.transitions.map((t) => t.when)).toEqual([
      { qAbove: expect.closeTo(qs, 6), qBelow: expect.closeTo(Math.PI, 6), vSign: 1, wrapped: true },
      { qAbove: expect.closeTo(-Math.PI, 6), qBelow: expect.closeTo(-qs, 6), vSign: -1, wrapped: true },
    ]);
    const sides = new Set<number>();
    for (const [q0, v0] of [[0.3, 0], [-0.3, 0], [0, 1.2], [0, -1.2]]) {
      const r = trial(design, plant, q0, v0, 40);
      const ch = stageChanges(r.trace);
      expect(ch.map((c) => [c.from, c.to])).toEqual([[1, 2]]);
      expect(Math.abs(ch[0].q)).toBeGreaterThan(qb); // past a barrier (the rig starts in [-pi, pi), so unwrapped = wrapped here)
      expect(Math.abs(ch[0].q)).toBeLessThan(Math.PI);
      expect(Math.sign(ch[0].v)).toBe(Math.sign(ch[0].q)); // heading into the well
      sides.add(Math.sign(ch[0].q));
      expect(Math.cos(r.final.q)).toBeLessThan(Math.cos(0.2 - Math.PI)); // within 0.2 rad of a copy of q = pi
      expect(0.5 * r.final.v ** 2 + (1 - Math.cos(2 * r.final.q)) + 0.3 * (1 - Math.cos(r.final.q)) - 0.6).toBeLessThan(0.02 * (Vb - 0.6));
    }
    expect(sides).toEqual(new Set([1, -1])); // both ways round occurred
  });
});

describe('pendulum: rest -> rotation at a given speed -> rest, under a torque limit', () => {
  // m = 0.5 kg, l = 0.42 m, c = 0.05 1/s (the built-in pendulum); torque limit 0.3 N m, 15% of m g l:
  // the swing-up needs several swings (Astrom & Furuta 2000, references.md §6: one swing is not enough below n = 4/3).
  const m = 0.5, l = 0.42, g = 9.81, I = m * l * l, MGL = m * g * l;
  const plant = builtinPlant('pendulum');
  const trueH = (q: number, v: number) => (I * v * v) / 2 + MGL * (1 - Math.cos(q)); // elementary mechanics
  const speed = 3, turns = 6, uMax = 0.3;

  it('spins up to the speed over the top, turns, and comes back to rest', () => {
    const design = designWellHop(pendulumModel(m, l, g, 0.05), { rotation: { speed, turns }, uMax, sampleRateHz: 500, feasibility: { levels: [0.05, 0.5] } });
    expect(design.checks.find((c) => c.name === 'feasibility')).toMatchObject({ ok: true });
    expect(design.stages[0].target).toMatchObject({ kind: 'rotation', speed });
    expect(design.stages[0].target.energy).toBeCloseTo((I * speed * speed) / 2 + 2 * MGL, 9);
    // From rest, nudged by 0.05 rad: at exact rest b = 0 and no energy law can act (references.md §6, remark).
    const r = trial(design, plant, 0.05, 0, 40);
    const tr = r.trace;
    let peak = 0;
    for (const u of tr.u) peak = Math.max(peak, Math.abs(u));
    expect(peak).toBeLessThanOrEqual(uMax + 1e-12);
    const ch = stageChanges(tr);
    expect(ch.map((c) => [c.from, c.to])).toEqual([[1, 2]]);
    expect(Math.abs(ch[0].q)).toBeGreaterThan(turns * 2 * Math.PI);
    // Speed over the top: |v| where the unwrapped angle crosses an odd multiple of pi (linear interpolation).
    const tops: number[] = [];
    for (let k = 1; k < ch[0].row; k++) {
      const a = Math.floor((tr.q[k - 1] - Math.PI) / (2 * Math.PI)), b = Math.floor((tr.q[k] - Math.PI) / (2 * Math.PI));
      if (a !== b) {
        const qc = (2 * Math.max(a, b) + 1) * Math.PI;
        const s = (qc - tr.q[k - 1]) / (tr.q[k] - tr.q[k - 1]);
        tops.push(Math.abs(tr.v[k - 1] + s * (tr.v[k] - tr.v[k - 1])));
      }
    }
    expect(tops.length).toBeGreaterThanOrEqual(turns);
    for (const w of tops.slice(-3)) expect(Math.abs(w - speed) / speed).toBeLessThan(0.05);
    expect(trueH(r.final.q, r.final.v)).toBeLessThan(0.02 * 2 * MGL); // back at rest (within 2% of the top's energy)
  });
});

describe('an infeasible hop (u_max too small)', () => {
  // Tilted double well V = -q^2/2 + q^4/4 + 0.3 q (m = 1): a deep, wide well 1 and a shallow, narrow
  // well 2; a 30% margin over the barrier is too much to bleed inside well 2 with a small u_max.
  const s = 0.3;
  const model = analyticModel({
    coordinate: 'linear', terms: [{ kind: 'mono', a: 0, b: 2 }, { kind: 'mono', a: 2, b: 0 }, { kind: 'mono', a: 4, b: 0 }, { kind: 'mono', a: 1, b: 0 }],
    coefficients: [0.5, -0.5, 0.25, s], offset: 0, lambda: -0.02, range: [-2.5, 2.5],
  });
  const plant = compilePlant({ coordinate: 'linear', acceleration: 'q - q^3 - s - c*v + u', params: { s, c: 0.02 } }, 'tilted');
  const opts = { fromWell: 1, toWell: 2, margin: 0.3, sampleRateHz: 100 } as const;

  it('reports the u_max the search finds sufficient, and a trial at that u_max succeeds', () => {
    const res = designWellHopDetailed(model, { ...opts, uMax: 0.05, feasibility: { levels: [0.3, 0.7], search: 'u_max', relTol: 0.2 } });
    const check = res.design.checks.find((c) => c.name === 'feasibility')!;
    expect(check.ok).toBe(false);
    const found = res.uMaxSearch!.found!;
    expect(found).toBeGreaterThan(0.05);
    expect(res.uMaxSearch!.bound).toBeLessThan(found);
    expect(check.detail).toMatch(/^infeasible at u_max = 0\.05 N, margin 0\.3 \(\d+\/8 start states failed: .*returned.*; feasible from u_max = [\d.]+ N \(found by doubling, then bisection, \d+ simulations\)$/);
    const printed = Number(/feasible from u_max = ([\d.]+) N/.exec(check.detail)![1]);
    expect(printed).toBeGreaterThanOrEqual(found);
    expect(printed).toBeLessThan(found * 1.001);

    // Trials on the formula plant at the reported u_max, from the planner's start grid and at the
    // given u_max from the same states: the first all end at rest in well 2, the second do not all.
    const good = designWellHop(model, { ...opts, uMax: printed, feasibility: false });
    const bad = designWellHop(model, { ...opts, uMax: 0.05, feasibility: false });
    const w2 = wellBounds(model.landscape!, 2);
    const grid = startGrid(wellBounds(model.landscape!, 1), (q, v) => v * v / 2 + model.offset + q * (s + q * (-0.5 + 0.25 * q * q)), [0.3, 0.7]);
    let failedAtSmall = 0;
    for (const st of grid) {
      const r = trial(good, plant, st.q, st.v, 40);
      const ch = stageChanges(r.trace);
      expect(ch.map((c) => [c.from, c.to])).toEqual([[1, 2]]);
      expect(ch[0].q).toBeGreaterThan(w2.left!.q);
      for (let k = ch[0].row; k < r.trace.q.length; k++) expect(r.trace.q[k]).toBeGreaterThan(w2.left!.q);
      const b = trial(bad, plant, st.q, st.v, 40);
      if (b.final.q < w2.left!.q) failedAtSmall++;
    }
    expect(failedAtSmall).toBeGreaterThan(0);
  });

  it('also finds a margin that works at the given u_max', () => {
    const res = designWellHopDetailed(model, { ...opts, uMax: 0.05, feasibility: { levels: [0.3, 0.7], search: 'margin', relTol: 0.3 } });
    const m = res.marginSearch!.found!;
    expect(m).toBeGreaterThan(0);
    expect(m).toBeLessThan(0.3);
    expect(res.design.checks.find((c) => c.name === 'feasibility')!.detail).toMatch(/at u_max = 0\.05 N a margin of [\d.]+ works \(found by bisection, \d+ simulations\)/);
  });
});

describe('designWellHop against the energy range the recordings covered', () => {
  // Double well a = b = 1: wells at +-1 with V = 0, barrier 1/4 at q = 0 (references.md, Duffing double well).
  const withCoverage = (energyMax: number) => {
    const m = doubleWellModel();
    m.coverage = { energyMin: 0.02, energyMax, qMin: -1.6, qMax: 1.6, vMaxAbs: 0.8, joulesPerModelUnit: 1 };
    return m;
  };
  const refused = (f: () => unknown): string => {
    try { f(); } catch (e) { expect(e).toBeInstanceOf(DesignRefusal); return (e as Error).message; }
    throw new Error('expected a refusal');
  };

  it('refuses a hop over a barrier the recordings never crossed, naming the barrier and the range', () => {
    const msg = refused(() => designWellHop(withCoverage(0.2), { fromWell: 1, toWell: 2, uMax: 0.2, feasibility: false }));
    expect(msg).toBe('the hop from well 1 to well 2 must raise the energy over the barrier at H = 0.25 J, but the recordings reached 0.02 .. 0.2 J '
      + '(0.5th to 99.5th percentile per free run): the model has never seen that energy; record free swings over that barrier (runs that pass from well 1 to well 2) and learn again');
  });

  it('allows the raise stage its margin above the barrier once the recordings crossed it', () => {
    // Recorded top 0.26 just over the barrier; stage 1 raises to 0.25 + 0.1 * 0.25 = 0.275, above 0.26 * 1.05 = 0.273.
    const d = designWellHop(withCoverage(0.26), { fromWell: 1, toWell: 2, uMax: 0.2, feasibility: false });
    expect(d.stages[0].target.energy).toBeCloseTo(0.275, 12);
    expect(d.model.validRange).toEqual({ qMin: -1.6, qMax: 1.6, energyMin: 0.02, energyMax: 0.26 });
    expect(d.checks.find((c) => c.name === 'target in range')!.detail).toMatch(/the barrier crossed \(H = 0\.25\) lies inside them, so the raise stage may target its margin above it/);
  });

  it('rescales the recorded energies when H was rescaled after learning (as the CLI does for --mass)', () => {
    // H doubled (mass 2 given to a unit-mass model): barrier 0.5; the range recorded at scale 1 up to 0.3 reads as 0.6.
    const m = analyticModel({
      coordinate: 'linear', terms: [{ kind: 'mono', a: 0, b: 2 }, { kind: 'mono', a: 2, b: 0 }, { kind: 'mono', a: 4, b: 0 }],
      coefficients: [1, -1, 0.5], offset: 0.5, lambda: -0.02, range: [-2, 2],
    });
    m.scale = { ...m.scale, joulesPerModelUnit: 2 };
    m.coverage = { energyMin: 0.02, energyMax: 0.3, qMin: -1.6, qMax: 1.6, vMaxAbs: 0.8, joulesPerModelUnit: 1 };
    const d = designWellHop(m, { fromWell: 1, toWell: 2, uMax: 0.4, feasibility: false });
    expect(d.model.validRange.energyMax).toBeCloseTo(0.6, 14);
    expect(d.model.validRange.energyMin).toBeCloseTo(0.04, 14);
  });

  it('refuses a rotation faster than the recordings went over the top, or any rotation when they never did', () => {
    const m = 0.5, l = 0.42, g = 9.81, I = m * l * l, MGL = m * g * l;
    // The pendulum's top is 2 m g l (elementary mechanics); recorded up to 2.2 m g l (a run just over the top).
    const model = pendulumModel(m, l, g, 0.05);
    model.coverage = { energyMin: 0, energyMax: 2.2 * MGL, qMin: -3.1, qMax: 3.1, vMaxAbs: 8, joulesPerModelUnit: 1 };
    // 3 rad/s over the top: H* = I 9/2 + 2 m g l = 4.52 J, below 1.05 * 2.2 m g l = 4.76 J.
    const ok = designWellHop(model, { rotation: { speed: 3, turns: null }, uMax: 0.3, feasibility: false });
    expect(ok.model.validRange).toEqual({ qMin: -Math.PI, qMax: Math.PI, energyMin: 0, energyMax: 2.2 * MGL });
    // 6 rad/s: H* = I 36/2 + 2 m g l = 5.71 J, above it.
    expect(refused(() => designWellHop(model, { rotation: { speed: 6, turns: null }, uMax: 0.3, feasibility: false })))
      .toContain(`stage 1 (rotate (6 rad/s over the top)) targets H = ${Number((18 * I + 2 * MGL).toPrecision(4))} J, above what the model knows`);
    model.coverage = { ...model.coverage, energyMax: 1.5 * MGL, qMin: -2, qMax: 2 };
    expect(refused(() => designWellHop(model, { rotation: { speed: 3, turns: 2 }, uMax: 0.3, feasibility: false })))
      .toMatch(/^a rotation passes the top of the circle at H = 4\.12 J, but the recordings reached 0 \.\. 3\.09 J .*record a free run over the top/);
  });

  it('plans a model file without a recorded range as before, and says the range was not checked', () => {
    const d = designWellHop(doubleWellModel(), { fromWell: 1, toWell: 2, uMax: 0.2, feasibility: false });
    expect(d.model.validRange).toEqual({ qMin: -2, qMax: 2, energyMin: expect.closeTo(0, 12), energyMax: expect.closeTo(0.275, 12) });
    expect(d.checks.find((c) => c.name === 'target in range')!.detail).toMatch(/^not checked against the recordings: the model file does not record the energy range/);
  });
});

describe('designWellHop argument checks', () => {
  const model = doubleWellModel();
  it('names the bad argument', () => {
    expect(() => designWellHop(model, { toWell: 2, uMax: 0 })).toThrow(/options.uMax: expected a positive finite number, got 0/);
    expect(() => designWellHop(model, { toWell: 3, uMax: 1, feasibility: false })).toThrow(/to: expected a well number 1..2, got 3/);
    expect(() => designWellHop(model, { uMax: 1 })).toThrow(/exactly one of toWell/);
    expect(() => designWellHop(model, { toWell: 2, uMax: 1, level: { kind: 'energy', energy: 0.5 }, feasibility: false })).toThrow(/level.energy: 0.5 is not inside well 2/);
    expect(() => designWellHop({ ...model, landscape: null }, { toWell: 2, uMax: 1 })).toThrow(/model.landscape: missing/);
    expect(() => designWellHop(model, { toWell: 2, uMax: 1, from: { q: 0.9, v: 2 } })).toThrow(/options.from: the state/);
  });
});
