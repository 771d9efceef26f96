// Time to enter and stay in a band: the first time after which every later sample y_k lies within
// |y_k - target| <= halfWidth. The entry is placed by linear interpolation between the last sample
// outside the band and the next one (inside); a series that starts inside has entry time t[0].
// Common practice (the settling-time definition of control textbooks, e.g. Ogata, "Modern Control
// Engineering", 5th ed., §5-3, applied to a sampled series).

/** Returns the entry time, or null when the last sample is outside the band (never settles). */
export function timeToBand(t: ArrayLike<number>, y: ArrayLike<number>, target: number, halfWidth: number): number | null {
  const n = t.length;
  if (y.length !== n) throw new RangeError(`timeToBand: t and y must share one length (got ${n}, ${y.length})`);
  if (!(halfWidth >= 0)) throw new RangeError(`timeToBand: halfWidth must be >= 0, got ${halfWidth}`);
  if (n === 0) return null;
  let k = n - 1;
  if (!(Math.abs(y[k] - target) <= halfWidth)) return null;
  while (k > 0 && Math.abs(y[k - 1] - target) <= halfWidth) k--;
  if (k === 0) return t[0];
  // y[k-1] outside, y[k] inside: interpolate where the distance reaches halfWidth.
  const yo = y[k - 1], yi = y[k];
  const edge = yo > target ? target + halfWidth : target - halfWidth;
  const f = (edge - yo) / (yi - yo);
  return t[k - 1] + Math.min(1, Math.max(0, f)) * (t[k] - t[k - 1]);
}
