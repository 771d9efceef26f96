// Reads an energy model file (model.json, the EnergyModel of engine/learn/model.ts, written by
// `ergostat learn`) for the designer, checking the fields the designer relies on: files from
// other people are untrusted, so numbers must be finite, term specs well formed, user terms
// formulas in our language, the coefficients one per term, and the recorded range (`coverage`,
// optional: files learned before it was recorded have none) finite and ordered. Fields the designer does not use
// are copied as they are (a deep copy: the result shares nothing with the input).
import type { EnergyModel } from '../engine/learn/index.ts';
import { compileFormula } from '../engine/formula/index.ts';

/** A problem in a model file; the message starts with the file and the field. */
export class ModelFileError extends Error {
  override name = 'ModelFileError';
}

export function readEnergyModel(json: unknown, where: string): EnergyModel {
  const fail = (field: string, msg: string): never => { throw new ModelFileError(`${where}: ${field}: ${msg}`); };
  const show = (x: unknown) => { const s = JSON.stringify(x); return s === undefined ? String(x) : s.length > 60 ? `${s.slice(0, 57)}...` : s; };
  const isObj = (x: unknown): x is Record<string, unknown> => typeof x === 'object' && x !== null && !Array.isArray(x);
  const obj = (x: unknown, f: string) => (isObj(x) ? x : fail(f, `expected an object, got ${show(x)}`));
  const num = (x: unknown, f: string) => (typeof x === 'number' && Number.isFinite(x) ? x : fail(f, `expected a finite number, got ${show(x)}`));
  const numOrNull = (x: unknown, f: string) => (x === null ? null : num(x, f));
  const int = (x: unknown, f: string, lo: number, hi: number) => (typeof x === 'number' && Number.isInteger(x) && x >= lo && x <= hi ? x : fail(f, `expected an integer from ${lo} to ${hi}, got ${show(x)}`));

  if (!isObj(json)) throw new ModelFileError(`${where}: expected an energy model object, got ${show(json)}`);
  if (json.format !== 'ergostat-energy-model') fail('format', `expected "ergostat-energy-model" (is this a model file from ergostat learn?), got ${show(json.format)}`);
  if (json.version !== 1) fail('version', `expected 1, got ${show(json.version)}`);
  if (json.status !== 'ok') {
    const v = isObj(json.verdict) && typeof json.verdict.reason === 'string' ? `: ${json.verdict.reason}` : '';
    fail('status', `the model holds no conserved energy (${show(json.status)}${v}); nothing to design on`);
  }
  if (json.coordinate !== 'angle' && json.coordinate !== 'linear') fail('coordinate', `expected "angle" or "linear", got ${show(json.coordinate)}`);
  const lib = obj(json.library, 'library');
  if (!Array.isArray(lib.terms)) fail('library.terms', 'expected an array of terms');
  const terms = lib.terms as unknown[];
  if (terms.length > 10_000) fail('library.terms', `at most 10000 terms are accepted, got ${terms.length}`);
  terms.forEach((t, j) => {
    const f = `library.terms[${j}]`;
    const o = obj(t, f);
    if (o.kind === 'mono') { int(o.a, `${f}.a`, 0, 64); int(o.b, `${f}.b`, 0, 64); if ((o.a as number) + (o.b as number) < 1) fail(f, 'a monomial needs a + b >= 1'); }
    else if (o.kind === 'trig') {
      if (o.fn !== 'cos' && o.fn !== 'sin') fail(`${f}.fn`, `expected "cos" or "sin", got ${show(o.fn)}`);
      int(o.k, `${f}.k`, 1, 64); int(o.b, `${f}.b`, 0, 64);
      if (json.coordinate !== 'angle') fail(f, 'trigonometric terms need an angle coordinate');
    } else if (o.kind === 'user') {
      if (typeof o.source !== 'string') fail(`${f}.source`, 'expected a formula string in q and v');
      try { compileFormula(o.source as string, ['q', 'v']); } catch (e) { fail(`${f}.source`, (e as Error).message); }
    } else fail(`${f}.kind`, `expected "mono", "trig" or "user", got ${show(o.kind)}`);
  });
  if (!Array.isArray(json.coefficients) || json.coefficients.length !== terms.length) fail('coefficients', `expected ${terms.length} numbers (one per term)`);
  (json.coefficients as unknown[]).forEach((c, j) => num(c, `coefficients[${j}]`));
  if ((json.coefficients as number[]).every((c) => c === 0)) fail('coefficients', 'all zero: the model has no energy');
  num(json.offset, 'offset');
  if (json.units !== 'J' && json.units !== 'J/kg') fail('units', `expected "J" or "J/kg", got ${show(json.units)}`);
  num(json.lambda, 'lambda');
  const damping = obj(json.damping, 'damping');
  num(damping.period, 'damping.period');
  if (!((damping.period as number) > 0)) fail('damping.period', `expected a positive period, got ${show(damping.period)}`);
  const scale = obj(json.scale, 'scale');
  const mass = numOrNull(scale.mass, 'scale.mass');
  if (mass !== null && !(mass > 0)) fail('scale.mass', `expected a positive mass or null, got ${mass}`);
  numOrNull(scale.inputGain, 'scale.inputGain');
  if (!['given', 'forced-run', 'none'].includes(scale.massSource as string)) fail('scale.massSource', `expected "given", "forced-run" or "none", got ${show(scale.massSource)}`);
  if (json.landscape !== null) {
    const ls = obj(json.landscape, 'landscape');
    num(ls.qMin, 'landscape.qMin'); num(ls.qMax, 'landscape.qMax');
    if (!((ls.qMax as number) > (ls.qMin as number))) fail('landscape.qMax', 'must exceed landscape.qMin');
    if (typeof ls.periodic !== 'boolean') fail('landscape.periodic', 'expected true or false');
    if (!Array.isArray(ls.wells) || ls.wells.length > 256) fail('landscape.wells', 'expected an array of at most 256 wells');
    (ls.wells as unknown[]).forEach((w, i) => {
      const o = obj(w, `landscape.wells[${i}]`);
      if (o.index !== i + 1) fail(`landscape.wells[${i}].index`, `expected ${i + 1}, got ${show(o.index)}`);
      num(o.q, `landscape.wells[${i}].q`); num(o.V, `landscape.wells[${i}].V`);
    });
    if (!Array.isArray(ls.barriers) || ls.barriers.length > 256) fail('landscape.barriers', 'expected an array of at most 256 barriers');
    const nw = (ls.wells as unknown[]).length;
    (ls.barriers as unknown[]).forEach((b, i) => {
      const o = obj(b, `landscape.barriers[${i}]`);
      num(o.q, `landscape.barriers[${i}].q`); num(o.V, `landscape.barriers[${i}].V`);
      if (!Array.isArray(o.between) || o.between.length !== 2) fail(`landscape.barriers[${i}].between`, 'expected two well indices');
      (o.between as unknown[]).forEach((k, s) => int(k, `landscape.barriers[${i}].between[${s}]`, 1, Math.max(1, nw)));
    });
  }
  // coverage (optional; absent in files learned before it was recorded, null read as absent).
  if (json.coverage !== undefined && json.coverage !== null) {
    const c = obj(json.coverage, 'coverage');
    const [eMin, eMax, qMin, qMax] = (['energyMin', 'energyMax', 'qMin', 'qMax'] as const).map((k) => num(c[k], `coverage.${k}`));
    if (!(eMax >= eMin)) fail('coverage.energyMax', `must be at least coverage.energyMin (${eMin}), got ${eMax}`);
    if (!(qMax >= qMin)) fail('coverage.qMax', `must be at least coverage.qMin (${qMin}), got ${qMax}`);
    if (!(num(c.vMaxAbs, 'coverage.vMaxAbs') >= 0)) fail('coverage.vMaxAbs', `expected a speed >= 0, got ${show(c.vMaxAbs)}`);
    if (!(num(c.joulesPerModelUnit, 'coverage.joulesPerModelUnit') > 0)) fail('coverage.joulesPerModelUnit', `expected a positive scale, got ${show(c.joulesPerModelUnit)}`);
  }
  const st = obj(json.structure, 'structure');
  if (typeof st.separable !== 'boolean') fail('structure.separable', 'expected true or false');
  const metrics = obj(json.metrics, 'metrics');
  if (metrics.noiseSigma !== null && typeof metrics.noiseSigma !== 'number') fail('metrics.noiseSigma', 'expected a number');
  num(metrics.dt, 'metrics.dt');
  int(metrics.halfWindow, 'metrics.halfWindow', 0, 1_000_000);
  const copy = structuredClone(json);
  if (copy.coverage === null) delete copy.coverage;
  return copy as unknown as EnergyModel;
}
