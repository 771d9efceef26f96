// A library term written by the user as a formula in q and v, compiled by our formula parser
// (src-main/engine/formula); its partial derivatives are symbolic (formula/differentiate.ts).
import { compileFormula, differentiate, parseFormula } from '../formula/index.ts';
import type { UserTerm } from './library.ts';

/** Parses and compiles `source`; throws the parser's error (naming the position) when it is not a formula in q, v. */
export function userTerm(source: string): UserTerm {
  const ast = parseFormula(source);
  const vars = ['q', 'v'] as const;
  const f = compileFormula(ast, vars);
  const fq = compileFormula(differentiate(ast, 'q'), vars);
  const fv = compileFormula(differentiate(ast, 'v'), vars);
  const x = new Float64Array(2);
  const at = (c: typeof f) => (q: number, v: number) => { x[0] = q; x[1] = v; return c.eval(x); };
  return { kind: 'user', source, f: at(f), dq: at(fq), dv: at(fv) };
}
