// Decimation for drawing: split the samples into buckets and keep each bucket's first, minimum,
// maximum and last sample in time order, so peaks and clipping stay visible (common practice
// for plotting long traces, often called min/max decimation).

export function decimateMinMax(t: Float64Array, y: Float64Array, maxPoints: number): { t: number[]; y: number[]; decimated: boolean } {
  const n = t.length;
  if (n <= maxPoints) return { t: Array.from(t), y: Array.from(y), decimated: false };
  const buckets = Math.max(1, Math.floor(maxPoints / 4));
  const outT: number[] = [];
  const outY: number[] = [];
  for (let b = 0; b < buckets; b++) {
    const s = Math.floor((b * n) / buckets);
    const e = Math.floor(((b + 1) * n) / buckets);
    if (e <= s) continue;
    let iMin = s;
    let iMax = s;
    for (let i = s + 1; i < e; i++) {
      if (y[i] < y[iMin]) iMin = i;
      if (y[i] > y[iMax]) iMax = i;
    }
    const picks = [s, iMin, iMax, e - 1].sort((a, c) => a - c);
    let last = -1;
    for (const i of picks) {
      if (i === last) continue;
      outT.push(t[i]);
      outY.push(y[i]);
      last = i;
    }
  }
  return { t: outT, y: outY, decimated: true };
}
