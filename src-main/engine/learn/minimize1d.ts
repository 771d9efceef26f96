// Minimisation of a function of one variable on an interval: a coarse scan to bracket the
// global minimum, then golden-section search (Kiefer 1953; Press et al., "Numerical Recipes",
// 3rd ed., §10.2).

export interface Minimum1d { x: number; f: number; evaluations: number }

export function minimize1d(f: (x: number) => number, lo: number, hi: number, opts: { scan?: number; tol?: number; maxIter?: number } = {}): Minimum1d {
  if (!(hi > lo)) throw new RangeError(`minimize1d: need lo < hi, got [${lo}, ${hi}]`);
  const scan = opts.scan ?? 12;
  const tol = opts.tol ?? 1e-6 * (hi - lo);
  let evaluations = 0;
  const F = (x: number) => { evaluations++; const y = f(x); return Number.isFinite(y) ? y : Infinity; };
  const xs: number[] = [], fs: number[] = [];
  for (let i = 0; i <= scan; i++) { const x = lo + ((hi - lo) * i) / scan; xs.push(x); fs.push(F(x)); }
  let k = 0;
  for (let i = 1; i <= scan; i++) if (fs[i] < fs[k]) k = i;
  let a = xs[Math.max(0, k - 1)], b = xs[Math.min(scan, k + 1)];
  const g = (Math.sqrt(5) - 1) / 2;
  let c = b - g * (b - a), d = a + g * (b - a);
  let fc = F(c), fd = F(d);
  for (let it = 0; it < (opts.maxIter ?? 80) && b - a > tol; it++) {
    if (fc < fd) { b = d; d = c; fd = fc; c = b - g * (b - a); fc = F(c); }
    else { a = c; c = d; fc = fd; d = a + g * (b - a); fd = F(d); }
  }
  let x = fc < fd ? c : d, fx = Math.min(fc, fd);
  if (fs[k] < fx) { x = xs[k]; fx = fs[k]; }
  return { x, f: fx, evaluations };
}
