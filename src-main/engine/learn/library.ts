// Term library over the state (q, v) for learning a Koopman eigenfunction as a linear combination
// of candidate terms (the dictionary of EDMD/SINDy-type methods: Williams, Kevrekidis & Rowley,
// J. Nonlinear Sci. 25 (2015) 1307; Brunton, Proctor & Kutz, PNAS 113 (2016) 3932).
// Each term evaluates into Float64Array columns, prints itself and knows its partial derivatives.

/** q^a v^b (a + b >= 1). */
export interface MonomialTerm { kind: 'mono'; a: number; b: number }
/** cos(k q) v^b or sin(k q) v^b, k >= 1 (angle coordinates). */
export interface TrigTerm { kind: 'trig'; fn: 'cos' | 'sin'; k: number; b: number }
/** A term written by the user as a formula in q and v (compiled by the formula parser). */
export interface UserTerm {
  kind: 'user';
  source: string;
  f: (q: number, v: number) => number;
  dq: (q: number, v: number) => number;
  dv: (q: number, v: number) => number;
}
export type Term = MonomialTerm | TrigTerm | UserTerm;

export interface LibraryOptions {
  coordinate: 'angle' | 'linear';
  /** Total degree d (>= 1). Monomials: 1 <= a + b <= d. Angles: trig terms count k + b, v^b counts b. */
  degree: number;
  /** Highest harmonic k for angles; default d. */
  harmonics?: number;
  /**
   * Only even powers of v (H(q, v) = H(q, -v)): the energy of a time-reversible rig without
   * gyroscopic or magnetic forces is even in v (Goldstein, "Classical Mechanics", §1.5, from memory).
   */
  evenV?: boolean;
  userTerms?: UserTerm[];
}

/** Builds the term list for a degree; the order is deterministic (lower degree first). */
export function buildLibrary(opts: LibraryOptions): Term[] {
  const d = opts.degree;
  if (!Number.isInteger(d) || d < 1 || d > 12) throw new RangeError(`buildLibrary: degree must be an integer in 1..12, got ${d}`);
  const terms: Term[] = [];
  const keep = (b: number) => !opts.evenV || b % 2 === 0;
  if (opts.coordinate === 'linear') {
    for (let deg = 1; deg <= d; deg++) for (let b = 0; b <= deg; b++) if (keep(b)) terms.push({ kind: 'mono', a: deg - b, b });
  } else {
    const K = opts.harmonics ?? d;
    if (!Number.isInteger(K) || K < 1) throw new RangeError(`buildLibrary: harmonics must be a positive integer, got ${K}`);
    for (let deg = 1; deg <= d; deg++) {
      for (let k = 1; k <= Math.min(K, deg); k++) {
        const b = deg - k;
        if (keep(b)) terms.push({ kind: 'trig', fn: 'cos', k, b }, { kind: 'trig', fn: 'sin', k, b });
      }
      if (keep(deg)) terms.push({ kind: 'mono', a: 0, b: deg });
    }
  }
  for (const u of opts.userTerms ?? []) terms.push(u);
  return terms;
}

/** Largest power of q and of v and largest harmonic used by the library (sizes the work arrays). */
function extents(terms: Term[]): { maxA: number; maxB: number; maxK: number } {
  let maxA = 0, maxB = 0, maxK = 0;
  for (const t of terms) {
    if (t.kind === 'mono') { maxA = Math.max(maxA, t.a); maxB = Math.max(maxB, t.b); }
    else if (t.kind === 'trig') { maxK = Math.max(maxK, t.k); maxB = Math.max(maxB, t.b); }
  }
  return { maxA, maxB, maxK };
}

/** Reusable evaluator: writes the terms of rows [0, n) column-major into out (out[j * stride + i]). */
export interface TermEvaluator {
  p: number;
  evaluate(q: Float64Array, v: Float64Array, from: number, n: number, out: Float64Array, stride: number): void;
  /** Time derivatives d/dt theta_j = dtheta_j/dq * v + dtheta_j/dv * a (chain rule), same layout. */
  rates(q: Float64Array, v: Float64Array, a: Float64Array, from: number, n: number, out: Float64Array, stride: number): void;
}

