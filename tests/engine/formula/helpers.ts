// Shared test helpers for the formula language: a seeded PRNG, random trees, an independent
// tree-walking evaluator and column stripping for structural comparison.
import type { Ast, FunctionName } from '../../../src-main/engine/formula/index.ts';

/** mulberry32: a small seeded 32-bit generator (common practice for reproducible tests). */
export function rng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Removes the source columns so trees from different texts can be compared. */
export function strip(a: Ast): Ast {
  switch (a.kind) {
    case 'var': return { kind: 'var', name: a.name };
    case 'neg': return { kind: 'neg', arg: strip(a.arg) };
    case 'bin': return { kind: 'bin', op: a.op, left: strip(a.left), right: strip(a.right) };
    case 'call': return { kind: 'call', name: a.name, args: a.args.map(strip) };
    default: return a;
  }
}

/** Reference evaluator, written independently of compile.ts: a plain recursive interpreter. */
export function evaluate(a: Ast, env: Record<string, number>): number {
  switch (a.kind) {
    case 'num': return a.value;
    case 'const': return Math.PI;
    case 'var': return env[a.name];
    case 'neg': return -evaluate(a.arg, env);
    case 'bin': {
      const l = evaluate(a.left, env), r = evaluate(a.right, env);
      return a.op === '+' ? l + r : a.op === '-' ? l - r : a.op === '*' ? l * r : a.op === '/' ? l / r : l ** r;
    }
    case 'call': {
      const xs = a.args.map((x) => evaluate(x, env));
      return (Math[a.name] as (...v: number[]) => number)(...xs);
    }
  }
}

const SMOOTH: FunctionName[] = ['sin', 'cos', 'tan', 'exp', 'log', 'sqrt', 'tanh'];
const ALL: FunctionName[] = [...SMOOTH, 'abs', 'sign', 'min', 'max'];

/**
 * A random tree over the given variables. smooth: only differentiable functions and integer
 * exponents (so finite differences are meaningful); otherwise any function and exponent.
 */
export function randomAst(r: () => number, vars: string[], depth: number, smooth: boolean): Ast {
  const leaf = (): Ast => {
    const p = r();
    if (p < 0.45) return { kind: 'var', name: vars[Math.floor(r() * vars.length)] };
    if (p < 0.5) return { kind: 'const', name: 'pi' };
    const choices = [0, 1, 2, 0.5, 3, 1e-3, 2.5e-7, 1.5e21, 0.1, 7];
    return { kind: 'num', value: choices[Math.floor(r() * choices.length)] };
  };
  if (depth <= 0 || r() < 0.2) return leaf();
  const p = r();
  const sub = (): Ast => randomAst(r, vars, depth - 1, smooth);
  if (p < 0.15) return { kind: 'neg', arg: sub() };
  if (p < 0.7) {
    const op = (['+', '-', '*', '/', '^'] as const)[Math.floor(r() * 5)];
    if (op === '^' && smooth) return { kind: 'bin', op, left: sub(), right: { kind: 'num', value: 1 + Math.floor(r() * 3) } };
    return { kind: 'bin', op, left: sub(), right: sub() };
  }
  const fns = smooth ? SMOOTH : ALL;
  const name = fns[Math.floor(r() * fns.length)];
  const n = name === 'min' || name === 'max' ? 2 + Math.floor(r() * 3) : 1;
  // Keep log and sqrt on positive arguments in smooth trees: log(1 + x^2), sqrt(1 + x^2).
  if (smooth && (name === 'log' || name === 'sqrt')) {
    const x = sub();
    return { kind: 'call', name, args: [{ kind: 'bin', op: '+', left: { kind: 'num', value: 1 }, right: { kind: 'bin', op: '^', left: x, right: { kind: 'num', value: 2 } } }] };
  }
  return { kind: 'call', name, args: Array.from({ length: n }, sub) };
}
