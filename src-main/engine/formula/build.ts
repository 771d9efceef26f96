// Simplifying constructors for syntax trees, used by differentiate: they drop the trivial terms
// (0*x, 1*x, x+0, x-0, x/1, x^1, x^0, --x), gather the numeric factors of a product in front
// (a*(2*q)/2 -> a*q) and fold number-only operations whose result prints no longer than its
// operands (2*3 -> 6, but 1/3 and 0.1 + 0.2 stay as written). Negative results are kept as a
// unary minus over a non-negative literal, the form the parser produces, so printed results
// parse back to the same tree.
import type { Ast, FunctionName } from './ast.ts';

export function num(value: number): Ast {
  return value < 0 ? { kind: 'neg', arg: { kind: 'num', value: -value } } : { kind: 'num', value: value === 0 ? 0 : value };
}

/** The value of a literal or a negated literal, else undefined. */
export function numValue(a: Ast): number | undefined {
  if (a.kind === 'num') return a.value;
  if (a.kind === 'neg' && a.arg.kind === 'num') return -a.arg.value;
  return undefined;
}

/**
 * Whether a folded number result is worth keeping: finite, and printed no longer than its
 * operands (+2 characters), so 2*3 -> 6 and 0.5*3 -> 1.5 fold while 0.1+0.2 (which prints as
 * 0.30000000000000004) is left as written.
 */
function foldable(v: number, ...from: number[]): boolean {
  if (!Number.isFinite(v)) return false;
  if (Number.isInteger(v)) return Math.abs(v) <= Number.MAX_SAFE_INTEGER;
  return String(v).length <= Math.max(...from.map((x) => String(x).length)) + 2;
}

/** Splits a into k * rest: k a number (1 if none), rest undefined when a is a number. */
function coef(a: Ast): { k: number; rest: Ast | undefined } {
  const v = numValue(a);
  if (v !== undefined) return { k: v, rest: undefined };
  if (a.kind === 'neg') {
    const c = coef(a.arg);
    return { k: -c.k, rest: c.rest };
  }
  if (a.kind === 'bin' && a.op === '*') {
    const c = coef(a.left);
    if (c.k === 1 && c.rest === a.left) return { k: 1, rest: a }; // no factor: keep the node (and sharing)
    return { k: c.k, rest: c.rest ? { kind: 'bin', op: '*', left: c.rest, right: a.right } : a.right };
  }
  return { k: 1, rest: a };
}

/** r1 * r2 as a left-deep product (a*b*c prints without parentheses). */
function joinMul(r1: Ast | undefined, r2: Ast | undefined): Ast | undefined {
  if (!r1) return r2;
  if (!r2) return r1;
  if (r2.kind === 'bin' && r2.op === '*') return { kind: 'bin', op: '*', left: joinMul(r1, r2.left) as Ast, right: r2.right };
  return { kind: 'bin', op: '*', left: r1, right: r2 };
}

/** k * rest with the number leftmost (2*m*l^2, not m*l^2*2). */
function scale(k: number, rest: Ast | undefined): Ast {
  if (!rest || k === 0) return num(rest ? 0 : k);
  if (k === 1) return rest;
  if (k < 0) return neg(scale(-k, rest));
  return joinMul(num(k), rest) as Ast;
}

export function neg(a: Ast): Ast {
  const k = numValue(a);
  if (k !== undefined) return num(-k);
  if (a.kind === 'neg') return a.arg;
  if (a.kind === 'bin' && a.op === '-') return sub(a.right, a.left);
  return { kind: 'neg', arg: a };
}

export function add(a: Ast, b: Ast): Ast {
  const ka = numValue(a), kb = numValue(b);
  if (ka !== undefined && kb !== undefined && foldable(ka + kb, ka, kb)) return num(ka + kb);
  if (ka === 0) return b;
  if (kb === 0) return a;
  if (b.kind === 'neg') return sub(a, b.arg);
  if (a.kind === 'neg') return sub(b, a.arg);
  return { kind: 'bin', op: '+', left: a, right: b };
}

export function sub(a: Ast, b: Ast): Ast {
  const ka = numValue(a), kb = numValue(b);
  if (ka !== undefined && kb !== undefined && foldable(ka - kb, ka, kb)) return num(ka - kb);
  if (kb === 0) return a;
  if (ka === 0) return neg(b);
  if (b.kind === 'neg') return add(a, b.arg);
  return { kind: 'bin', op: '-', left: a, right: b };
}

export function mul(a: Ast, b: Ast): Ast {
  const ca = coef(a), cb = coef(b);
  if (ca.k === 0 || cb.k === 0) return num(0);
  const k = ca.k * cb.k;
  if (ca.k === 1 || cb.k === 1 || foldable(k, ca.k, cb.k)) return scale(k, joinMul(ca.rest, cb.rest));
  return { kind: 'bin', op: '*', left: a, right: b };
}

export function div(a: Ast, b: Ast): Ast {
  const ca = coef(a), cb = coef(b);
  if (cb.k === 0) return { kind: 'bin', op: '/', left: a, right: b };
  if (ca.k === 0) return num(0);
  const k = ca.k / cb.k;
  if (Math.abs(ca.k) !== 1 && foldable(k, ca.k, cb.k)) {
    if (!cb.rest) return scale(k, ca.rest);
    return scale(k, { kind: 'bin', op: '/', left: ca.rest ?? num(1), right: cb.rest });
  }
  if (cb.k === 1 && !cb.rest) return a;
  return { kind: 'bin', op: '/', left: a, right: b };
}

export function pow(a: Ast, b: Ast): Ast {
  const ka = numValue(a), kb = numValue(b);
  if (kb === 0) return num(1);
  if (kb === 1) return a;
  if (ka === 1) return num(1);
  if (ka !== undefined && kb !== undefined && foldable(Math.pow(ka, kb), ka, kb)) return num(Math.pow(ka, kb));
  return { kind: 'bin', op: '^', left: a, right: b };
}

export function call(name: FunctionName, ...args: Ast[]): Ast {
  return { kind: 'call', name, args };
}