export function termEvaluator(terms: Term[], maxRows: number): TermEvaluator {
  const { maxA, maxB, maxK } = extents(terms);
  const qp = Array.from({ length: maxA + 1 }, () => new Float64Array(maxRows));
  const vp = Array.from({ length: maxB + 1 }, () => new Float64Array(maxRows));
  const cs = Array.from({ length: maxK + 1 }, () => new Float64Array(maxRows));
  const sn = Array.from({ length: maxK + 1 }, () => new Float64Array(maxRows));
  const fill = (q: Float64Array, v: Float64Array, from: number, n: number) => {
    if (n > maxRows) throw new RangeError(`termEvaluator: n=${n} exceeds maxRows=${maxRows}`);
    qp[0].fill(1, 0, n); vp[0].fill(1, 0, n);
    for (let a = 1; a <= maxA; a++) { const prev = qp[a - 1], cur = qp[a]; for (let i = 0; i < n; i++) cur[i] = prev[i] * q[from + i]; }
    for (let b = 1; b <= maxB; b++) { const prev = vp[b - 1], cur = vp[b]; for (let i = 0; i < n; i++) cur[i] = prev[i] * v[from + i]; }
    if (maxK >= 1) {
      const c1 = cs[1], s1 = sn[1];
      for (let i = 0; i < n; i++) { c1[i] = Math.cos(q[from + i]); s1[i] = Math.sin(q[from + i]); }
      // Angle-addition recurrences: cos(kq) = 2cos q cos((k-1)q) - cos((k-2)q), same for sin (A&S 4.3.17 ff.).
      cs[0].fill(1, 0, n); sn[0].fill(0, 0, n);
      for (let k = 2; k <= maxK; k++) {
        const c = cs[k], s = sn[k], cp = cs[k - 1], cpp = cs[k - 2], sp = sn[k - 1], spp = sn[k - 2];
        for (let i = 0; i < n; i++) { c[i] = 2 * c1[i] * cp[i] - cpp[i]; s[i] = 2 * c1[i] * sp[i] - spp[i]; }
      }
    }
  };
  return {
    p: terms.length,
    evaluate(q, v, from, n, out, stride) {
      fill(q, v, from, n);
      for (let j = 0; j < terms.length; j++) {
        const t = terms[j];
        const o = j * stride;
        if (t.kind === 'user') {
          for (let i = 0; i < n; i++) out[o + i] = t.f(q[from + i], v[from + i]);
          continue;
        }
        const left = t.kind === 'mono' ? qp[t.a] : (t.fn === 'cos' ? cs[t.k] : sn[t.k]);
        const right = vp[t.b];
        for (let i = 0; i < n; i++) out[o + i] = left[i] * right[i];
      }
    },
    rates(q, v, acc, from, n, out, stride) {
      fill(q, v, from, n);
      for (let j = 0; j < terms.length; j++) {
        const t = terms[j];
        const o = j * stride;
        if (t.kind === 'user') {
          for (let i = 0; i < n; i++) out[o + i] = t.dq(q[from + i], v[from + i]) * v[from + i] + t.dv(q[from + i], v[from + i]) * acc[from + i];
          continue;
        }
        const b = t.b;
        if (t.kind === 'mono') {
          const A = t.a, qa = qp[A], qa1 = A > 0 ? qp[A - 1] : qa, vb = vp[b], vb1 = b > 0 ? vp[b - 1] : vb;
          for (let i = 0; i < n; i++) out[o + i] = (A > 0 ? A * qa1[i] * vb[i] * v[from + i] : 0) + (b > 0 ? b * qa[i] * vb1[i] * acc[from + i] : 0);
        } else {
          const f = t.fn === 'cos' ? cs[t.k] : sn[t.k];
          const df = t.fn === 'cos' ? sn[t.k] : cs[t.k];
          const sg = t.fn === 'cos' ? -t.k : t.k;
          const vb = vp[b], vb1 = b > 0 ? vp[b - 1] : vb;
          for (let i = 0; i < n; i++) out[o + i] = sg * df[i] * vb[i] * v[from + i] + (b > 0 ? b * f[i] * vb1[i] * acc[from + i] : 0);
        }
      }
    },
  };
}

/** Value of one term at a point. */
export function termValue(t: Term, q: number, v: number): number {
  if (t.kind === 'mono') return q ** t.a * v ** t.b;
  if (t.kind === 'trig') return (t.fn === 'cos' ? Math.cos(t.k * q) : Math.sin(t.k * q)) * v ** t.b;
  return t.f(q, v);
}

/** Partial derivatives of one term: writes [d/dq, d/dv] into out. */
export function termGrad(t: Term, q: number, v: number, out: Float64Array): void {
  if (t.kind === 'mono') {
    out[0] = t.a === 0 ? 0 : t.a * q ** (t.a - 1) * v ** t.b;
    out[1] = t.b === 0 ? 0 : t.b * q ** t.a * v ** (t.b - 1);
  } else if (t.kind === 'trig') {
    const c = Math.cos(t.k * q), s = Math.sin(t.k * q);
    const f = t.fn === 'cos' ? c : s;
    const df = t.fn === 'cos' ? -t.k * s : t.k * c;
    out[0] = df * v ** t.b;
    out[1] = t.b === 0 ? 0 : f * t.b * v ** (t.b - 1);
  } else {
    out[0] = t.dq(q, v);
    out[1] = t.dv(q, v);
  }
}

/** Power of v carried by a term (user terms: -1, unknown). */
export function vPower(t: Term): number {
  return t.kind === 'user' ? -1 : t.b;
}

function pow(name: string, e: number): string {
  return e === 0 ? '' : e === 1 ? name : `${name}^${e}`;
}

/** Readable form of a term, in the syntax of our formula parser (q, v, ^, cos, sin). */
export function termLabel(t: Term): string {
  if (t.kind === 'user') return `(${t.source})`;
  const parts: string[] = [];
  if (t.kind === 'mono') { if (t.a) parts.push(pow('q', t.a)); }
  else parts.push(`${t.fn}(${t.k === 1 ? '' : `${t.k}*`}q)`);
  if (t.b) parts.push(pow('v', t.b));
  return parts.join('*');
}

/** Number formatted for formulas: 6 significant digits, no exponent surprises. */
export function formatCoefficient(x: number): string {
  const s = x.toPrecision(6);
  return s.includes('e') ? s : String(Number(s));
}

/** Readable formula sum_j coef_j * term_j (+ constant), skipping zero coefficients. */
export function formulaOf(terms: Term[], coef: ArrayLike<number>, constant = 0): string {
  const parts: string[] = [];
  for (let j = 0; j < terms.length; j++) {
    const c = coef[j];
    if (c === 0) continue;
    const mag = formatCoefficient(Math.abs(c));
    const body = mag === '1' ? termLabel(terms[j]) : `${mag}*${termLabel(terms[j])}`;
    parts.push(`${c < 0 ? '- ' : parts.length ? '+ ' : ''}${body}`);
  }
  if (constant !== 0) parts.push(`${constant < 0 ? '- ' : parts.length ? '+ ' : ''}${formatCoefficient(Math.abs(constant))}`);
  return parts.length ? parts.join(' ') : '0';
}
