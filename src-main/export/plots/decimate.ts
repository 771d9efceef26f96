// Decimation for drawing: keeps, per bucket of consecutive samples, the first, the smallest and
// the largest sample (in time order), so peaks survive and a path never has more than about
// 3 x buckets points (the usual min/max envelope of waveform displays; common practice).

/** Indices to draw, increasing. */
export function decimateIndices(y: ArrayLike<number>, buckets = 1500): number[] {
  const n = y.length;
  if (n <= 3 * buckets) return Array.from({ length: n }, (_, i) => i);
  const out: number[] = [];
  const size = n / buckets;
  for (let b = 0; b < buckets; b++) {
    const s = Math.floor(b * size), e = Math.min(n, Math.floor((b + 1) * size));
    if (e <= s) continue;
    let lo = s, hi = s;
    for (let i = s + 1; i < e; i++) { if (y[i] < y[lo]) lo = i; if (y[i] > y[hi]) hi = i; }
    const pick = [s, lo, hi].sort((a, c) => a - c);
    for (let k = 0; k < 3; k++) if (k === 0 || pick[k] !== pick[k - 1]) out.push(pick[k]);
  }
  if (out[out.length - 1] !== n - 1) out.push(n - 1);
  return out;
}
