// Compiles a formula to a tree of closures over a Float64Array of variable values, folding
// every subtree that depends on no variable into a number first. No source text is ever
// generated or evaluated: each node becomes a small arrow function chosen by a switch, with
// the common shapes (constant operand, power 2 and 3) written out on their own so that the
// hot path makes as few calls as possible.
import type { Ast } from './ast.ts';
import { checkAst } from './check-ast.ts';
import { FormulaError } from './error.ts';
import { CONSTANTS, FUNCTIONS, NAME_PATTERN, isReservedName } from './functions.ts';
import { parseFormula } from './parse.ts';

type Fn = (x: Float64Array) => number;
/** A compiled node: either a folded constant (number) or a closure. */
type Node = number | Fn;

export interface CompileOptions {
  /** Names bound to fixed values (plant parameters); folded into the closures at compile time. */
  constants?: Readonly<Record<string, number>>;
}

export interface CompiledFormula {
  /** The variable names, in the order eval reads them from its array. */
  readonly variables: readonly string[];
  /** The syntax tree that was compiled. */
  readonly ast: Ast;
  /** True when the formula depends on no variable (it was folded to one number). */
  readonly isConstant: boolean;
  /** Value for values[i] = variables[i]; values must have at least variables.length entries. */
  eval(values: Float64Array): number;
}

/**
 * Compiles formula source (or a tree from parseFormula/differentiate) over the given variables.
 * Throws FormulaError for syntax errors and for names that are neither variables, constants
 * nor pi (column of the name, the allowed names listed); TypeError for malformed arguments.
 */
export function compileFormula(formula: string | Ast, variables: readonly string[], options: CompileOptions = {}): CompiledFormula {
  const ast: Ast = typeof formula === 'string' ? parseFormula(formula) : formula;
  if (typeof formula !== 'string') checkAst(formula, 'compileFormula: formula');
  const index = new Map<string, number>();
  if (!Array.isArray(variables)) throw new TypeError('compileFormula: variables must be an array of names');
  variables.forEach((v, i) => {
    checkName(v, `compileFormula: variables[${i}]`);
    if (index.has(v)) throw new TypeError(`compileFormula: variables[${i}]: name ${JSON.stringify(v)} is listed twice`);
    index.set(v, i);
  });
  const fixed = new Map<string, number>();
  const constants = options.constants ?? {};
  if (typeof constants !== 'object' || constants === null) throw new TypeError('compileFormula: options.constants must be an object of name: number');
  for (const name of Object.keys(constants)) {
    const where = `compileFormula: options.constants.${name}`;
    checkName(name, where);
    if (index.has(name)) throw new TypeError(`${where}: name is also a variable`);
    const value = constants[name];
    if (typeof value !== 'number' || !Number.isFinite(value)) throw new TypeError(`${where}: expected a finite number, got ${String(value)}`);
    fixed.set(name, value);
  }
  const allowed = [...index.keys(), ...fixed.keys(), ...CONSTANTS.keys()];

  // Trees from differentiate share subtrees: compile each distinct node once.
  const memo = new Map<Ast, Node>();
  function build(node: Ast): Node {
    const known = memo.get(node);
    if (known !== undefined) return known;
    const r = buildNode(node);
    memo.set(node, r);
    return r;
  }

  function buildNode(node: Ast): Node {
    switch (node.kind) {
      case 'num': return node.value;
      case 'const': return CONSTANTS.get(node.name) as number;
      case 'var': {
        const i = index.get(node.name);
        if (i !== undefined) return (x) => x[i];
        const k = fixed.get(node.name);
        if (k !== undefined) return k;
        throw new FormulaError(node.column ?? 0, `a known name (${allowed.join(', ')})`, `unknown name ${JSON.stringify(node.name)}`);
      }
      case 'neg': {
        const a = build(node.arg);
        return typeof a === 'number' ? -a : (x) => -a(x);
      }
      case 'bin': return binary(node.op, build(node.left), build(node.right));
      case 'call': return callOf(node.name, node.args.map(build));
    }
  }

  const root = build(ast);
  const k = typeof root === 'number' ? root : NaN;
  const evalFn: Fn = typeof root === 'number' ? () => k : root;
  return Object.freeze({ variables: Object.freeze([...variables]), ast, isConstant: typeof root === 'number', eval: evalFn });
}

function checkName(name: unknown, where: string): void {
  if (typeof name !== 'string' || !NAME_PATTERN.test(name)) {
    throw new TypeError(`${where}: expected a name (a letter or _, then letters, digits or _), got ${JSON.stringify(name)}`);
  }
  if (isReservedName(name)) throw new TypeError(`${where}: ${JSON.stringify(name)} is reserved (a function or constant of the formula language)`);
}

function binary(op: string, a: Node, b: Node): Node {
  if (typeof a === 'number' && typeof b === 'number') {
    switch (op) {
      case '+': return a + b;
      case '-': return a - b;
      case '*': return a * b;
      case '/': return a / b;
      default: return Math.pow(a, b);
    }
  }
  if (typeof a === 'number') {
    const g = b as Fn;
    switch (op) {
      case '+': return (x) => a + g(x);
      case '-': return (x) => a - g(x);
      case '*': return (x) => a * g(x);
      case '/': return (x) => a / g(x);
      default: return (x) => Math.pow(a, g(x));
    }
  }
  if (typeof b === 'number') {
    switch (op) {
      case '+': return (x) => a(x) + b;
      case '-': return (x) => a(x) - b;
      case '*': return (x) => a(x) * b;
      case '/': return (x) => a(x) / b;
      default:
        if (b === 1) return a;
        if (b === 2) return (x) => { const y = a(x); return y * y; };
        if (b === 3) return (x) => { const y = a(x); return y * y * y; };
        if (b === -1) return (x) => 1 / a(x);
        return (x) => Math.pow(a(x), b);
    }
  }
  const f = a, g = b as Fn;
  switch (op) {
    case '+': return (x) => f(x) + g(x);
    case '-': return (x) => f(x) - g(x);
    case '*': return (x) => f(x) * g(x);
    case '/': return (x) => f(x) / g(x);
    default: return (x) => Math.pow(f(x), g(x));
  }
}

function callOf(name: string, args: Node[]): Node {
  const info = FUNCTIONS.get(name);
  if (!info) throw new TypeError(`compileFormula: unknown function ${JSON.stringify(name)}`); // unreachable after checkAst/parse
  if (info.unary) {
    const a = args[0];
    const f = info.unary;
    if (typeof a === 'number') return f(a);
    // One arrow per function so that each call site stays monomorphic.
    switch (name) {
      case 'sin': return (x) => Math.sin(a(x));
      case 'cos': return (x) => Math.cos(a(x));
      case 'exp': return (x) => Math.exp(a(x));
      case 'sqrt': return (x) => Math.sqrt(a(x));
      case 'abs': return (x) => Math.abs(a(x));
      default: return (x) => f(a(x));
    }
  }
  const pick = name === 'min' ? Math.min : Math.max;
  if (args.every((a) => typeof a === 'number')) return pick(...(args as number[]));
  const fns: Fn[] = args.map((a) => (typeof a === 'number' ? () => a : a));
  if (fns.length === 2) {
    const [p, q] = fns;
    return name === 'min' ? (x) => Math.min(p(x), q(x)) : (x) => Math.max(p(x), q(x));
  }
  return (x) => {
    let r = fns[0](x);
    for (let i = 1; i < fns.length; i++) r = pick(r, fns[i](x));
    return r;
  };
}
