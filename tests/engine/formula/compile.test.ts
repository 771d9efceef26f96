import { describe, expect, it } from 'vitest';
import { compileFormula, FormulaError, parseFormula, type Ast } from '../../../src-main/engine/formula/index.ts';
import { evaluate, randomAst, rng } from './helpers.ts';

const POINTS = [-3.7, -1, -0.25, -0, 0, 1e-9, 0.5, 1, 2.2, 10, 1e3, -1e-300, Infinity, -Infinity, NaN];

describe('compileFormula: the whitelisted functions match Math.*', () => {
  // Independent computation: the same-named Math function (ECMA-262 §21.3.2).
  it.each(['sin', 'cos', 'tan', 'exp', 'log', 'sqrt', 'abs', 'tanh', 'sign'] as const)('%s(x)', (name) => {
    const f = compileFormula(`${name}(x)`, ['x']);
    for (const x of POINTS) expect(Object.is(f.eval(Float64Array.of(x)), Math[name](x))).toBe(true);
  });

  it.each(['min', 'max'] as const)('%s with 2, 3 and 5 arguments', (name) => {
    const r = rng(7);
    const f2 = compileFormula(`${name}(a, b)`, ['a', 'b']);
    const f3 = compileFormula(`${name}(a, b, c)`, ['a', 'b', 'c']);
    const f5 = compileFormula(`${name}(a, b, c, d, e)`, ['a', 'b', 'c', 'd', 'e']);
    for (let k = 0; k < 200; k++) {
      const x = Float64Array.from({ length: 5 }, () => (r() - 0.5) * 20);
      expect(f2.eval(x)).toBe(Math[name](x[0], x[1]));
      expect(f3.eval(x)).toBe(Math[name](x[0], x[1], x[2]));
      expect(f5.eval(x)).toBe(Math[name](...x));
    }
    expect(Number.isNaN(f3.eval(Float64Array.of(1, NaN, 2)))).toBe(true);
  });

  it('pi is Math.PI', () => {
    expect(compileFormula('pi', []).eval(new Float64Array(0))).toBe(Math.PI);
  });
});

describe('compileFormula: values, folding, arguments', () => {
  it('evaluates the pendulum acceleration like the hand-written expression', () => {
    // Hand-written TS of q'' = -(g/l) sin q - c v + u/(m l^2) (the brief's pendulum).
    const p = { g: 9.81, l: 0.42, c: 0.05, m: 1.3 };
    const f = compileFormula('-(g/l)*sin(q) - c*v + u/(m*l^2)', ['q', 'v', 'u', 't'], { constants: p });
    const r = rng(1);
    for (let k = 0; k < 100; k++) {
      const q = (r() - 0.5) * 8, v = (r() - 0.5) * 10, u = r() - 0.5;
      const hand = -(p.g / p.l) * Math.sin(q) - p.c * v + u / (p.m * p.l * p.l);
      expect(f.eval(Float64Array.of(q, v, u, 0))).toBeCloseTo(hand, 12);
    }
  });

  it('folds subtrees without variables into one number', () => {
    const f = compileFormula('2*pi*3 + sin(0) + max(1, 2, g)', [], { constants: { g: 5 } });
    expect(f.isConstant).toBe(true);
    expect(f.eval(new Float64Array(0))).toBe(2 * Math.PI * 3 + 0 + 5);
    // q*0 is not folded: it is NaN at q = Infinity (IEEE 754).
    const g = compileFormula('q*0 + 1', ['q']);
    expect(g.isConstant).toBe(false);
    expect(Number.isNaN(g.eval(Float64Array.of(Infinity)))).toBe(true);
  });

  it('compiles a tree from parseFormula to the same function as its source', () => {
    const src = 'a*q^2/2 - b*q^4/4 + exp(-q^2)*v';
    const vars = ['q', 'v', 'a', 'b'];
    const x = Float64Array.of(0.7, -1.1, 2, 0.5);
    expect(compileFormula(parseFormula(src), vars).eval(x)).toBe(compileFormula(src, vars).eval(x));
  });

  it('agrees with an independent interpreter on random trees', () => {
    // Independent computation: helpers.evaluate walks the tree with Math.* and the ** operator.
    const r = rng(2024);
    const vars = ['q', 'v', 'w'];
    for (let k = 0; k < 300; k++) {
      const ast = randomAst(r, vars, 5, false);
      const f = compileFormula(ast, vars);
      for (let j = 0; j < 5; j++) {
        const env = { q: (r() - 0.5) * 6, v: (r() - 0.5) * 6, w: r() * 3 };
        const want = evaluate(ast, env);
        const got = f.eval(Float64Array.of(env.q, env.v, env.w));
        if (Number.isNaN(want)) expect(Number.isNaN(got)).toBe(true);
        else if (!Number.isFinite(want)) expect(got).toBe(want);
        else expect(Math.abs(got - want)).toBeLessThanOrEqual(1e-12 * Math.max(1, Math.abs(want)));
      }
    }
  });

  it('does not modify the values array or the tree', () => {
    const ast = parseFormula('q^2 + v');
    const copy = JSON.stringify(ast);
    const x = Float64Array.of(3, 4);
    expect(compileFormula(ast, ['q', 'v']).eval(x)).toBe(13);
    expect([...x]).toEqual([3, 4]);
    expect(JSON.stringify(ast)).toBe(copy);
  });

  it('names the unknown name, its column and the allowed names', () => {
    try {
      compileFormula('q + k*w', ['q', 'v'], { constants: { k: 2 } });
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(FormulaError);
      expect((e as FormulaError).message).toBe('column 7: expected a known name (q, v, k, pi), found unknown name "w"');
    }
  });

  it('rejects bad variables and constants, naming the argument', () => {
    expect(() => compileFormula('q', ['q', 'q'])).toThrow('compileFormula: variables[1]: name "q" is listed twice');
    expect(() => compileFormula('q', ['sin'])).toThrow(/variables\[0\]: "sin" is reserved/);
    expect(() => compileFormula('q', ['pi'])).toThrow(/variables\[0\]: "pi" is reserved/);
    expect(() => compileFormula('q', ['1q'])).toThrow(/variables\[0\]: expected a name/);
    expect(() => compileFormula('q', ['q'], { constants: { g: NaN } })).toThrow('compileFormula: options.constants.g: expected a finite number, got NaN');
    expect(() => compileFormula('q', ['q'], { constants: { q: 1 } })).toThrow(/options.constants.q: name is also a variable/);
  });

  it('rejects malformed trees from outside the parser, naming the path', () => {
    const bad = [
      [{ kind: 'call', name: 'constructor', args: [] }, /ast|formula: expected a function name/],
      [{ kind: 'eval', arg: 1 }, /unknown node kind "eval"/],
      [{ kind: 'bin', op: '%', left: { kind: 'num', value: 1 }, right: { kind: 'num', value: 1 } }, /expected one of \+ - \* \/ \^/],
      [{ kind: 'neg', arg: { kind: 'num', value: '1' } }, /formula.arg: expected a number in field "value"/],
      [{ kind: 'call', name: 'sin', args: [] }, /sin takes 1 argument, got 0/],
      [null, /expected a formula tree node/],
      [Array.from({ length: 2500 }).reduce<unknown>((a) => ({ kind: 'neg', arg: a }), { kind: 'num', value: 1 }), /more than 2000 levels deep/],
    ] as const;
    for (const [ast, msg] of bad) expect(() => compileFormula(ast as unknown as Ast, ['q'])).toThrow(msg);
  });
});
