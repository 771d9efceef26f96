// readDesign: checks a design.json document (docs/design-format.md) field by field and returns a
// fresh, typed copy. Design files come from other people and other tools, so nothing is trusted:
// every number must be finite (and in its range), every formula goes through our parser
// (engine/formula) and must mention only its allowed variables, stage numbers must be 1, 2, ...
// in order, transitions and the initial stage must name existing stages, barriers existing wells,
// and no unknown field is accepted. The first problem found is thrown as a DesignError whose
// message starts with the path of the field, e.g. `design.json: law.R: expected a positive number, got 0`.
import { compileFormula } from '../engine/formula/index.ts';
import type { Coordinate } from '../engine/types.ts';
import {
  DESIGN_FORMAT, DESIGN_VERSION,
  type ControllerDesign, type LawParameters, type Stage, type SwitchCondition, type TargetSpec, type Transition,
} from './types.ts';
import { compileDesignEnergy } from './energy.ts';

export class DesignError extends Error {
  override name = 'DesignError';
  /** Path of the offending field, e.g. "stages[1].target.energy" ('' for the document itself). */
  readonly field: string;
  constructor(where: string, field: string, message: string) {
    super(`${where}: ${field ? `${field}: ` : ''}${message}`);
    this.field = field;
  }
}

/** Limits on sizes, so that a hostile file cannot make us allocate or loop without bound. */
export const DESIGN_LIMITS = { stages: 64, transitions: 256, wells: 256, cautions: 64, checks: 256, text: 4000 } as const;

type Obj = Record<string, unknown>;

