// Logarithmic decrement from successive positive peaks: delta = (1/n) ln(x_0 / x_n),
// zeta = delta / sqrt(4 pi^2 + delta^2) (references.md §2, "Logarithmic decrement").
// Peaks are taken of the smoothed position about the run's final mean (its resting point); the
// estimate is the median over runs with at least three positive peaks.

/** Peaks below `minPeak` (e.g. ten times the noise) are ignored. */
export function logDecrementZeta(runs: Float64Array[], minPeak = 0): number | null {
  const est: number[] = [];
  for (const q of runs) {
    const n = q.length;
    if (n < 10) continue;
    const tail = Math.max(1, Math.floor(n / 5));
    let c = 0;
    for (let i = n - tail; i < n; i++) c += q[i];
    c /= tail;
    const peaks: number[] = [];
    for (let i = 1; i + 1 < n; i++) {
      const x = q[i] - c;
      if (x > minPeak && q[i] > q[i - 1] && q[i] >= q[i + 1]) peaks.push(x);
    }
    if (peaks.length < 3) continue;
    const k = peaks.length - 1;
    const delta = Math.log(peaks[0] / peaks[k]) / k;
    if (Number.isFinite(delta)) est.push(delta / Math.sqrt(4 * Math.PI * Math.PI + delta * delta));
  }
  if (est.length === 0) return null;
  est.sort((a, b) => a - b);
  return est[est.length >> 1];
}
