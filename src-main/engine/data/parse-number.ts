// Byte-level decimal number parser for CSV fields.
// Fast path: Clinger's exact case (W. D. Clinger, "How to read floating point numbers accurately",
// PLDI 1990, the "fast path"): when the decimal significand M is below 2^53 and the decimal exponent
// E satisfies |E| <= 22, both M and 10^|E| are exact doubles, so the one IEEE multiplication or
// division M * 10^E (M / 10^-E) is correctly rounded and equals Number(text) bit for bit.
// A well-formed decimal outside that case (17 significant digits, huge exponents) goes to Number()
// directly; anything else (quotes, odd spellings) is checked against a plain decimal pattern first,
// and "NaN", "Infinity", hex and the like are rejected.
import { CR, NL, SPACE, TAB, decodeBytes, fieldEnd, unquoteField } from './csv-bytes.ts';

export const NUM_OK = 0;
/** The field is empty (or only blanks). */
export const NUM_MISSING = 1;
/** The field holds something that is not a finite decimal number. */
export const NUM_INVALID = 2;

/**
 * Where a scan ended and how it went; reused between calls. The value goes into a one-element
 * Float64Array rather than a return value: a double returned from (or passed to) a function the
 * JIT does not inline is boxed on the heap, and at 20 million numbers per file that garbage costs
 * hundreds of minor collections.
 */
export interface NumberScan {
  /** value[0]: the number read (NaN when status is not NUM_OK). */
  value: Float64Array;
  /** Index of the byte that ended the field (delimiter, '\n' or the '\r' of "\r\n"). */
  end: number;
  status: number;
  /** The field's text when status is not NUM_OK (for the error message). */
  text: string;
}

export function numberScan(): NumberScan {
  return { value: new Float64Array(1), end: 0, status: NUM_OK, text: '' };
}

const POW10 = new Float64Array(23);
for (let k = 0, p = 1; k <= 22; k++, p *= 10) POW10[k] = p; // 10^k, k <= 22, all exact in binary64
const TWO53 = 9007199254740992;
const DECIMAL = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;

/**
 * Parses the field starting at p (ending at delim, '\n' or "\r\n"); blanks around the number are
 * allowed. Sets out.value[0], out.end and out.status and returns the status; on failure the value
 * is NaN and out.text holds the field. The bytes from p must contain a '\n' (see csv-bytes.ts).
 */
export function scanNumber(b: Uint8Array, p: number, delim: number, out: NumberScan): number {
  let i = p;
  let c = b[i];
  while (c === SPACE || (c === TAB && delim !== TAB)) c = b[++i];
  const start = i;
  let neg = false;
  if (c === 45) { neg = true; c = b[++i]; } else if (c === 43) c = b[++i];
  let m = 0;
  let e10 = 0;
  let digits = 0;
  while (c >= 48 && c <= 57) {
    m = m * 10 + (c - 48);
    digits++;
    c = b[++i];
  }
  if (c === 46) {
    c = b[++i];
    while (c >= 48 && c <= 57) {
      m = m * 10 + (c - 48);
      e10--;
      digits++;
      c = b[++i];
    }
  }
  if (digits === 0) return slowNumber(b, p, delim, out);
  if (c === 101 || c === 69) {
    c = b[++i];
    let eneg = false;
    if (c === 45) { eneg = true; c = b[++i]; } else if (c === 43) c = b[++i];
    if (!(c >= 48 && c <= 57)) return slowNumber(b, p, delim, out);
    let e = 0;
    while (c >= 48 && c <= 57) {
      if (e < 100000) e = e * 10 + (c - 48);
      c = b[++i];
    }
    e10 += eneg ? -e : e;
  }
  const stop = i;
  while (c === SPACE || (c === TAB && delim !== TAB)) c = b[++i];
  if (!(c === delim || c === NL || (c === CR && b[i + 1] === NL))) return slowNumber(b, p, delim, out);
  out.end = i;
  out.status = NUM_OK;
  // m is exact while it stays below 2^53 (every partial sum is smaller than the final one).
  let v: number;
  if (m >= TWO53 || e10 > 22 || e10 < -22) {
    // A well-formed plain decimal outside the exact case (e.g. 17 significant digits): Number() rounds it.
    v = Number(String.fromCharCode.apply(null, b.subarray(start, stop) as unknown as number[]));
    if (!Number.isFinite(v)) return slowNumber(b, p, delim, out);
    out.value[0] = v;
    return NUM_OK;
  }
  if (m === 0) v = 0;
  else if (e10 >= 0) v = m * POW10[e10];
  else v = m / POW10[-e10];
  out.value[0] = neg ? -v : v;
  return NUM_OK;
}

/** The general case: find the field, check it is a plain decimal, let Number() round it. */
function slowNumber(b: Uint8Array, p: number, delim: number, out: NumberScan): number {
  const e = fieldEnd(b, p, delim);
  out.end = e;
  out.value[0] = NaN;
  const text = unquoteField(decodeBytes(b, p, e));
  if (text === '') {
    out.text = '';
    return (out.status = NUM_MISSING);
  }
  const v = DECIMAL.test(text) ? Number(text) : NaN;
  if (!Number.isFinite(v)) {
    out.text = text;
    return (out.status = NUM_INVALID);
  }
  out.value[0] = v;
  return (out.status = NUM_OK);
}

const encoder = new TextEncoder();

/** Parses one number written as text with the same rules (NaN when it is not one); for tests and the UI. */
export function parseNumberText(text: string): number {
  const b = encoder.encode(text + '\n');
  const out = numberScan();
  const status = scanNumber(b, 0, NL, out);
  return status === NUM_OK && out.end === b.length - 1 ? out.value[0] : NaN;
}
