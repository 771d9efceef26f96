// Run-time validators for untrusted values (IPC arguments, JSON documents from files).
// Each validator parses an unknown value into a typed one or throws a ValidationError whose
// message names the path of the bad field and what was expected.

export class ValidationError extends Error {
  override name = 'ValidationError';
  constructor(readonly path: string, readonly expected: string, found: unknown) {
    super(`${path}: expected ${expected}, found ${describe(found)}`);
  }
}

function describe(x: unknown): string {
  if (x === null) return 'null';
  if (x === undefined) return 'nothing';
  if (typeof x === 'string') return x.length > 40 ? `a string of ${x.length} characters` : JSON.stringify(x);
  if (typeof x === 'number') return String(x);
  if (Array.isArray(x)) return `an array of ${x.length}`;
  return `a value of type ${typeof x}`;
}

export interface Validator<T> {
  /** Parses x (found at `path`) or throws ValidationError. */
  parse(x: unknown, path: string): T;
  /** What the validator accepts, in words (for messages and docs). */
  readonly expected: string;
}

export type Infer<V> = V extends Validator<infer T> ? T : never;

type OptionalKeys<S> = { [K in keyof S]: undefined extends Infer<S[K]> ? K : never }[keyof S];
type Simplify<T> = { [K in keyof T]: T[K] } & {};
/** The parsed type of object(shape): fields whose validator admits undefined become optional. */
export type ObjectOf<S> = Simplify<{ [K in Exclude<keyof S, OptionalKeys<S>>]: Infer<S[K]> } & { [K in OptionalKeys<S>]?: Infer<S[K]> }>;

function make<T>(expected: string, parse: (x: unknown, path: string) => T): Validator<T> {
  return { expected, parse };
}

export function string(opts: { max?: number; min?: number; pattern?: RegExp } = {}): Validator<string> {
  const max = opts.max ?? 10_000;
  const min = opts.min ?? 0;
  const expected = `a string of ${min}..${max} characters${opts.pattern ? ` matching ${opts.pattern}` : ''}`;
  return make(expected, (x, path) => {
    if (typeof x !== 'string' || x.length > max || x.length < min || (opts.pattern && !opts.pattern.test(x)))
      throw new ValidationError(path, expected, x);
    return x;
  });
}

export function number(opts: { min?: number; max?: number; integer?: boolean } = {}): Validator<number> {
  const lo = opts.min ?? -Infinity;
  const hi = opts.max ?? Infinity;
  const kind = opts.integer ? 'an integer' : 'a finite number';
  const range = Number.isFinite(lo) || Number.isFinite(hi) ? ` in [${lo}, ${hi}]` : '';
  const expected = kind + range;
  return make(expected, (x, path) => {
    if (typeof x !== 'number' || !Number.isFinite(x) || x < lo || x > hi || (opts.integer && !Number.isInteger(x)))
      throw new ValidationError(path, expected, x);
    return x;
  });
}

export function boolean(): Validator<boolean> {
  return make('true or false', (x, path) => {
    if (typeof x !== 'boolean') throw new ValidationError(path, 'true or false', x);
    return x;
  });
}

export function literal<const L extends readonly (string | number)[]>(...values: L): Validator<L[number]> {
  const expected = `one of ${values.map((v) => JSON.stringify(v)).join(', ')}`;
  return make(expected, (x, path) => {
    if (!values.includes(x as L[number])) throw new ValidationError(path, expected, x);
    return x as L[number];
  });
}

export function optional<T>(inner: Validator<T>): Validator<T | undefined> {
  return make(`${inner.expected} (optional)`, (x, path) => (x === undefined ? undefined : inner.parse(x, path)));
}

export function array<T>(item: Validator<T>, opts: { max?: number; min?: number } = {}): Validator<T[]> {
  const max = opts.max ?? 100_000;
  const min = opts.min ?? 0;
  const expected = `an array of ${min}..${max} items`;
  return make(expected, (x, path) => {
    if (!Array.isArray(x) || x.length > max || x.length < min) throw new ValidationError(path, expected, x);
    return x.map((e, i) => item.parse(e, `${path}[${i}]`));
  });
}

