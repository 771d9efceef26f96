import { describe, expect, it } from 'vitest';
import { compileFormula, dependsOn, differentiate, formatFormula, parseFormula, type Ast } from '../../../src-main/engine/formula/index.ts';
import { randomAst, rng } from './helpers.ts';

/**
 * Checks d(ast)/d(name) against central differences (f(x+h) - f(x-h))/2h, whose error is
 * h^2 f'''/6 plus rounding ~eps |f|/h (common practice; e.g. Press et al., Numerical Recipes
 * §5.7, from memory). With h = 1e-5 (1 + |x|) both stay below ~1e-8 for the moderate values
 * used here, so the tolerance 1e-6 relative leaves a wide margin. Points where the difference
 * quotient itself is unsettled (h and h/2 disagree), i.e. near a singularity, are skipped and
 * counted.
 */
function checkDerivative(ast: Ast, vars: string[], name: string, points: Float64Array[]): { checked: number } {
  const f = compileFormula(ast, vars);
  const df = compileFormula(differentiate(ast, name), vars);
  const i = vars.indexOf(name);
  let checked = 0;
  for (const x0 of points) {
    const x = Float64Array.from(x0);
    const fd = (h: number): number => {
      x[i] = x0[i] + h; const fp = f.eval(x);
      x[i] = x0[i] - h; const fm = f.eval(x);
      x[i] = x0[i];
      return (fp - fm) / (2 * h);
    };
    const h = 1e-5 * (1 + Math.abs(x0[i]));
    const a = fd(h), b = fd(h / 2), exact = df.eval(x);
    const fx = f.eval(x);
    if (![a, b, exact, fx].every(Number.isFinite) || Math.abs(fx) > 1e6) continue;
    if (Math.abs(a - b) > 1e-7 * Math.max(1, Math.abs(a))) continue;
    expect(Math.abs(exact - b), `${formatFormula(ast)} at ${[...x0]}`).toBeLessThanOrEqual(1e-6 * Math.max(1, Math.abs(b)));
    checked++;
  }
  return { checked };
}

function randomPoints(r: () => number, n: number, dim: number, spread = 4): Float64Array[] {
  return Array.from({ length: n }, () => Float64Array.from({ length: dim }, () => (r() - 0.5) * spread));
}

describe('differentiate: against central finite differences', () => {
  it.each([
    'sin(q)', 'cos(2*q + v)', 'tan(q/3)', 'exp(-q^2)', 'log(1 + q^2)', 'sqrt(2 + sin(q))', 'abs(q)*v',
    'tanh(q*v)', 'sign(q)*q^2', 'min(q, v)', 'max(q, v^2, 1 - q)', 'min(q, 2*q, v, 0.5)',
    'q^v', '2^q', 'q^-3', 'q^2.5', '1/(1 + q^2)', 'q/v', '-(q - v)^3/(v + 3)', 'pi*q^2',
    'm*l^2*v^2/2 - m*g*l*cos(q)', 'a*q^2/2 - b*q^4/4 + v^2/2',
  ])('d/dq %s', (src) => {
    const ast = parseFormula(src);
    const vars = ['q', 'v', 'm', 'l', 'g', 'a', 'b'];
    // q^v, q^2.5 need q > 0: use positive q everywhere (shifted points).
    const r = rng(src.length * 101);
    const pts = randomPoints(r, 40, vars.length).map((p) => { p[0] = 0.2 + Math.abs(p[0]); p[1] = 0.3 + Math.abs(p[1]); return p; });
    const { checked } = checkDerivative(ast, vars, 'q', pts);
    expect(checked).toBeGreaterThanOrEqual(36);
    const { checked: cv } = checkDerivative(ast, vars, 'v', pts);
    expect(cv).toBeGreaterThanOrEqual(36);
  });

  it('matches finite differences on random smooth trees', () => {
    const r = rng(99);
    const vars = ['q', 'v'];
    let checked = 0, total = 0;
    for (let k = 0; k < 150; k++) {
      const ast = randomAst(r, vars, 4, true);
      const pts = randomPoints(r, 6, 2, 3);
      checked += checkDerivative(ast, vars, 'q', pts).checked;
      total += pts.length;
    }
    expect(checked).toBeGreaterThan(0.7 * total);
  });
});

describe('differentiate: simplification of trivial terms', () => {
  // Expected results by hand calculus.
  it.each([
    ['3*q', 'q', '3'],
    ['q^2', 'q', '2*q'],
    ['q^1 + 0*q', 'q', '1'],
    ['q + 0', 'q', '1'],
    ['1*q', 'q', '1'],
    ['v', 'q', '0'],
    ['sin(q)', 'q', 'cos(q)'],
    ['cos(q)', 'q', '-sin(q)'],
    ['sin(2*q)', 'q', '2*cos(2*q)'],
    ['q^3/3', 'q', 'q^2'],
    ['m*l^2*v^2/2 - m*g*l*cos(q)', 'q', 'm*g*l*sin(q)'],
    ['m*l^2*v^2/2 - m*g*l*cos(q)', 'v', 'm*l^2*v'],
    ['m*v^2/2 - m*a*q^2/2 + m*b*q^4/4', 'q', 'm*b*q^3 - m*a*q'],
    ['exp(k*q)', 'q', 'exp(k*q)*k'],
  ])('derivative of %s by %s is %s', (src, name, expected) => {
    expect(formatFormula(differentiate(parseFormula(src), name))).toBe(expected);
  });

  it('does not modify its input and reports dependence', () => {
    const ast = parseFormula('q^2*sin(v)');
    const before = JSON.stringify(ast);
    differentiate(ast, 'q');
    expect(JSON.stringify(ast)).toBe(before);
    expect(dependsOn(ast, 'v')).toBe(true);
    expect(dependsOn(ast, 'u')).toBe(false);
  });

  it('rejects a bad variable name', () => {
    expect(() => differentiate(parseFormula('q'), 'sin')).toThrow(/differentiate: name must be a variable name, got "sin"/);
    expect(() => differentiate({ kind: 'nope' } as unknown as Ast, 'q')).toThrow(/differentiate: ast: unknown node kind/);
  });
});
