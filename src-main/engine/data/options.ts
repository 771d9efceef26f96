// Checks the caller's column mapping and import options once, at the door, naming the bad argument.
import type { ColumnMapping, ImportOptions } from './types.ts';

export interface ResolvedOptions {
  gapFactor: number;
  irregularTolerance: number;
  minSamples: number;
  clipSamples: number;
  quantLevels: number;
}

export const DEFAULT_OPTIONS: Readonly<ResolvedOptions> = Object.freeze({
  gapFactor: 1.5,
  irregularTolerance: 0.01,
  minSamples: 64,
  clipSamples: 10,
  quantLevels: 256,
});

function columnSpecOk(v: unknown): boolean {
  if (typeof v === 'number') return Number.isInteger(v) && v >= 1;
  return typeof v === 'string' && v.trim() !== '';
}

export function checkMapping(mapping: ColumnMapping): void {
  if (mapping === null || typeof mapping !== 'object') throw new TypeError('mapping: expected an object {time, position, run?, input?, angle?}');
  for (const key of ['time', 'position'] as const) {
    if (!columnSpecOk(mapping[key])) throw new TypeError(`mapping.${key}: expected a column name or a 1-based column number, got ${JSON.stringify(mapping[key])}`);
  }
  for (const key of ['run', 'input'] as const) {
    if (mapping[key] !== undefined && !columnSpecOk(mapping[key])) throw new TypeError(`mapping.${key}: expected a column name, a 1-based column number or nothing, got ${JSON.stringify(mapping[key])}`);
  }
  if (mapping.angle !== undefined && typeof mapping.angle !== 'boolean') throw new TypeError(`mapping.angle: expected true, false or nothing, got ${JSON.stringify(mapping.angle)}`);
}

export function resolveOptions(options: ImportOptions | undefined): ResolvedOptions {
  if (options !== undefined && (options === null || typeof options !== 'object')) throw new TypeError('options: expected an object or nothing');
  const o = { ...DEFAULT_OPTIONS };
  const num = (key: keyof ResolvedOptions, ok: (x: number) => boolean, what: string): void => {
    const v = options?.[key];
    if (v === undefined) return;
    if (typeof v !== 'number' || !ok(v)) throw new RangeError(`options.${key}: expected ${what}, got ${JSON.stringify(v)}`);
    o[key] = v;
  };
  num('irregularTolerance', (x) => x >= 0 && x < 1, 'a fraction in [0, 1)');
  num('gapFactor', (x) => Number.isFinite(x) && x > 1, 'a finite number above 1');
  num('minSamples', (x) => Number.isInteger(x) && x >= 3, 'an integer of at least 3');
  num('clipSamples', (x) => Number.isInteger(x) && x >= 2, 'an integer of at least 2');
  num('quantLevels', (x) => Number.isFinite(x) && x >= 2, 'a number of at least 2');
  if (o.gapFactor <= 1 + o.irregularTolerance) {
    throw new RangeError(`options.gapFactor: must exceed 1 + options.irregularTolerance (${1 + o.irregularTolerance}), got ${o.gapFactor}`);
  }
  return o;
}