export function numberArray(opts: { max?: number; min?: number } = {}): Validator<number[]> {
  return array(number(), opts);
}

/** A plain object with exactly these keys (unknown keys are refused: a typo should not pass silently). */
export function object<S extends Record<string, Validator<unknown>>>(shape: S): Validator<ObjectOf<S>> {
  const keys = Object.keys(shape);
  const expected = `an object with fields ${keys.join(', ') || '(none)'}`;
  return make(expected, (x, path) => {
    if (typeof x !== 'object' || x === null || Array.isArray(x)) throw new ValidationError(path, expected, x);
    const proto = Object.getPrototypeOf(x);
    if (proto !== Object.prototype && proto !== null) throw new ValidationError(path, 'a plain object', x);
    for (const k of Object.keys(x)) {
      if (!Object.prototype.hasOwnProperty.call(shape, k)) throw new ValidationError(`${path}.${k}`, 'no such field', (x as Record<string, unknown>)[k]);
    }
    const out: Record<string, unknown> = Object.create(null);
    for (const k of keys) {
      const v = shape[k].parse((x as Record<string, unknown>)[k], `${path}.${k}`);
      if (v !== undefined) out[k] = v;
    }
    return { ...out } as ObjectOf<S>;
  });
}

/** A string-keyed map with values of one kind (keys limited in length and count). */
export function record<T>(value: Validator<T>, opts: { maxKeys?: number; keyPattern?: RegExp } = {}): Validator<Record<string, T>> {
  const maxKeys = opts.maxKeys ?? 1000;
  const pattern = opts.keyPattern ?? /^[A-Za-z_][A-Za-z0-9_]{0,63}$/;
  const expected = `an object of at most ${maxKeys} entries with names matching ${pattern}`;
  return make(expected, (x, path) => {
    if (typeof x !== 'object' || x === null || Array.isArray(x)) throw new ValidationError(path, expected, x);
    const entries = Object.entries(x);
    if (entries.length > maxKeys) throw new ValidationError(path, expected, x);
    const out: Record<string, T> = {};
    for (const [k, v] of entries) {
      if (!pattern.test(k) || k === '__proto__' || k === 'constructor' || k === 'prototype') throw new ValidationError(`${path}.${k}`, `a name matching ${pattern}`, k);
      out[k] = value.parse(v, `${path}.${k}`);
    }
    return out;
  });
}

/** Any JSON value (depth and size bounded), for opaque documents checked further by their owner. */
export function json(opts: { maxDepth?: number; maxNodes?: number } = {}): Validator<unknown> {
  const maxDepth = opts.maxDepth ?? 32;
  const maxNodes = opts.maxNodes ?? 1_000_000;
  const expected = `a JSON value (depth <= ${maxDepth})`;
  return make(expected, (x, path) => {
    let nodes = 0;
    const walk = (y: unknown, depth: number, p: string): void => {
      if (++nodes > maxNodes) throw new ValidationError(path, `at most ${maxNodes} JSON nodes`, x);
      if (depth > maxDepth) throw new ValidationError(p, expected, y);
      if (y === null || typeof y === 'string' || typeof y === 'boolean') return;
      if (typeof y === 'number') {
        if (!Number.isFinite(y)) throw new ValidationError(p, 'a finite number', y);
        return;
      }
      if (Array.isArray(y)) {
        y.forEach((e, i) => walk(e, depth + 1, `${p}[${i}]`));
        return;
      }
      if (typeof y === 'object') {
        const proto = Object.getPrototypeOf(y);
        if (proto !== Object.prototype && proto !== null) throw new ValidationError(p, 'a plain object', y);
        for (const [k, v] of Object.entries(y)) walk(v, depth + 1, `${p}.${k}`);
        return;
      }
      throw new ValidationError(p, expected, y);
    };
    walk(x, 0, path);
    return x;
  });
}
