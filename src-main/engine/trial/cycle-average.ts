// Cycle-averaged energy: the mean of H over each swing period. Periods run from one downward zero
// crossing of v (a turning point at the positive extreme of q) to the next, so each window holds
// one full swing whatever the shape of the potential; the samples of a window are averaged with
// equal weight (uniform sampling). Before the first crossing and whenever no crossing comes for
// `maxWindow` seconds (at rest, creeping, or rotating over the top), a window is closed after
// maxWindow seconds instead, so the series never stalls. Each window is reported at its end time
// (the moment its average is known), which is what the band-entry time is measured on.

export interface CycleAverages {
  /** Window start and end times (end = the time the average is reported at). */
  start: Float64Array;
  end: Float64Array;
  /** Mean of H over the window. */
  mean: Float64Array;
  /** Index range [first, last) of the trace samples in each window. */
  first: Int32Array;
  last: Int32Array;
}

export const DEFAULT_MAX_WINDOW = 10;

export function cycleAverages(t: ArrayLike<number>, v: ArrayLike<number>, H: ArrayLike<number>, maxWindow = DEFAULT_MAX_WINDOW): CycleAverages {
  const n = t.length;
  if (v.length !== n || H.length !== n) throw new RangeError(`cycleAverages: t, v and H must share one length (got ${n}, ${v.length}, ${H.length})`);
  if (!(maxWindow > 0)) throw new RangeError(`cycleAverages: maxWindow must be > 0 s, got ${maxWindow}`);
  const start: number[] = [], end: number[] = [], mean: number[] = [], first: number[] = [], last: number[] = [];
  let started = false;
  let i0 = 0;
  let sum = 0;
  const emit = (i1: number) => {
    if (started && i1 > i0) {
      start.push(t[i0]); end.push(t[i1]); mean.push(sum / (i1 - i0)); first.push(i0); last.push(i1);
    }
    started = true;
    i0 = i1;
    sum = 0;
  };
  for (let i = 0; i < n; i++) {
    if (i > 0) {
      const crossing = v[i - 1] > 0 && v[i] <= 0;
      if (crossing || t[i] - t[i0] >= maxWindow) {
        if (!started && !crossing) started = true; // a long stretch without swinging counts as a window
        emit(i);
      }
    }
    sum += H[i];
  }
  return { start: Float64Array.from(start), end: Float64Array.from(end), mean: Float64Array.from(mean), first: Int32Array.from(first), last: Int32Array.from(last) };
}
