// In-place radix-2 fast Fourier transform, decimation in time with bit-reversed input order
// (Cooley & Tukey, Math. Comp. 19 (1965) 297). Forward sign convention X_k = sum_n x_n e^{-2 pi i k n / N}.

/** Transforms (re, im) in place; the length must be a power of two and the same for both. */
export function fftInPlace(re: Float64Array, im: Float64Array): void {
  const n = re.length;
  if (im.length !== n) throw new RangeError(`fftInPlace: re and im lengths differ (${n} vs ${im.length})`);
  if (n < 1 || (n & (n - 1)) !== 0) throw new RangeError(`fftInPlace: length must be a power of two, got ${n}`);
  // Bit-reversal permutation.
  for (let i = 1, j = 0; i < n; i++) {
    let bit = n >> 1;
    for (; j & bit; bit >>= 1) j ^= bit;
    j ^= bit;
    if (i < j) {
      let t = re[i]; re[i] = re[j]; re[j] = t;
      t = im[i]; im[i] = im[j]; im[j] = t;
    }
  }
  // Butterflies; twiddles by direct cos/sin per stage entry (accurate to rounding, no drift).
  for (let size = 2; size <= n; size <<= 1) {
    const half = size >> 1;
    const step = (-2 * Math.PI) / size;
    for (let k = 0; k < half; k++) {
      const wr = Math.cos(step * k), wi = Math.sin(step * k);
      for (let s = k; s < n; s += size) {
        const t = s + half;
        const xr = re[t] * wr - im[t] * wi;
        const xi = re[t] * wi + im[t] * wr;
        re[t] = re[s] - xr; im[t] = im[s] - xi;
        re[s] += xr; im[s] += xi;
      }
    }
  }
}
