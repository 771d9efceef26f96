// Door checks for matrix arguments of the control solvers: accepts number[][] or an ml-matrix
// Matrix, checks shape, finiteness and (where asked) symmetry, and returns a fresh row-major copy
// so callers' inputs are never touched. Errors name the argument and say what was expected.
import { Matrix } from 'ml-matrix';

/** A dense matrix argument: rows of numbers, or an ml-matrix Matrix. */
export type MatrixInput = ReadonlyArray<ReadonlyArray<number>> | Matrix;

/** Row-major copy of a checked matrix argument. */
export interface DenseCopy { rows: number; cols: number; data: Float64Array }

export function readMatrix(x: unknown, name: string): DenseCopy {
  if (x instanceof Matrix) {
    const rows = x.rows, cols = x.columns;
    const data = new Float64Array(rows * cols);
    for (let i = 0; i < rows; i++) for (let j = 0; j < cols; j++) data[i * cols + j] = x.get(i, j);
    checkFinite(data, cols, name);
    if (rows === 0 || cols === 0) throw new RangeError(`${name}: expected a non-empty matrix, got ${rows}x${cols}`);
    return { rows, cols, data };
  }
  if (!Array.isArray(x)) throw new TypeError(`${name}: expected a matrix (number[][] or ml-matrix Matrix), got ${describe(x)}`);
  const rows = x.length;
  if (rows === 0) throw new RangeError(`${name}: expected a non-empty matrix, got no rows`);
  const first: unknown = x[0];
  if (!Array.isArray(first)) throw new TypeError(`${name}: row 0 is not an array (expected number[][])`);
  const cols = first.length;
  if (cols === 0) throw new RangeError(`${name}: expected a non-empty matrix, row 0 has no entries`);
  const data = new Float64Array(rows * cols);
  for (let i = 0; i < rows; i++) {
    const row: unknown = x[i];
    if (!Array.isArray(row)) throw new TypeError(`${name}: row ${i} is not an array (expected number[][])`);
    if (row.length !== cols) throw new RangeError(`${name}: row ${i} has ${row.length} entries, row 0 has ${cols} (expected a rectangular matrix)`);
    for (let j = 0; j < cols; j++) {
      const v: unknown = row[j];
      if (typeof v !== 'number') throw new TypeError(`${name}[${i}][${j}]: expected a number, got ${describe(v)}`);
      data[i * cols + j] = v;
    }
  }
  checkFinite(data, cols, name);
  return { rows, cols, data };
}

export function expectShape(m: DenseCopy, rows: number, cols: number, name: string, what: string): void {
  if (m.rows !== rows || m.cols !== cols) throw new RangeError(`${name}: expected ${rows}x${cols} (${what}), got ${m.rows}x${m.cols}`);
}

/**
 * Checks symmetry to a relative tolerance (asymmetry beyond rounding is an error, not silently
 * averaged away) and returns the symmetrised copy (M + M')/2 in place.
 */
export function symmetrise(m: DenseCopy, name: string, relTol = 1e-10): DenseCopy {
  const n = m.rows, d = m.data;
  let scale = 0;
  for (let i = 0; i < d.length; i++) scale = Math.max(scale, Math.abs(d[i]));
  for (let i = 0; i < n; i++) {
    for (let j = i + 1; j < n; j++) {
      const a = d[i * n + j], b = d[j * n + i];
      if (Math.abs(a - b) > relTol * scale) {
        throw new RangeError(`${name}: expected a symmetric matrix, but ${name}[${i}][${j}] = ${a} and ${name}[${j}][${i}] = ${b}`);
      }
      const s = 0.5 * (a + b);
      d[i * n + j] = s;
      d[j * n + i] = s;
    }
  }
  return m;
}

export function toMatrix(m: DenseCopy): Matrix {
  return Matrix.from1DArray(m.rows, m.cols, Array.from(m.data));
}

export function toRows(data: ArrayLike<number>, rows: number, cols: number): number[][] {
  const out: number[][] = [];
  for (let i = 0; i < rows; i++) {
    const r: number[] = new Array(cols);
    for (let j = 0; j < cols; j++) r[j] = data[i * cols + j];
    out.push(r);
  }
  return out;
}

function checkFinite(data: Float64Array, cols: number, name: string): void {
  for (let k = 0; k < data.length; k++) {
    if (!Number.isFinite(data[k])) throw new RangeError(`${name}[${Math.floor(k / cols)}][${k % cols}]: expected a finite number, got ${data[k]}`);
  }
}

function describe(x: unknown): string {
  if (x === null) return 'null';
  if (Array.isArray(x)) return 'an array';
  return typeof x === 'number' ? String(x) : typeof x;
}
