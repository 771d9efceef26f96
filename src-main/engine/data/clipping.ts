// Clipping detector: stretches of at least minRun consecutive samples that sit exactly at the
// channel's minimum or maximum, the signature of a saturated sensor or ADC (common practice).
// A slow signal that is also coarsely quantized can dwell at its extreme level near a turning
// point, so this is a warning for a person to look at, not an error.

export interface ClipSide {
  /** The extreme value (the channel's min or max). */
  value: number;
  /** Number of stretches of >= minRun samples at that value. */
  stretches: number;
  /** Samples in all those stretches together. */
  samples: number;
  /** First index and length of the longest stretch (start -1 when there is none). */
  longestStart: number;
  longestLength: number;
}

export interface Clipping {
  min: ClipSide;
  max: ClipSide;
}

function side(x: Float64Array, value: number, minRun: number): ClipSide {
  const s: ClipSide = { value, stretches: 0, samples: 0, longestStart: -1, longestLength: 0 };
  const n = x.length;
  let i = 0;
  while (i < n) {
    if (x[i] !== value) { i++; continue; }
    let j = i + 1;
    while (j < n && x[j] === value) j++;
    const len = j - i;
    if (len >= minRun) {
      s.stretches++;
      s.samples += len;
      if (len > s.longestLength) { s.longestLength = len; s.longestStart = i; }
    }
    i = j;
  }
  return s;
}

/** Stretches at the minimum and the maximum of x (pass them in when known, to save a pass). */
export function findClipping(x: Float64Array, minRun: number, range?: { min: number; max: number }): Clipping {
  if (!Number.isInteger(minRun) || minRun < 1) throw new RangeError(`findClipping: minRun must be a positive integer, got ${minRun}`);
  let lo = Infinity;
  let hi = -Infinity;
  if (range !== undefined) {
    lo = range.min;
    hi = range.max;
  } else {
    for (let i = 0; i < x.length; i++) {
      const v = x[i];
      if (v < lo) lo = v;
      if (v > hi) hi = v;
    }
  }
  return { min: side(x, lo, minRun), max: side(x, hi, minRun) };
}
