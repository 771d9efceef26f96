// exportC: a ControllerDesign as portable C99 — NAME.h, NAME.c (source.ts) and NAME_check.c
// (check-source.ts with the engine's test vectors, vectors.ts). docs/export-c.md describes the
// generated API, the check and its tolerance.
import type { ControllerDesign } from '../../design/types.ts';
import { compileDesignEnergy } from '../../design/energy.ts';
import { SAFETY_CAUTIONS, SAFETY_DEFERENCE } from '../../safety.ts';
import { APP_VERSION } from '../../version.ts';
import { checkSource } from './check-source.ts';
import { checkCName } from './identifier.ts';
import { bodySource, headerSource } from './source.ts';
import { computeVectors, type VectorOptions, type VectorTable } from './vectors.ts';

export interface ExportedFile { name: string; text: string }

export interface ExportCResult {
  files: ExportedFile[];
  /** The test vectors written into NAME_check.c, with what they cover. */
  vectors: VectorTable;
}

export interface ExportCOptions {
  vectors?: VectorOptions;
}

function finite(x: unknown, field: string): number {
  if (typeof x !== 'number' || !Number.isFinite(x)) throw new RangeError(`design.${field}: expected a finite number, got ${String(x)}`);
  return x;
}

/** Door checks of the fields the C code is built from (a full check is design/validate.ts readDesign). */
function checkDesign(d: ControllerDesign): void {
  if (d === null || typeof d !== 'object') throw new TypeError('design: expected a ControllerDesign object');
  if (!d.model || typeof d.model.energy !== 'string') throw new TypeError('design.model.energy: expected a formula string in q and v');
  if (d.model.coordinate !== 'angle' && d.model.coordinate !== 'linear') throw new RangeError(`design.model.coordinate: expected "angle" or "linear", got ${String(d.model.coordinate)}`);
  compileDesignEnergy(d.model.energy, d.model.coordinate, finite(d.model.lambda, 'model.lambda'));
  if (!d.law || typeof d.law !== 'object') throw new TypeError('design.law: expected the law parameters');
  for (const k of ['Q', 'R', 'eps', 'lambda'] as const) finite(d.law[k], `law.${k}`);
  if (d.law.uMax !== null) finite(d.law.uMax, 'law.uMax');
  if (d.law.rateMax !== null) finite(d.law.rateMax, 'law.rateMax');
  if (d.law.integral !== null) finite(d.law.integral?.Qw, 'law.integral.Qw');
  finite(d.input?.gain, 'input.gain');
  if (!(finite(d.sampleRateHz, 'sampleRateHz') > 0)) throw new RangeError(`design.sampleRateHz: expected a positive rate, got ${d.sampleRateHz}`);
  if (!Array.isArray(d.stages) || d.stages.length === 0) throw new RangeError('design.stages: expected at least one stage');
  d.stages.forEach((s, i) => {
    finite(s?.target?.energy, `stages[${i}].target.energy`);
    if (s.meanB2 !== null) finite(s.meanB2, `stages[${i}].meanB2`);
  });
  if (!Array.isArray(d.transitions)) throw new TypeError('design.transitions: expected an array');
  d.transitions.forEach((t, i) => {
    for (const k of ['qAbove', 'qBelow', 'energyAbove', 'energyBelow'] as const) if (t.when?.[k] !== undefined) finite(t.when[k], `transitions[${i}].when.${k}`);
    if (t.when?.vSign !== undefined && t.when.vSign !== 1 && t.when.vSign !== -1) throw new RangeError(`design.transitions[${i}].when.vSign: expected 1 or -1, got ${String(t.when.vSign)}`);
  });
}

/**
 * C99 files for the design: `${name}.h`, `${name}.c`, `${name}_check.c`. `name` must be a C
 * identifier (identifier.ts). Throws, naming the field, for designs the engine itself would
 * refuse (controllerFromDesign's checks also apply).
 */
export function exportC(design: ControllerDesign, name: string, options: ExportCOptions = {}): ExportCResult {
  checkCName(name, 'name');
  checkDesign(design);
  const info = { cautions: SAFETY_CAUTIONS, deference: SAFETY_DEFERENCE, appVersion: APP_VERSION };
  const header = headerSource(design, name, info);
  const body = bodySource(design, name, info);
  const vectors = computeVectors(design, options.vectors);
  return {
    files: [
      { name: `${name}.h`, text: header },
      { name: `${name}.c`, text: body },
      { name: `${name}_check.c`, text: checkSource(name, vectors) },
    ],
    vectors,
  };
}
