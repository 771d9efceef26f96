// Formula trees (engine/formula) to straight-line C99: one `const double tN = ...;` per distinct
// node, in post-order, so subtrees shared by a function and its symbolic derivatives are computed
// once and no expression nests deeper than one operator. The mapping mirrors compileFormula
// (engine/formula/compile.ts) operation for operation, so the C code performs the same IEEE 754
// operations as the engine: subtrees free of variables are folded here, by the same JavaScript
// arithmetic, into 17-digit literals; x^2, x^3, x^-1 are written as y*y, y*y*y, 1/y; other
// powers call pow(); the whitelisted functions map to their C99 <math.h> namesakes (abs -> fabs);
// sign, min and max become small static inline helpers with JavaScript's Math semantics
// (NaN propagates, sign keeps -0, min prefers -0 over +0). No text of the formula reaches the C
// source: only numbers, the variable names q and v and our own identifiers.
import type { Ast } from '../../engine/formula/index.ts';
import { cDouble, cOperand } from './literal.ts';

type Value = number | string; // folded number, or the C name holding the value

const C_UNARY: Record<string, string> = { sin: 'sin', cos: 'cos', tan: 'tan', exp: 'exp', log: 'log', sqrt: 'sqrt', abs: 'fabs', tanh: 'tanh' };
const JS_UNARY: Record<string, (x: number) => number> = {
  sin: Math.sin, cos: Math.cos, tan: Math.tan, exp: Math.exp, log: Math.log, sqrt: Math.sqrt, abs: Math.abs, tanh: Math.tanh, sign: Math.sign,
};

export interface CFormulaCode {
  /** Statements, each `const double tN = ...;`. */
  lines: string[];
  /** C expression (a temp, q, v or a literal) of each root, in order. */
  results: string[];
  /** Helpers used: 'sign', 'min', 'max'. */
  helpers: Set<'sign' | 'min' | 'max'>;
  /** Whether q / v appear. */
  usesQ: boolean;
  usesV: boolean;
}

/**
 * Straight-line C for the given roots over the variables q and v. `prefix` names the helpers
 * (PREFIX_sign, PREFIX_min2, PREFIX_max2). Throws RangeError for names other than q and v and
 * for constant subtrees that fold to NaN or an infinity (they cannot be written as C constants).
 */
export function formulaToC(roots: Ast[], prefix: string, tempPrefix = 't'): CFormulaCode {
  const lines: string[] = [];
  const helpers = new Set<'sign' | 'min' | 'max'>();
  const memo = new Map<Ast, Value>();
  let usesQ = false, usesV = false;
  let next = 0;
  const emit = (expr: string): string => {
    const name = `${tempPrefix}${next++}`;
    lines.push(`const double ${name} = ${expr};`);
    return name;
  };
  const op = (x: Value): string => (typeof x === 'number' ? cOperand(x, 'a constant of the energy formula') : x);

  function value(node: Ast): Value {
    const known = memo.get(node);
    if (known !== undefined) return known;
    const r = build(node);
    memo.set(node, r);
    return r;
  }

  function build(node: Ast): Value {
    switch (node.kind) {
      case 'num': return node.value;
      case 'const': return Math.PI;
      case 'var':
        if (node.name === 'q') { usesQ = true; return 'q'; }
        if (node.name === 'v') { usesV = true; return 'v'; }
        throw new RangeError(`energy formula: unknown name ${JSON.stringify(node.name)} (only q and v may appear)`);
      case 'neg': {
        const a = value(node.arg);
        return typeof a === 'number' ? -a : emit(`-${a}`);
      }
      case 'bin': return binary(node.op, value(node.left), value(node.right));
      case 'call': {
        const args = node.args.map(value);
        if (node.name === 'min' || node.name === 'max') {
          if (args.every((a) => typeof a === 'number')) return (node.name === 'min' ? Math.min : Math.max)(...(args as number[]));
          helpers.add(node.name);
          let r = op(args[0]);
          for (let i = 1; i < args.length; i++) r = emit(`${prefix}_${node.name}2(${r}, ${op(args[i])})`);
          return r;
        }
        const a = args[0];
        if (typeof a === 'number') return JS_UNARY[node.name](a);
        if (node.name === 'sign') { helpers.add('sign'); return emit(`${prefix}_sign(${a})`); }
        return emit(`${C_UNARY[node.name]}(${a})`);
      }
    }
  }

  function binary(o: string, a: Value, b: Value): Value {
    if (typeof a === 'number' && typeof b === 'number') {
      switch (o) {
        case '+': return a + b;
        case '-': return a - b;
        case '*': return a * b;
        case '/': return a / b;
        default: return Math.pow(a, b);
      }
    }
    if (o === '^') {
      if (typeof b === 'number') {
        if (b === 1) return a;
        if (b === 2) return emit(`${a} * ${a}`);
        if (b === 3) return emit(`${a} * ${a} * ${a}`);
        if (b === -1) return emit(`1.0 / ${a}`);
      }
      return emit(`pow(${op(a)}, ${op(b)})`);
    }
    return emit(`${op(a)} ${o} ${op(b)}`);
  }

  const results = roots.map((r) => op(value(r)));
  // Literal results still pass through cDouble (refusing NaN and infinities).
  for (const r of roots) { const v = memo.get(r); if (typeof v === 'number') cDouble(v, 'the energy formula'); }
  return { lines, results, helpers, usesQ, usesV };
}

/** C99 definitions of the helpers, with JavaScript Math semantics. */
export function helperSource(prefix: string, helpers: Set<'sign' | 'min' | 'max'>): string[] {
  const out: string[] = [];
  if (helpers.has('sign')) {
    out.push('/* Math.sign: -1, +1, or x itself for +0, -0 and NaN. */');
    out.push(`static inline double ${prefix}_sign(double x) { return x > 0.0 ? 1.0 : x < 0.0 ? -1.0 : x; }`);
  }
  if (helpers.has('min')) {
    out.push('/* Math.min of two: NaN if either is NaN; -0 before +0. */');
    out.push(`static inline double ${prefix}_min2(double a, double b) {`);
    out.push('  if (a != a || b != b) return a + b;');
    out.push('  if (a < b) return a;');
    out.push('  if (b < a) return b;');
    out.push('  return signbit(a) ? a : b;');
    out.push('}');
  }
  if (helpers.has('max')) {
    out.push('/* Math.max of two: NaN if either is NaN; +0 before -0. */');
    out.push(`static inline double ${prefix}_max2(double a, double b) {`);
    out.push('  if (a != a || b != b) return a + b;');
    out.push('  if (a > b) return a;');
    out.push('  if (b > a) return b;');
    out.push('  return signbit(a) ? b : a;');
    out.push('}');
  }
  return out;
}