export function readDesign(json: unknown, where: string): ControllerDesign {
  const fail = (field: string, message: string): never => { throw new DesignError(where, field, message); };
  const show = (x: unknown): string => {
    if (x === undefined) return 'nothing';
    const s = JSON.stringify(x);
    return s === undefined ? String(x) : s.length > 60 ? `${s.slice(0, 57)}...` : s;
  };
  const obj = (x: unknown, field: string, keys: readonly string[], optional: readonly string[] = []): Obj => {
    if (typeof x !== 'object' || x === null || Array.isArray(x)) fail(field, `expected an object, got ${show(x)}`);
    const o = x as Obj;
    for (const k of Object.keys(o)) if (!keys.includes(k) && !optional.includes(k)) fail(join(field, k), `unknown field (expected ${[...keys, ...optional].join(', ')})`);
    for (const k of keys) if (!(k in o)) fail(join(field, k), 'missing');
    return o;
  };
  const arr = (x: unknown, field: string, max: number): unknown[] => {
    if (!Array.isArray(x)) fail(field, `expected an array, got ${show(x)}`);
    const a = x as unknown[];
    if (a.length > max) fail(field, `at most ${max} entries are accepted, got ${a.length}`);
    return a;
  };
  const num = (x: unknown, field: string): number => {
    if (typeof x !== 'number' || !Number.isFinite(x)) fail(field, `expected a finite number, got ${show(x)}`);
    return x as number;
  };
  const pos = (x: unknown, field: string): number => {
    const v = num(x, field);
    if (!(v > 0)) fail(field, `expected a positive number, got ${show(x)}`);
    return v;
  };
  const int = (x: unknown, field: string, min: number, max = Number.MAX_SAFE_INTEGER): number => {
    if (typeof x !== 'number' || !Number.isInteger(x) || x < min || x > max) fail(field, `expected an integer ${max === Number.MAX_SAFE_INTEGER ? `>= ${min}` : `from ${min} to ${max}`}, got ${show(x)}`);
    return x as number;
  };
  const str = (x: unknown, field: string): string => {
    if (typeof x !== 'string') fail(field, `expected a string, got ${show(x)}`);
    if ((x as string).length > DESIGN_LIMITS.text) fail(field, `longer than ${DESIGN_LIMITS.text} characters`);
    return x as string;
  };
  const bool = (x: unknown, field: string): boolean => {
    if (typeof x !== 'boolean') fail(field, `expected true or false, got ${show(x)}`);
    return x as boolean;
  };
  const oneOf = <T extends string>(x: unknown, field: string, allowed: readonly T[]): T => {
    if (typeof x !== 'string' || !allowed.includes(x as T)) fail(field, `expected ${allowed.map((a) => JSON.stringify(a)).join(' or ')}, got ${show(x)}`);
    return x as T;
  };
  const formula = (x: unknown, field: string, vars: readonly string[]): string => {
    const s = str(x, field);
    try { compileFormula(s, vars); } catch (e) { fail(field, `${(e as Error).message} (a formula in ${vars.join(', ')})`); }
    return s;
  };

  // The format first: a wrong file (a model, a plant) gets that answer, not a list of missing fields.
  if (typeof json === 'object' && json !== null && !Array.isArray(json) && (json as Obj).format !== DESIGN_FORMAT) {
    fail('format', `expected ${JSON.stringify(DESIGN_FORMAT)} (is this a controller design file?), got ${show((json as Obj).format)}`);
  }
  const d = obj(json, '', ['format', 'version', 'kind', 'app', 'source', 'model', 'input', 'law', 'sampleRateHz', 'delaySamples', 'stages', 'transitions', 'initialStage', 'cautions', 'checks']);
  if (d.format !== DESIGN_FORMAT) fail('format', `expected ${JSON.stringify(DESIGN_FORMAT)} (is this a controller design file?), got ${show(d.format)}`);
  if (d.version !== DESIGN_VERSION) fail('version', `expected ${DESIGN_VERSION} (this build reads version ${DESIGN_VERSION} only), got ${show(d.version)}`);
  const kind = oneOf(d.kind, 'kind', ['level-hold', 'well-hop'] as const);

  // model
  const m = obj(d.model, 'model', ['coordinate', 'energy', 'units', 'lambda', 'acceleration', 'validRange', 'wells', 'barriers']);
  const coordinate: Coordinate = oneOf(m.coordinate, 'model.coordinate', ['angle', 'linear'] as const);
  const energy = formula(m.energy, 'model.energy', ['q', 'v']);
  const units = oneOf(m.units, 'model.units', ['J', 'J/kg'] as const);
  const lambda = num(m.lambda, 'model.lambda');
  const acceleration = m.acceleration === null ? null : formula(m.acceleration, 'model.acceleration', ['q', 'v', 'u', 't']);
  const vr = obj(m.validRange, 'model.validRange', ['qMin', 'qMax', 'energyMin', 'energyMax']);
  const validRange = {
    qMin: num(vr.qMin, 'model.validRange.qMin'), qMax: num(vr.qMax, 'model.validRange.qMax'),
    energyMin: num(vr.energyMin, 'model.validRange.energyMin'), energyMax: num(vr.energyMax, 'model.validRange.energyMax'),
  };
  if (!(validRange.qMax > validRange.qMin)) fail('model.validRange.qMax', `must exceed qMin (${validRange.qMin}), got ${validRange.qMax}`);
  if (!(validRange.energyMax >= validRange.energyMin)) fail('model.validRange.energyMax', `must be at least energyMin (${validRange.energyMin}), got ${validRange.energyMax}`);
  const wells = arr(m.wells, 'model.wells', DESIGN_LIMITS.wells).map((w, i) => {
    const f = `model.wells[${i}]`;
    const o = obj(w, f, ['index', 'q', 'energy']);
    const index = int(o.index, `${f}.index`, 1);
    if (index !== i + 1) fail(`${f}.index`, `expected ${i + 1} (wells are numbered 1, 2, ... in order), got ${index}`);
    return { index, q: num(o.q, `${f}.q`), energy: num(o.energy, `${f}.energy`) };
  });
  const barriers = arr(m.barriers, 'model.barriers', DESIGN_LIMITS.wells).map((b, i) => {
    const f = `model.barriers[${i}]`;
    const o = obj(b, f, ['q', 'energy', 'between']);
    const bw = arr(o.between, `${f}.between`, 2);
    if (bw.length !== 2) fail(`${f}.between`, `expected two well indices, got ${bw.length}`);
    const between: [number, number] = [int(bw[0], `${f}.between[0]`, 1, wells.length), int(bw[1], `${f}.between[1]`, 1, wells.length)];
    return { q: num(o.q, `${f}.q`), energy: num(o.energy, `${f}.energy`), between };
  });

  // input
  const inp = obj(d.input, 'input', ['gain', 'unit']);
  const gain = num(inp.gain, 'input.gain');
  if (gain === 0) fail('input.gain', 'expected a non-zero input gain, got 0');
  const input = { gain, unit: str(inp.unit, 'input.unit') };

  // law
  const l = obj(d.law, 'law', ['Q', 'R', 'eps', 'lambda', 'uMax', 'rateMax', 'integral', 'lossCompensation']);
  const eps = num(l.eps, 'law.eps');
  if (eps < 0) fail('law.eps', `expected a number >= 0, got ${eps}`);
  let integral: LawParameters['integral'] = null;
  if (l.integral !== null) {
    const ig = obj(l.integral, 'law.integral', ['Qw', 'antiWindup']);
    integral = { Qw: pos(ig.Qw, 'law.integral.Qw'), antiWindup: oneOf(ig.antiWindup, 'law.integral.antiWindup', ['conditional', 'none'] as const) };
  }
  const law: LawParameters = {
    Q: pos(l.Q, 'law.Q'), R: pos(l.R, 'law.R'), eps, lambda: num(l.lambda, 'law.lambda'),
    uMax: l.uMax === null ? null : pos(l.uMax, 'law.uMax'),
    rateMax: l.rateMax === null ? null : pos(l.rateMax, 'law.rateMax'),
    integral, lossCompensation: bool(l.lossCompensation, 'law.lossCompensation'),
  };

  const sampleRateHz = pos(d.sampleRateHz, 'sampleRateHz');
  const delaySamples = int(d.delaySamples, 'delaySamples', 0, 1_000_000);

  // stages
  const rawStages = arr(d.stages, 'stages', DESIGN_LIMITS.stages);
  if (rawStages.length === 0) fail('stages', 'expected at least one stage');
  const stages: Stage[] = rawStages.map((s, i) => {
    const f = `stages[${i}]`;
    const o = obj(s, f, ['index', 'name', 'target', 'meanB2']);
    const index = int(o.index, `${f}.index`, 1);
    if (index !== i + 1) fail(`${f}.index`, `expected ${i + 1} (stages are numbered 1, 2, ... in order), got ${index}`);
    const meanB2 = o.meanB2 === null ? null : pos(o.meanB2, `${f}.meanB2`);
    return { index, name: str(o.name, `${f}.name`), target: readTarget(o.target, `${f}.target`), meanB2 };
  });
  function readTarget(x: unknown, f: string): TargetSpec {
    const k = obj(x, f, ['kind'], ['energy', 'amplitude', 'well', 'speed']).kind;
    const tk = oneOf(k, `${f}.kind`, ['energy', 'amplitude', 'at-rest', 'rotation'] as const);
    if (tk === 'energy') { const o = obj(x, f, ['kind', 'energy']); return { kind: tk, energy: num(o.energy, `${f}.energy`) }; }
    if (tk === 'amplitude') { const o = obj(x, f, ['kind', 'amplitude', 'energy']); return { kind: tk, amplitude: num(o.amplitude, `${f}.amplitude`), energy: num(o.energy, `${f}.energy`) }; }
    if (tk === 'at-rest') {
      const o = obj(x, f, ['kind', 'well', 'energy']);
      return { kind: tk, well: int(o.well, `${f}.well`, 1, Math.max(1, wells.length)), energy: num(o.energy, `${f}.energy`) };
    }
    const o = obj(x, f, ['kind', 'speed', 'energy']);
    return { kind: tk, speed: num(o.speed, `${f}.speed`), energy: num(o.energy, `${f}.energy`) };
  }
  const n = stages.length;

  // transitions
  const transitions: Transition[] = arr(d.transitions, 'transitions', DESIGN_LIMITS.transitions).map((t, i) => {
    const f = `transitions[${i}]`;
    const o = obj(t, f, ['from', 'to', 'when', 'reason']);
    const from = int(o.from, `${f}.from`, 1, n), to = int(o.to, `${f}.to`, 1, n);
    if (from === to) fail(`${f}.to`, `a transition must change the stage (from = to = ${from})`);
    const w = obj(o.when, `${f}.when`, [], ['qAbove', 'qBelow', 'vSign', 'energyAbove', 'energyBelow', 'wrapped']);
    const when: SwitchCondition = {};
    if (w.qAbove !== undefined) when.qAbove = num(w.qAbove, `${f}.when.qAbove`);
    if (w.qBelow !== undefined) when.qBelow = num(w.qBelow, `${f}.when.qBelow`);
    if (w.vSign !== undefined) {
      if (w.vSign !== 1 && w.vSign !== -1) fail(`${f}.when.vSign`, `expected 1 or -1, got ${show(w.vSign)}`);
      when.vSign = w.vSign as 1 | -1;
    }
    if (w.energyAbove !== undefined) when.energyAbove = num(w.energyAbove, `${f}.when.energyAbove`);
    if (w.energyBelow !== undefined) when.energyBelow = num(w.energyBelow, `${f}.when.energyBelow`);
    if (w.wrapped !== undefined) {
      when.wrapped = bool(w.wrapped, `${f}.when.wrapped`);
      if (when.wrapped && coordinate !== 'angle') fail(`${f}.when.wrapped`, 'only an angle can be wrapped (model.coordinate is "linear")');
    }
    if (Object.keys(when).filter((k) => k !== 'wrapped').length === 0) fail(`${f}.when`, 'expected at least one clause (qAbove, qBelow, vSign, energyAbove, energyBelow)');
    return { from, to, when, reason: str(o.reason, `${f}.reason`) };
  });
  const initialStage = int(d.initialStage, 'initialStage', 1, n);
  if (kind === 'level-hold' && (n !== 1 || transitions.length !== 0)) fail('kind', `a level-hold design has one stage and no transitions, this one has ${n} stages and ${transitions.length} transitions`);

  const cautions = arr(d.cautions, 'cautions', DESIGN_LIMITS.cautions).map((c, i) => str(c, `cautions[${i}]`));
  if (cautions.length === 0) fail('cautions', 'expected the safety cautions (at least one), got an empty list');
  const checks = arr(d.checks, 'checks', DESIGN_LIMITS.checks).map((c, i) => {
    const o = obj(c, `checks[${i}]`, ['name', 'ok', 'detail']);
    return { name: str(o.name, `checks[${i}].name`), ok: bool(o.ok, `checks[${i}].ok`), detail: str(o.detail, `checks[${i}].detail`) };
  });

  const design: ControllerDesign = {
    format: DESIGN_FORMAT, version: DESIGN_VERSION, kind, app: str(d.app, 'app'), source: str(d.source, 'source'),
    model: { coordinate, energy, units, lambda, acceleration, validRange, wells, barriers },
    input, law, sampleRateHz, delaySamples, stages, transitions, initialStage, cautions, checks,
  };
  // The energy must be differentiable by our rules (the law needs dH/dv).
  try { compileDesignEnergy(energy, coordinate, lambda, 'model.energy'); } catch (e) { fail('', (e as Error).message); }
  return design;
}

function join(a: string, b: string): string {
  return a ? `${a}.${b}` : b;
}
