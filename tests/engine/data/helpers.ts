// Shared helpers for the recordings-import tests: CSV builders and an error catcher.
import { DataError } from '../../../src-main/engine/data/index.ts';

/** Runs f and returns the DataError it throws (fails the test when it throws nothing or something else). */
export function dataError(f: () => unknown): DataError {
  try {
    f();
  } catch (e) {
    if (e instanceof DataError) return e;
    throw e;
  }
  throw new Error('expected a DataError, nothing was thrown');
}

export async function dataErrorAsync(f: () => Promise<unknown>): Promise<DataError> {
  try {
    await f();
  } catch (e) {
    if (e instanceof DataError) return e;
    throw e;
  }
  throw new Error('expected a DataError, nothing was thrown');
}

/** Rows of text fields joined into CSV text. */
export function csv(header: string[], rows: (string | number)[][], delim = ',', eol = '\n'): string {
  return [header.join(delim), ...rows.map((r) => r.join(delim))].join(eol) + eol;
}

/** n samples of a lightly damped swing, time step dt, as [t, q] text fields (6 decimals). */
export function swingRows(n: number, dt = 0.01, t0 = 0, amp = 0.6): string[][] {
  const rows: string[][] = [];
  for (let i = 0; i < n; i++) {
    const t = t0 + i * dt;
    rows.push([t.toFixed(4), (amp * Math.exp(-0.05 * t) * Math.cos(2 * Math.PI * 1.1 * t)).toFixed(6)]);
  }
  return rows;
}
