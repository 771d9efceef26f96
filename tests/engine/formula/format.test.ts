import { describe, expect, it } from 'vitest';
import { differentiate, formatFormula, parseFormula, type Ast } from '../../../src-main/engine/formula/index.ts';
import { randomAst, rng, strip } from './helpers.ts';

describe('formatFormula', () => {
  it.each([
    ['((a)) + ((b*c))', 'a + b*c'],
    ['-q^2', '-q^2'],
    ['(-q)^2', '(-q)^2'],
    ['2^(3^2)', '2^3^2'],
    ['(2^3)^2', '(2^3)^2'],
    ['a - (b - c)', 'a - (b - c)'],
    ['(a - b) - c', 'a - b - c'],
    ['a/(b*c)', 'a/(b*c)'],
    ['(a*b)/c', 'a*b/c'],
    ['a*(b/c)', 'a*(b/c)'],
    ['-(a + b)', '-(a + b)'],
    ['--a', '-(-a)'],
    ['q^(-1)', 'q^-1'],
    ['sin(-q)  *  max( q,v ,1 )', 'sin(-q)*max(q, v, 1)'],
    ['.5 + 1e-7 + 1.5e21 + 0.1', '0.5 + 1e-7 + 1.5e+21 + 0.1'],
    ['m*l^2*v^2/2 - m*g*l*cos(q)', 'm*l^2*v^2/2 - m*g*l*cos(q)'],
  ])('%s prints as %s', (src, printed) => {
    expect(formatFormula(parseFormula(src))).toBe(printed);
  });

  it('round-trips random trees exactly through the parser', () => {
    const r = rng(5);
    for (let k = 0; k < 500; k++) {
      const ast = randomAst(r, ['q', 'v', 'x_1'], 6, false);
      expect(strip(parseFormula(formatFormula(ast)))).toEqual(ast);
    }
  });

  it('round-trips derivatives (which contain folded and negated numbers)', () => {
    const r = rng(6);
    for (let k = 0; k < 200; k++) {
      const d = differentiate(randomAst(r, ['q', 'v'], 4, false), 'q');
      expect(strip(parseFormula(formatFormula(d)))).toEqual(strip(d));
    }
  });

  it('refuses numbers it cannot print', () => {
    expect(() => formatFormula({ kind: 'num', value: Infinity } as Ast)).toThrow(/non-finite number Infinity/);
  });
});
