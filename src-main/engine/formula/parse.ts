// Recursive-descent parser of the formula language (grammar in docs/formula-language.md).
// Precedence, loosest first: + -  then  * /  then unary -  then ^ (right-associative, and its
// exponent may carry a unary minus). So -q^2 = -(q^2), q^2^3 = q^(2^3), a/b*c = (a/b)*c.
import type { Ast, BinaryOp, FunctionName } from './ast.ts';
import { FormulaError } from './error.ts';
import { CONSTANTS, FUNCTIONS, FUNCTION_NAMES } from './functions.ts';
import { describeToken, tokenize, type Token } from './tokenize.ts';

/** Deepest nesting of parentheses, calls, unary minus and exponents accepted. */
export const MAX_NESTING = 200;

/**
 * Deepest tree accepted (a chain of n terms a + b + ... is n levels deep). Keeps every
 * recursive walk of the tree (compiling, evaluating, differentiating) far from the call-stack
 * limit; a formula of more than 500 terms in a row is not one a person writes or learns.
 */
export const MAX_TREE_DEPTH = 500;

/**
 * Parses formula source into a plain-data syntax tree. Throws FormulaError (with the 1-based
 * column, what was expected and what was found) on any syntax error, unknown function or wrong
 * number of arguments. Names of variables are not checked here (compileFormula does that).
 */
export function parseFormula(source: string): Ast {
  if (typeof source !== 'string') throw new TypeError(`parseFormula: source must be a string, got ${source === null ? 'null' : typeof source}`);
  const tokens = tokenize(source);
  let pos = 0;
  let depth = 0;
  const peek = (): Token => tokens[pos];
  // Depth of each tree built so far (leaves: 1), to bound MAX_TREE_DEPTH.
  const depthOf = new Map<Ast, number>();
  const d = (a: Ast): number => depthOf.get(a) ?? 1;
  const node = <T extends Ast>(a: T, children: Ast[], at: Token): T => {
    const depth = 1 + Math.max(...children.map(d));
    if (depth > MAX_TREE_DEPTH) throw new FormulaError(at.column, `a formula at most ${MAX_TREE_DEPTH} levels deep (at most ${MAX_TREE_DEPTH} terms in a row)`, 'a deeper formula');
    depthOf.set(a, depth);
    return a;
  };
  const isOp = (t: Token, text: string): boolean => t.type === 'op' && t.text === text;

  function sum(): Ast {
    let left = product();
    for (let t = peek(); isOp(t, '+') || isOp(t, '-'); t = peek()) {
      pos++;
      const right = product(` after "${t.text}"`);
      left = node({ kind: 'bin', op: t.text as BinaryOp, left, right }, [left, right], t);
    }
    return left;
  }

  function product(after = ''): Ast {
    let left = unary(after);
    for (let t = peek(); isOp(t, '*') || isOp(t, '/'); t = peek()) {
      pos++;
      const right = unary(` after "${t.text}"`);
      left = node({ kind: 'bin', op: t.text as BinaryOp, left, right }, [left, right], t);
    }
    return left;
  }

  function unary(after: string): Ast {
    if (++depth > MAX_NESTING) throw new FormulaError(peek().column, `at most ${MAX_NESTING} levels of nesting`, 'deeper nesting');
    let result: Ast;
    const t = peek();
    if (isOp(t, '-')) {
      pos++;
      const arg = unary(' after "-"');
      result = node({ kind: 'neg', arg }, [arg], t);
    } else {
      result = power(after);
    }
    depth--;
    return result;
  }

  function power(after: string): Ast {
    const base = primary(after);
    const t = peek();
    if (!isOp(t, '^')) return base;
    pos++;
    const right = unary(' after "^"');
    return node({ kind: 'bin', op: '^', left: base, right }, [base, right], t);
  }

  function primary(after: string): Ast {
    const t = peek();
    if (t.type === 'num') {
      pos++;
      return { kind: 'num', value: t.value };
    }
    if (t.type === 'name') {
      pos++;
      if (isOp(peek(), '(')) return call(t);
      if (CONSTANTS.has(t.text)) return { kind: 'const', name: 'pi' };
      return { kind: 'var', name: t.text, column: t.column };
    }
    if (isOp(t, '(')) {
      pos++;
      const inner = sum();
      const close = peek();
      if (!isOp(close, ')')) throw new FormulaError(close.column, `")" to close "(" at column ${t.column}`, describeToken(close));
      pos++;
      return inner;
    }
    throw new FormulaError(t.column, `a number, a name or "("${after}`, describeToken(t));
  }

  function call(nameToken: Token): Ast {
    const info = FUNCTIONS.get(nameToken.text);
    if (!info) {
      throw new FormulaError(nameToken.column, `a function name (${FUNCTION_NAMES.join(', ')})`, `unknown function ${JSON.stringify(nameToken.text)}`);
    }
    const name: FunctionName = info.name;
    const takes = info.maxArgs === 1 ? `${name} takes 1 argument` : `${name} takes ${info.minArgs} or more arguments`;
    pos++; // "("
    if (isOp(peek(), ')')) throw new FormulaError(peek().column, `an argument of ${name} (${takes})`, describeToken(peek()));
    const args: Ast[] = [];
    for (;;) {
      args.push(sum());
      const t = peek();
      if (isOp(t, ',')) {
        if (args.length >= info.maxArgs) throw new FormulaError(t.column, `")" after the argument of ${name} (${takes})`, describeToken(t));
        pos++;
        continue;
      }
      if (isOp(t, ')')) {
        if (args.length < info.minArgs) throw new FormulaError(t.column, `"," and another argument (${takes})`, describeToken(t));
        pos++;
        return node({ kind: 'call', name, args }, args, nameToken);
      }
      const wanted = args.length < info.maxArgs ? '"," or ")"' : '")"';
      const of = info.maxArgs === 1 ? 'the argument' : 'arguments';
      throw new FormulaError(t.column, `${wanted} after ${of} of ${name}`, describeToken(t));
    }
  }

  const ast = sum();
  const last = peek();
  if (last.type !== 'end') throw new FormulaError(last.column, 'an operator (+ - * / ^) or end of formula', describeToken(last));
  return ast;
}
