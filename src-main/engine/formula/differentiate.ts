// Symbolic differentiation of a formula tree by the usual rules of calculus (sum, product,
// quotient, power and chain rules, and the table of derivatives of the elementary functions
// found in any calculus text, e.g. Abramowitz & Stegun ch. 4, from memory), simplified as it is
// built (build.ts). min and max are rewritten
// through min(a, b) = (a + b - |a - b|)/2, max(a, b) = (a + b + |a - b|)/2, whose derivative is
// (a' + b' -+ sign(a - b) (a' - b'))/2: exact wherever a != b, the mean of the two at a tie.
import type { Ast, CallNode } from './ast.ts';
import { add, call, div, mul, neg, num, numValue, pow, sub } from './build.ts';
import { checkAst } from './check-ast.ts';
import { NAME_PATTERN, isReservedName } from './functions.ts';

/** True when the tree mentions the variable `name`. */
export function dependsOn(ast: Ast, name: string): boolean {
  switch (ast.kind) {
    case 'num': case 'const': return false;
    case 'var': return ast.name === name;
    case 'neg': return dependsOn(ast.arg, name);
    case 'bin': return dependsOn(ast.left, name) || dependsOn(ast.right, name);
    case 'call': return ast.args.some((a) => dependsOn(a, name));
  }
}

/** d(ast)/d(name) as a new tree; the input tree is not modified. */
export function differentiate(ast: Ast, name: string): Ast {
  checkAst(ast, 'differentiate: ast');
  if (typeof name !== 'string' || !NAME_PATTERN.test(name) || isReservedName(name)) {
    throw new TypeError(`differentiate: name must be a variable name, got ${JSON.stringify(name)}`);
  }
  const memo = new Map<Ast, boolean>();
  const depends = (a: Ast): boolean => {
    let r = memo.get(a);
    if (r === undefined) { r = dependsOn(a, name); memo.set(a, r); }
    return r;
  };

  function d(a: Ast): Ast {
    if (!depends(a)) return num(0);
    switch (a.kind) {
      case 'num': case 'const': return num(0);
      case 'var': return num(1);
      case 'neg': return neg(d(a.arg));
      case 'bin': {
        const { left: f, right: g } = a;
        switch (a.op) {
          case '+': return add(d(f), d(g));
          case '-': return sub(d(f), d(g));
          case '*': return add(mul(d(f), g), mul(f, d(g)));
          case '/':
            if (!depends(g)) return div(d(f), g);
            return sub(div(d(f), g), div(mul(f, d(g)), pow(g, num(2))));
          case '^': {
            if (!depends(g)) {
              const n = numValue(g);
              const lowered = n !== undefined ? num(n - 1) : sub(g, num(1));
              return mul(mul(g, pow(f, lowered)), d(f));
            }
            if (!depends(f)) return mul(mul(a, call('log', f)), d(g));
            // d(f^g) = f^g (g' log f + g f'/f)
            return mul(a, add(mul(d(g), call('log', f)), div(mul(g, d(f)), f)));
          }
        }
        break;
      }
      case 'call': return dCall(a);
    }
    throw new TypeError('differentiate: malformed tree'); // unreachable after checkAst
  }

  function dCall(c: CallNode): Ast {
    if (c.name === 'min' || c.name === 'max') return dMinMax(c);
    const x = c.args[0];
    const dx = d(x);
    switch (c.name) {
      case 'sin': return mul(call('cos', x), dx);
      case 'cos': return neg(mul(call('sin', x), dx));
      case 'tan': return mul(add(num(1), pow(call('tan', x), num(2))), dx);
      case 'exp': return mul(c, dx);
      case 'log': return div(dx, x);
      case 'sqrt': return div(dx, mul(num(2), c));
      case 'abs': return mul(call('sign', x), dx);
      case 'tanh': return mul(sub(num(1), pow(call('tanh', x), num(2))), dx);
      case 'sign': return num(0);
    }
  }

  function dMinMax(c: CallNode): Ast {
    // min(a1, ..., an) = min(min(a1, ..., a(n-1)), an)
    const a = c.args.length > 2 ? call(c.name, ...c.args.slice(0, -1)) : c.args[0];
    const b = c.args[c.args.length - 1];
    const da = d(a), db = d(b);
    const s = mul(call('sign', sub(a, b)), sub(da, db));
    return div(c.name === 'min' ? sub(add(da, db), s) : add(add(da, db), s), num(2));
  }

  return d(ast);
}
