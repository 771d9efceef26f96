// Prints a formula tree as source text with the fewest parentheses that keep its structure, so
// that parseFormula(formatFormula(t)) gives back t (for trees in the parser's own form, where
// negative numbers are a unary minus over a literal). Numbers print in JavaScript's shortest
// round-trip form (ECMA-262 Number::toString), which our lexer reads back exactly.
import type { Ast } from './ast.ts';
import { checkAst } from './check-ast.ts';

// Binding levels, loosest first: sum, product, unary minus, power, atom.
const SUM = 1, PRODUCT = 2, UNARY = 3, POWER = 4, ATOM = 5;

function level(a: Ast): number {
  switch (a.kind) {
    case 'num': return a.value < 0 ? UNARY : ATOM;
    case 'neg': return UNARY;
    case 'bin': return a.op === '+' || a.op === '-' ? SUM : a.op === '^' ? POWER : PRODUCT;
    default: return ATOM;
  }
}

export function formatFormula(ast: Ast): string {
  checkAst(ast, 'formatFormula: ast');
  const at = (a: Ast, min: number): string => (level(a) < min ? `(${raw(a)})` : raw(a));
  function raw(a: Ast): string {
    switch (a.kind) {
      case 'num':
        if (!Number.isFinite(a.value)) throw new RangeError(`formatFormula: cannot print the non-finite number ${a.value}`);
        return a.value < 0 ? `-${String(-a.value)}` : String(a.value);
      case 'const': case 'var': return a.name;
      case 'neg': {
        const inner = a.arg.kind === 'neg' || (a.arg.kind === 'num' && a.arg.value < 0) ? `(${raw(a.arg)})` : at(a.arg, UNARY);
        return `-${inner}`;
      }
      case 'bin': {
        if (a.op === '^') return `${at(a.left, ATOM)}^${at(a.right, UNARY)}`;
        // A left-leaning chain a + b - c ... (or a*b/c ...) is walked in a loop, not recursively,
        // so long sums and products cannot exhaust the call stack.
        const additive = a.op === '+' || a.op === '-';
        const tail: string[] = [];
        let cur: Ast = a;
        while (cur.kind === 'bin' && (additive ? cur.op === '+' || cur.op === '-' : cur.op === '*' || cur.op === '/')) {
          tail.push(additive ? ` ${cur.op} ${at(cur.right, PRODUCT)}` : `${cur.op}${at(cur.right, UNARY)}`);
          cur = cur.left;
        }
        tail.push(at(cur, additive ? SUM : PRODUCT));
        return tail.reverse().join('');
      }
      case 'call': return `${a.name}(${a.args.map((x) => at(x, SUM)).join(', ')})`;
    }
    throw new TypeError('formatFormula: malformed tree'); // unreachable after checkAst
  }
  return raw(ast);
}
