// Median by selection (Hoare's FIND / quickselect, C. A. R. Hoare, CACM 4 (1961) 321, Algorithm 65),
// expected O(n); the Hoare partition keeps equal keys balanced, which matters for time steps that
// are nearly all equal.

/** Reorders a so that a[k] holds the k-th smallest value (0-based). Mutates a. */
export function selectInPlace(a: Float64Array, k: number): number {
  let lo = 0;
  let hi = a.length - 1;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    // median of three as the pivot
    let x = a[lo], y = a[mid], z = a[hi];
    if (x > y) { const s = x; x = y; y = s; }
    if (y > z) { y = z; }
    const pivot = x > y ? x : y;
    let i = lo;
    let j = hi;
    while (i <= j) {
      while (a[i] < pivot) i++;
      while (a[j] > pivot) j--;
      if (i <= j) {
        const s = a[i]; a[i] = a[j]; a[j] = s;
        i++;
        j--;
      }
    }
    if (k <= j) hi = j;
    else if (k >= i) lo = i;
    else break;
  }
  return a[k];
}

/** Median of the values (the upper of the two middle values for an even count); input untouched. */
export function median(values: ArrayLike<number>): number {
  const n = values.length;
  if (n === 0) throw new RangeError('median: values must not be empty');
  const a = Float64Array.from(values);
  return selectInPlace(a, n >> 1);
}
