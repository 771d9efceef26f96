import { describe, expect, it } from 'vitest';
import { compileFormula, differentiate, formatFormula, FormulaError, MAX_FORMULA_LENGTH, MAX_NESTING, MAX_TREE_DEPTH, parseFormula } from '../../../src-main/engine/formula/index.ts';
import { strip } from './helpers.ts';

const value = (src: string, env: Record<string, number> = {}): number =>
  compileFormula(src, Object.keys(env)).eval(Float64Array.from(Object.values(env)));

function errorOf(fn: () => unknown): FormulaError {
  try {
    fn();
  } catch (e) {
    if (e instanceof FormulaError) return e;
    throw e;
  }
  throw new Error('expected a FormulaError, none was thrown');
}

describe('parseFormula: precedence and associativity', () => {
  // Each expected value is worked by hand from the precedence table in docs/formula-language.md.
  it.each([
    ['2 + 3 * 4', 14],
    ['(2 + 3) * 4', 20],
    ['2 - 3 - 4', -5], // left-associative: (2 - 3) - 4
    ['64 / 4 / 2', 8], // left-associative: (64 / 4) / 2
    ['8 / 2 * 4', 16], // (8 / 2) * 4
    ['2 ^ 3 ^ 2', 512], // right-associative: 2^(3^2) = 2^9
    ['(2 ^ 3) ^ 2', 64],
    ['-2 ^ 2', -4], // ^ binds tighter than unary minus
    ['(-2) ^ 2', 4],
    ['2 ^ -1', 0.5], // the exponent may carry a unary minus
    ['2 ^ -1 ^ 2', 0.5], // 2^(-(1^2))
    ['2 * 3 ^ 2', 18],
    ['-2 * 3', -6],
    ['1 - -1', 2],
    ['--3', 3],
    ['2 * -3 ^ 2', -18], // 2 * (-(3^2))
    ['1e-3 * 1000', 1],
    ['.5 + 1.', 1.5],
    ['2E+2 + 1.5e2', 350],
    ['10 - 2 * 3 ^ 2 / 6 + 1', 8], // 10 - 18/6 + 1
  ])('%s = %d', (src, expected) => {
    expect(value(src)).toBe(expected);
  });

  it('parses -q^2 as -(q^2) and evaluates it as such at q = 3', () => {
    expect(strip(parseFormula('-q^2'))).toEqual({ kind: 'neg', arg: { kind: 'bin', op: '^', left: { kind: 'var', name: 'q' }, right: { kind: 'num', value: 2 } } });
    expect(value('-q^2', { q: 3 })).toBe(-9);
  });

  it('returns plain data that survives a JSON round trip', () => {
    const ast = parseFormula('m*l^2*v^2/2 - m*g*l*cos(q) + max(q, v, pi)');
    expect(JSON.parse(JSON.stringify(ast))).toEqual(ast);
  });

  it('records the column of each name', () => {
    const ast = parseFormula('  q + vv');
    expect(ast).toMatchObject({ left: { name: 'q', column: 3 }, right: { name: 'vv', column: 7 } });
  });
});

