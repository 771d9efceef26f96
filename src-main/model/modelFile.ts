// The energy model file: versioned JSON (docs/model-format.md). Files may come from others, so
// reading validates every field and names the one that is wrong; formulas are accepted only if
// our own formula parser accepts them. Non-finite numbers are written as null.
import { readFile, writeFile, rename } from 'node:fs/promises';
import { parseFormula } from '../engine/formula/index.ts';
import type { EnergyModel, TermSpec } from '../engine/learn/model.ts';
import { termFromSpec } from '../engine/learn/model.ts';

export const MODEL_FORMAT = 'ergostat-energy-model';
export const MODEL_VERSION = 1;
const MAX_BYTES = 8 * 1024 * 1024;
const MAX_TERMS = 500;
const MAX_LIST = 10000;
const MAX_TEXT = 20000;

export class ModelFileError extends Error {
  override name = 'ModelFileError';
  constructor(readonly file: string, readonly field: string, readonly problem: string) {
    super(`${file}: ${field ? `field "${field}": ` : ''}${problem}`);
  }
}

/** JSON text of a model (2-space indent); NaN and infinities become null. */
export function serializeModel(model: EnergyModel): string {
  return JSON.stringify(model, (_k, v) => (typeof v === 'number' && !Number.isFinite(v) ? null : v), 2) + '\n';
}

type Obj = Record<string, unknown>;

/** Field-by-field reader; every accessor names the path it reads in its error. */
class Reader {
  constructor(private file: string) {}
  fail(field: string, problem: string): never { throw new ModelFileError(this.file, field, problem); }
  show(v: unknown): string { const s = JSON.stringify(v); return s === undefined ? String(v) : s.length > 60 ? `${s.slice(0, 57)}...` : s; }
  obj(v: unknown, f: string): Obj { if (typeof v !== 'object' || v === null || Array.isArray(v)) this.fail(f, `expected an object, got ${this.show(v)}`); return v as Obj; }
  arr(v: unknown, f: string, max = MAX_LIST): unknown[] {
    if (!Array.isArray(v)) this.fail(f, `expected an array, got ${this.show(v)}`);
    if (v.length > max) this.fail(f, `has ${v.length} entries, at most ${max} allowed`);
    return v;
  }
  num(v: unknown, f: string, opts: { nullable?: boolean; min?: number; max?: number; integer?: boolean } = {}): number {
    if (v === null && opts.nullable) return NaN;
    if (typeof v !== 'number' || !Number.isFinite(v)) this.fail(f, `expected a finite number${opts.nullable ? ' or null' : ''}, got ${this.show(v)}`);
    if (opts.integer && !Number.isInteger(v)) this.fail(f, `expected an integer, got ${v}`);
    if (opts.min !== undefined && v < opts.min) this.fail(f, `expected at least ${opts.min}, got ${v}`);
    if (opts.max !== undefined && v > opts.max) this.fail(f, `expected at most ${opts.max}, got ${v}`);
    return v;
  }
  numOrNull(v: unknown, f: string): number | null { return v === null ? null : this.num(v, f); }
  str(v: unknown, f: string, max = MAX_TEXT): string {
    if (typeof v !== 'string') this.fail(f, `expected a string, got ${this.show(v)}`);
    if (v.length > max) this.fail(f, `is ${v.length} characters long, at most ${max} allowed`);
    return v;
  }
  bool(v: unknown, f: string): boolean { if (typeof v !== 'boolean') this.fail(f, `expected true or false, got ${this.show(v)}`); return v; }
  oneOf<T extends string>(v: unknown, f: string, options: readonly T[]): T {
    if (typeof v !== 'string' || !options.includes(v as T)) this.fail(f, `expected one of ${options.map((o) => `"${o}"`).join(', ')}, got ${this.show(v)}`);
    return v as T;
  }
  formula(v: unknown, f: string, allowEmpty = false): string {
    const s = this.str(v, f);
    if (allowEmpty && s === '') return s;
    try { parseFormula(s); } catch (e) { this.fail(f, `not a formula our parser accepts: ${(e as Error).message}`); }
    return s;
  }
}

