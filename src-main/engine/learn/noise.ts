// Position noise level from third differences: for white noise of variance s^2 the third
// difference has variance 20 s^2 (binomial coefficients 1, 3, 3, 1), while a signal sampled well
// above its bandwidth contributes little (common practice in instrumentation; the
// variate-difference method of Tintner, "The Variate Difference Method", 1940). The median of
// |diff| (scaled for a Gaussian, 0.6745) keeps rare spikes from dominating.

export function noiseSigma(x: Float64Array): number {
  const n = x.length;
  if (n < 8) return NaN;
  const d = new Float64Array(n - 3);
  for (let i = 0; i + 3 < n; i++) d[i] = Math.abs(x[i + 3] - 3 * x[i + 2] + 3 * x[i + 1] - x[i]);
  d.sort();
  const med = d[d.length >> 1];
  return med / 0.6745 / Math.sqrt(20);
}
