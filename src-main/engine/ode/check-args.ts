// Argument checks shared by the integrators: each throws once, at the door, naming the argument.
// (No numerics here; see the solver files for the methods and their references.)

/** Throws a RangeError of the form "<fn>: <name> must be <what>, got <value>". */
export function argError(fn: string, name: string, what: string, got: unknown): RangeError {
  return new RangeError(`${fn}: ${name} must be ${what}, got ${describe(got)}`);
}

function describe(v: unknown): string {
  if (typeof v === 'number') return String(v);
  if (typeof v === 'string') return JSON.stringify(v);
  if (v === null) return 'null';
  if (Array.isArray(v)) return `an array of length ${v.length}`;
  if (ArrayBuffer.isView(v)) return `a ${v.constructor.name} of length ${(v as unknown as ArrayLike<number>).length}`;
  return typeof v;
}

export function checkFunction(fn: string, name: string, f: unknown): void {
  if (typeof f !== 'function') throw argError(fn, name, 'a function', f);
}

export function checkFinite(fn: string, name: string, x: unknown): number {
  if (typeof x !== 'number' || !Number.isFinite(x)) throw argError(fn, name, 'a finite number', x);
  return x;
}

export function checkPositive(fn: string, name: string, x: unknown): number {
  if (typeof x !== 'number' || !Number.isFinite(x) || !(x > 0)) throw argError(fn, name, 'a positive finite number', x);
  return x;
}

export function checkInteger(fn: string, name: string, x: unknown, min: number): number {
  if (typeof x !== 'number' || !Number.isInteger(x) || x < min) throw argError(fn, name, `an integer >= ${min}`, x);
  return x;
}

/** Copies a non-empty array-like of finite numbers into a fresh Float64Array (the caller's array is left alone). */
export function checkVector(fn: string, name: string, v: unknown, length?: number): Float64Array {
  if (v === null || typeof v !== 'object' || typeof (v as ArrayLike<number>).length !== 'number') {
    throw argError(fn, name, 'an array of numbers', v);
  }
  const a = v as ArrayLike<number>;
  if (length === undefined ? a.length < 1 : a.length !== length) {
    throw argError(fn, name, length === undefined ? 'a non-empty array of numbers' : `an array of length ${length}`, v);
  }
  const out = new Float64Array(a.length);
  for (let i = 0; i < a.length; i++) {
    const x = a[i];
    if (typeof x !== 'number' || !Number.isFinite(x)) {
      throw new RangeError(`${fn}: ${name}[${i}] must be a finite number, got ${describe(x)}`);
    }
    out[i] = x;
  }
  return out;
}

/** A tolerance given as one number or one per component; returns one per component. */
export function checkTolerance(fn: string, name: string, v: unknown, n: number, allowZero: boolean): Float64Array {
  const what = allowZero ? 'a non-negative finite number' : 'a positive finite number';
  if (typeof v === 'number') {
    if (!Number.isFinite(v) || v < 0 || (!allowZero && v === 0)) throw argError(fn, name, `${what} or an array of ${n} such numbers`, v);
    return new Float64Array(n).fill(v);
  }
  const a = checkVector(fn, name, v, n);
  for (let i = 0; i < n; i++) {
    if (a[i] < 0 || (!allowZero && a[i] === 0)) throw new RangeError(`${fn}: ${name}[${i}] must be ${what}, got ${a[i]}`);
  }
  return a;
}
