// Shape check of a syntax tree handed in from outside the parser (a project file, a JSON model):
// every node must be one the parser could have produced. Throws TypeError naming the path.
import type { Ast } from './ast.ts';
import { CONSTANTS, FUNCTIONS } from './functions.ts';

const OPS = new Set(['+', '-', '*', '/', '^']);

export function checkAst(node: unknown, path = 'ast', depth = 0): asserts node is Ast {
  const bad = (what: string): never => { throw new TypeError(`${path}: ${what}`); };
  if (depth > 10_000) bad('formula tree nested too deeply');
  if (typeof node !== 'object' || node === null || Array.isArray(node)) bad('expected a formula tree node (an object)');
  const n = node as Record<string, unknown>;
  switch (n.kind) {
    case 'num':
      if (typeof n.value !== 'number') bad('expected a number in field "value"');
      return;
    case 'const':
      if (typeof n.name !== 'string' || !CONSTANTS.has(n.name)) bad(`expected a constant name (${[...CONSTANTS.keys()].join(', ')}) in field "name"`);
      return;
    case 'var':
      if (typeof n.name !== 'string') bad('expected a string in field "name"');
      if (n.column !== undefined && typeof n.column !== 'number') bad('expected a number in field "column"');
      return;
    case 'neg':
      checkAst(n.arg, `${path}.arg`, depth + 1);
      return;
    case 'bin':
      if (typeof n.op !== 'string' || !OPS.has(n.op)) bad('expected one of + - * / ^ in field "op"');
      checkAst(n.left, `${path}.left`, depth + 1);
      checkAst(n.right, `${path}.right`, depth + 1);
      return;
    case 'call': {
      const info = typeof n.name === 'string' ? FUNCTIONS.get(n.name) : undefined;
      if (!info) return bad(`expected a function name (${[...FUNCTIONS.keys()].join(', ')}) in field "name"`);
      if (!Array.isArray(n.args)) return bad('expected an array in field "args"');
      if (n.args.length < info.minArgs || n.args.length > info.maxArgs) bad(`${info.name} takes ${info.maxArgs === 1 ? '1 argument' : `${info.minArgs} or more arguments`}, got ${n.args.length}`);
      n.args.forEach((a, i) => checkAst(a, `${path}.args[${i}]`, depth + 1));
      return;
    }
    default:
      bad(`unknown node kind ${JSON.stringify(n.kind)} (expected num, const, var, neg, bin or call)`);
  }
}