describe('parseFormula: errors carry the column and what was expected', () => {
  // Columns are 1-based and point at the character or token found (counted by hand).
  it.each([
    // missing operand
    ['q *', 4, 'a number, a name or "(" after "*"', 'end of formula'],
    ['* q', 1, 'a number, a name or "("', '"*"'],
    ['q + * v', 5, 'a number, a name or "(" after "+"', '"*"'],
    ['q ^', 4, 'a number, a name or "(" after "^"', 'end of formula'],
    ['-', 2, 'a number, a name or "(" after "-"', 'end of formula'],
    // unbalanced parentheses
    ['(q + v', 7, '")" to close "(" at column 1', 'end of formula'],
    ['((q)', 5, '")" to close "(" at column 1', 'end of formula'],
    ['q + v)', 6, 'an operator (+ - * / ^) or end of formula', '")"'],
    ['()', 2, 'a number, a name or "("', '")"'],
    // unknown function
    ['foo(q)', 1, 'a function name (sin, cos, tan, exp, log, sqrt, abs, tanh, sign, min, max)', 'unknown function "foo"'],
    ['2 * sinh(q)', 5, 'a function name (sin, cos, tan, exp, log, sqrt, abs, tanh, sign, min, max)', 'unknown function "sinh"'],
    ['q(1)', 1, 'a function name (sin, cos, tan, exp, log, sqrt, abs, tanh, sign, min, max)', 'unknown function "q"'],
    // wrong arity
    ['sin(q, v)', 6, '")" after the argument of sin (sin takes 1 argument)', '","'],
    ['sin()', 5, 'an argument of sin (sin takes 1 argument)', '")"'],
    ['min(q)', 6, '"," and another argument (min takes 2 or more arguments)', '")"'],
    ['max(q, v', 9, '"," or ")" after arguments of max', 'end of formula'],
    ['exp(q', 6, '")" after the argument of exp', 'end of formula'],
    ['min(q,)', 7, 'a number, a name or "("', '")"'],
    // bad numbers
    ['1e', 3, 'digits in the exponent of number "1e"', 'end of formula'],
    ['2.5e+ 1', 6, 'digits in the exponent of number "2.5e+"', 'character " "'],
    ['3ex', 3, 'digits in the exponent of number "3e"', 'character "x"'],
    ['1e999', 1, 'a number of magnitude below 1.8e308', 'number "1e999"'],
    // trailing garbage
    ['q v', 3, 'an operator (+ - * / ^) or end of formula', 'name "v"'],
    ['2q', 2, 'an operator (+ - * / ^) or end of formula', 'name "q"'],
    ['1.2.3', 4, 'an operator (+ - * / ^) or end of formula', 'number ".3"'],
    // empty formula
    ['', 1, 'a number, a name or "("', 'end of formula'],
    ['   ', 4, 'a number, a name or "("', 'end of formula'],
  ])('%j: column %i', (src, column, expected, found) => {
    const e = errorOf(() => parseFormula(src));
    expect(e.column).toBe(column);
    expect(e.expected).toBe(expected);
    expect(e.found).toBe(found);
    expect(e.message).toBe(`column ${column}: expected ${expected}, found ${found}`);
  });

  it('gives the message shape promised in the docs', () => {
    expect(() => parseFormula('max(q, v')).toThrow('column 9: expected "," or ")" after arguments of max, found end of formula');
  });

  it('limits nesting depth and length instead of overflowing the stack', () => {
    const deep = '('.repeat(MAX_NESTING + 5) + 'q' + ')'.repeat(MAX_NESTING + 5);
    expect(errorOf(() => parseFormula(deep)).expected).toBe(`at most ${MAX_NESTING} levels of nesting`);
    expect(errorOf(() => parseFormula('-'.repeat(100_00))).column).toBeGreaterThan(0);
    expect(errorOf(() => parseFormula('q+'.repeat(MAX_FORMULA_LENGTH))).column).toBe(MAX_FORMULA_LENGTH + 1);
    const ok = '('.repeat(MAX_NESTING - 2) + 'q' + ')'.repeat(MAX_NESTING - 2);
    expect(value(ok, { q: 5 })).toBe(5);
  });

  it('limits the tree depth (terms in a row), and handles the longest chains it accepts', () => {
    const tooLong = 'q*'.repeat(MAX_TREE_DEPTH) + 'q';
    const e = errorOf(() => parseFormula(tooLong));
    expect(e.column).toBe(2 * MAX_TREE_DEPTH); // the operator that would make it too deep
    expect(e.found).toBe('a deeper formula');
    // The longest accepted product: compile, differentiate, print, without exhausting the stack.
    // Independent value: d/dq q^n = n q^(n - 1) (elementary calculus).
    const n = MAX_TREE_DEPTH;
    const ast = parseFormula('q*'.repeat(n - 1) + 'q');
    const d1 = differentiate(ast, 'q');
    const q = 1.001;
    const want = n * q ** (n - 1);
    expect(Math.abs(compileFormula(d1, ['q']).eval(Float64Array.of(q)) - want)).toBeLessThan(1e-10 * want);
    expect(formatFormula(ast)).toBe(tooLong.slice(2));
  });

  it('rejects a source that is not a string, naming the argument', () => {
    expect(() => parseFormula(42 as unknown as string)).toThrow(/source must be a string, got number/);
  });
});

describe('parseFormula: hostile inputs are plain syntax errors or unknown names', () => {
  it.each([
    ['process.exit()', 8, 'character "."'],
    ['a[0]', 2, 'character "["'],
    ['x; y', 2, 'character ";"'],
    ["'a'", 1, `character "'"`],
    ['"a"', 1, 'character "\\""'],
    ['`a`', 1, 'character "`"'],
    ['q = 1', 3, 'character "="'],
    ['x => 1', 3, 'character "="'],
    ['q.constructor', 2, 'character "."'],
    ['{}', 1, 'character "{"'],
    ['new Function', 5, 'name "Function"'],
    ['constructor(1)', 1, 'unknown function "constructor"'],
    ['__proto__(1)', 1, 'unknown function "__proto__"'],
    ['toString()', 1, 'unknown function "toString"'],
  ])('%j is rejected at column %i', (src, column, found) => {
    const e = errorOf(() => compileFormula(src, ['q', 'x', 'y', 'a']));
    expect(e.column).toBe(column);
    expect(e.found).toBe(found);
  });

  it.each(['constructor', '__proto__', 'process', 'this', 'toString', 'valueOf', 'hasOwnProperty', 'globalThis', 'Math', 'eval'])(
    'the bare name %s is an unknown name at compile time, listing the allowed names',
    (name) => {
      const e = errorOf(() => compileFormula(`q + ${name}`, ['q', 'v']));
      expect(e.column).toBe(5);
      expect(e.found).toBe(`unknown name "${name}"`);
      expect(e.expected).toBe('a known name (q, v, pi)');
    },
  );

  it('treats such names as ordinary names when they are declared', () => {
    // Names are looked up in Maps only: a variable or constant called __proto__ is just a name.
    expect(compileFormula('2*constructor', ['constructor']).eval(Float64Array.of(4))).toBe(8);
    const constants = JSON.parse('{"__proto__": 3}') as Record<string, number>;
    expect(compileFormula('__proto__ + q', ['q'], { constants }).eval(Float64Array.of(1))).toBe(4);
  });
});