function readTerm(r: Reader, v: unknown, f: string): TermSpec {
  const o = r.obj(v, f);
  const kind = r.oneOf(o.kind, `${f}.kind`, ['mono', 'trig', 'user'] as const);
  if (kind === 'mono') {
    const a = r.num(o.a, `${f}.a`, { integer: true, min: 0, max: 12 }), b = r.num(o.b, `${f}.b`, { integer: true, min: 0, max: 12 });
    if (a + b < 1) r.fail(f, 'a monomial needs a + b >= 1');
    return { kind, a, b };
  }
  if (kind === 'trig') {
    return { kind, fn: r.oneOf(o.fn, `${f}.fn`, ['cos', 'sin'] as const), k: r.num(o.k, `${f}.k`, { integer: true, min: 1, max: 12 }), b: r.num(o.b, `${f}.b`, { integer: true, min: 0, max: 12 }) };
  }
  const source = r.formula(o.source, `${f}.source`);
  try { termFromSpec({ kind: 'user', source }); } catch (e) { r.fail(`${f}.source`, `not a formula in q and v: ${(e as Error).message}`); }
  return { kind, source };
}

/** Validates a parsed JSON value as an EnergyModel; `file` names the source in errors. */
export function validateModel(json: unknown, file = 'model'): EnergyModel {
  const r = new Reader(file);
  const o = r.obj(json, '');
  if (o.format !== MODEL_FORMAT) r.fail('format', `expected "${MODEL_FORMAT}", got ${r.show(o.format)} (not an Ergostat energy model)`);
  const version = r.num(o.version, 'version', { integer: true });
  if (version !== MODEL_VERSION) r.fail('version', `this Ergostat reads version ${MODEL_VERSION}, the file has version ${version}`);
  const verdictO = r.obj(o.verdict, 'verdict');
  const lib = r.obj(o.library, 'library');
  const terms = r.arr(lib.terms, 'library.terms', MAX_TERMS).map((t, i) => readTerm(r, t, `library.terms[${i}]`));
  const coefficients = r.arr(o.coefficients, 'coefficients', MAX_TERMS).map((c, i) => r.num(c, `coefficients[${i}]`));
  if (coefficients.length !== terms.length) r.fail('coefficients', `has ${coefficients.length} entries but library.terms has ${terms.length}`);
  const status = r.oneOf(o.status, 'status', ['ok', 'no-energy'] as const);
  if (status === 'ok' && !coefficients.some((c) => c !== 0)) r.fail('coefficients', 'all zero in a model with status "ok"');
  const d = r.obj(o.damping, 'damping');
  const sc = r.obj(o.scale, 'scale');
  const st = r.obj(o.structure, 'structure');
  const me = r.obj(o.metrics, 'metrics');
  const nn = (v: unknown, f: string) => r.num(v, f, { nullable: true });
  let landscape: EnergyModel['landscape'] = null;
  if (o.landscape !== null) {
    const L = r.obj(o.landscape, 'landscape');
    landscape = {
      qMin: r.num(L.qMin, 'landscape.qMin'), qMax: r.num(L.qMax, 'landscape.qMax'), periodic: r.bool(L.periodic, 'landscape.periodic'),
      wells: r.arr(L.wells, 'landscape.wells', 1000).map((w, i) => {
        const f = `landscape.wells[${i}]`, x = r.obj(w, f);
        return { index: r.num(x.index, `${f}.index`, { integer: true, min: 1 }), q: r.num(x.q, `${f}.q`), V: r.num(x.V, `${f}.V`) };
      }),
      barriers: r.arr(L.barriers, 'landscape.barriers', 1000).map((w, i) => {
        const f = `landscape.barriers[${i}]`, x = r.obj(w, f);
        const bt = r.arr(x.between, `${f}.between`, 2).map((k, j) => r.num(k, `${f}.between[${j}]`, { integer: true, min: 1 }));
        if (bt.length !== 2) r.fail(`${f}.between`, 'expected two well numbers');
        return { q: r.num(x.q, `${f}.q`), V: r.num(x.V, `${f}.V`), between: [bt[0], bt[1]] as [number, number] };
      }),
    };
  }
  // Optional (files learned before it was recorded have none); null is read as absent.
  let coverage: EnergyModel['coverage'];
  if (o.coverage !== undefined && o.coverage !== null) {
    const c = r.obj(o.coverage, 'coverage');
    coverage = {
      energyMin: r.num(c.energyMin, 'coverage.energyMin'), energyMax: r.num(c.energyMax, 'coverage.energyMax'),
      qMin: r.num(c.qMin, 'coverage.qMin'), qMax: r.num(c.qMax, 'coverage.qMax'),
      vMaxAbs: r.num(c.vMaxAbs, 'coverage.vMaxAbs', { min: 0 }),
      joulesPerModelUnit: r.num(c.joulesPerModelUnit, 'coverage.joulesPerModelUnit', { min: Number.MIN_VALUE }),
    };
    if (!(coverage.energyMax >= coverage.energyMin)) r.fail('coverage.energyMax', `must be at least coverage.energyMin (${coverage.energyMin}), got ${coverage.energyMax}`);
    if (!(coverage.qMax >= coverage.qMin)) r.fail('coverage.qMax', `must be at least coverage.qMin (${coverage.qMin}), got ${coverage.qMax}`);
  }
  const df = me.derivativeForm === null ? null : (() => {
    const x = r.obj(me.derivativeForm, 'metrics.derivativeForm');
    return { lambda: nn(x.lambda, 'metrics.derivativeForm.lambda'), mu1: nn(x.mu1, 'metrics.derivativeForm.mu1'), agreement: nn(x.agreement, 'metrics.derivativeForm.agreement') };
  })();
  const model: EnergyModel = {
    format: MODEL_FORMAT, version: MODEL_VERSION, status,
    verdict: {
      code: r.oneOf(verdictO.code, 'verdict.code', ['ok', 'too-little-data', 'noise-only', 'heavy-damping', 'not-conserved', 'no-free-runs'] as const),
      ok: r.bool(verdictO.ok, 'verdict.ok'), reason: r.str(verdictO.reason, 'verdict.reason'), advice: r.str(verdictO.advice, 'verdict.advice'),
    },
    coordinate: r.oneOf(o.coordinate, 'coordinate', ['angle', 'linear'] as const),
    library: { degree: r.num(lib.degree, 'library.degree', { integer: true, min: 0, max: 12 }), harmonics: lib.harmonics === null ? null : r.num(lib.harmonics, 'library.harmonics', { integer: true, min: 1, max: 12 }), evenV: r.bool(lib.evenV, 'library.evenV'), terms },
    coefficients,
    offset: r.num(o.offset, 'offset'),
    formula: r.formula(o.formula, 'formula', status !== 'ok'),
    units: r.oneOf(o.units, 'units', ['J', 'J/kg'] as const),
    lambda: r.num(o.lambda, 'lambda'),
    damping: {
      lambda: r.num(d.lambda, 'damping.lambda'), period: nn(d.period, 'damping.period'), omegaN: nn(d.omegaN, 'damping.omegaN'),
      zetaFromLambda: nn(d.zetaFromLambda, 'damping.zetaFromLambda'), zetaLogDecrement: r.numOrNull(d.zetaLogDecrement, 'damping.zetaLogDecrement'),
      lambdaDerivativeForm: r.numOrNull(d.lambdaDerivativeForm, 'damping.lambdaDerivativeForm'),
    },
    scale: {
      mass: sc.mass === null ? null : r.num(sc.mass, 'scale.mass', { min: Number.MIN_VALUE }),
      massSource: r.oneOf(sc.massSource, 'scale.massSource', ['given', 'forced-run', 'none'] as const),
      massFromForcedRun: r.numOrNull(sc.massFromForcedRun, 'scale.massFromForcedRun'), inputGain: r.numOrNull(sc.inputGain, 'scale.inputGain'),
      forcedRunR2: r.numOrNull(sc.forcedRunR2, 'scale.forcedRunR2'), joulesPerModelUnit: r.num(sc.joulesPerModelUnit, 'scale.joulesPerModelUnit'),
    },
    landscape,
    structure: {
      separable: r.bool(st.separable, 'structure.separable'), nonSeparableShare: nn(st.nonSeparableShare, 'structure.nonSeparableShare'),
      massFormula: st.massFormula === null ? null : r.formula(st.massFormula, 'structure.massFormula'),
      potentialFormula: st.potentialFormula === null ? null : r.formula(st.potentialFormula, 'structure.potentialFormula'),
    },
    replay: r.arr(o.replay, 'replay').map((x, i) => {
      const f = `replay[${i}]`, y = r.obj(x, f);
      return { run: r.str(y.run, `${f}.run`, 1000), seconds: r.num(y.seconds, `${f}.seconds`), rmsError: nn(y.rmsError, `${f}.rmsError`), relativeError: nn(y.relativeError, `${f}.relativeError`) };
    }),
    ...(coverage ? { coverage } : {}),
    metrics: {
      samples: r.num(me.samples, 'metrics.samples', { integer: true, min: 0 }), runs: r.num(me.runs, 'metrics.runs', { integer: true, min: 0 }),
      freeRuns: r.num(me.freeRuns, 'metrics.freeRuns', { integer: true, min: 0 }), forcedRuns: r.num(me.forcedRuns, 'metrics.forcedRuns', { integer: true, min: 0 }),
      dt: nn(me.dt, 'metrics.dt'), noiseSigma: nn(me.noiseSigma, 'metrics.noiseSigma'), signalToNoise: nn(me.signalToNoise, 'metrics.signalToNoise'),
      halfWindow: r.num(me.halfWindow, 'metrics.halfWindow', { integer: true, min: 0 }), windowSeconds: r.num(me.windowSeconds, 'metrics.windowSeconds', { min: 0 }),
      savgolOrder: r.num(me.savgolOrder, 'metrics.savgolOrder', { integer: true, min: 0 }),
      lagsSeconds: r.arr(me.lagsSeconds, 'metrics.lagsSeconds', 100).map((x, i) => r.num(x, `metrics.lagsSeconds[${i}]`, { min: 0 })),
      mu1: nn(me.mu1, 'metrics.mu1'), mu2: nn(me.mu2, 'metrics.mu2'), gap: nn(me.gap, 'metrics.gap'), heldOut: nn(me.heldOut, 'metrics.heldOut'),
      nullSpaceDimension: r.num(me.nullSpaceDimension, 'metrics.nullSpaceDimension', { integer: true, min: 0 }), ridge: r.num(me.ridge, 'metrics.ridge', { min: 0 }),
      derivativeForm: df,
      candidates: r.arr(me.candidates, 'metrics.candidates', 1000).map((x, i) => {
        const f = `metrics.candidates[${i}]`, y = r.obj(x, f);
        return {
          halfWindow: r.num(y.halfWindow, `${f}.halfWindow`, { integer: true, min: 0 }), lagsSeconds: r.arr(y.lagsSeconds, `${f}.lagsSeconds`, 100).map((z, j) => r.num(z, `${f}.lagsSeconds[${j}]`)),
          degree: y.degree === null ? null : r.num(y.degree, `${f}.degree`, { integer: true, min: 1, max: 12 }),
          mu1: nn(y.mu1, `${f}.mu1`), mu2: nn(y.mu2, `${f}.mu2`), gap: nn(y.gap, `${f}.gap`), heldOut: nn(y.heldOut, `${f}.heldOut`), lambda: nn(y.lambda, `${f}.lambda`),
        };
      }),
      pareto: r.arr(me.pareto, 'metrics.pareto', 100).map((x, i) => {
        const f = `metrics.pareto[${i}]`, y = r.obj(x, f);
        return { threshold: r.num(y.threshold, `${f}.threshold`, { min: 0 }), terms: r.num(y.terms, `${f}.terms`, { integer: true, min: 0 }), mu: nn(y.mu, `${f}.mu`), heldOut: nn(y.heldOut, `${f}.heldOut`) };
      }),
      sparsityThreshold: r.num(me.sparsityThreshold, 'metrics.sparsityThreshold', { min: 0 }),
    },
  };
  if (model.verdict.ok !== (status === 'ok')) r.fail('verdict.ok', `must be ${status === 'ok'} when status is "${status}"`);
  return model;
}

/** Parses model JSON text; errors name the file and field. */
export function parseModel(text: string, file = 'model'): EnergyModel {
  if (text.length > MAX_BYTES) throw new ModelFileError(file, '', `is larger than ${MAX_BYTES} bytes; not a model file`);
  let json: unknown;
  try { json = JSON.parse(text); } catch (e) { throw new ModelFileError(file, '', `not valid JSON: ${(e as Error).message}`); }
  return validateModel(json, file);
}

export async function readModelFile(path: string): Promise<EnergyModel> {
  let text: string;
  try { text = await readFile(path, 'utf8'); } catch (e) { throw new ModelFileError(path, '', `cannot be read: ${(e as Error).message}`); }
  return parseModel(text, path);
}

/** Writes atomically (temporary file, then rename). */
export async function writeModelFile(path: string, model: EnergyModel): Promise<void> {
  const tmp = `${path}.tmp-${process.pid}`;
  await writeFile(tmp, serializeModel(model), 'utf8');
  await rename(tmp, path);
}
