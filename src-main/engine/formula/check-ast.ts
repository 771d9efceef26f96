// Shape check of a syntax tree handed in from outside the parser (a project file, a JSON model):
// every node must be one the parser could have produced. Throws TypeError naming the path.
// Iterative (explicit stack), so long operator chains cannot overflow the call stack here.
import type { Ast } from './ast.ts';
import { CONSTANTS, FUNCTIONS } from './functions.ts';

const OPS = new Set(['+', '-', '*', '/', '^']);

/** Most distinct nodes accepted in one tree (a guard against pathological inputs). */
export const MAX_TREE_NODES = 1_000_000;

/**
 * Deepest tree accepted from outside the parser (measured along the first path that reaches
 * each shared node): room for derivatives of parsed trees (at most 500 deep), while keeping
 * the recursive walks of compile, differentiate and format clear of the call-stack limit.
 */
export const MAX_CHECKED_DEPTH = 2_000;

interface Item { node: unknown; parent: Item | undefined; step: string; depth: number }

/** The dotted path of an item, shortened in the middle when very deep. */
function pathOf(item: Item): string {
  const steps: string[] = [];
  for (let it: Item | undefined = item; it; it = it.parent) steps.push(it.step);
  steps.reverse();
  if (steps.length > 12) return `${steps.slice(0, 4).join('')}...(${steps.length - 10} more)...${steps.slice(-6).join('')}`;
  return steps.join('');
}

/**
 * Checks a tree node by node without recursion. Trees may share subtrees (differentiate
 * returns such trees); each distinct node is checked once.
 */
export function checkAst(root: unknown, rootPath = 'ast'): asserts root is Ast {
  const stack: Item[] = [{ node: root, parent: undefined, step: rootPath, depth: 1 }];
  const seen = new Set<unknown>();
  while (stack.length > 0) {
    const item = stack.pop() as Item;
    const node = item.node;
    const bad = (what: string): never => { throw new TypeError(`${pathOf(item)}: ${what}`); };
    if (typeof node !== 'object' || node === null || Array.isArray(node)) bad('expected a formula tree node (an object)');
    if (seen.has(node)) continue;
    seen.add(node);
    if (seen.size > MAX_TREE_NODES) bad(`formula tree has more than ${MAX_TREE_NODES} nodes`);
    if (item.depth > MAX_CHECKED_DEPTH) bad(`formula tree is more than ${MAX_CHECKED_DEPTH} levels deep`);
    const n = node as Record<string, unknown>;
    const push = (child: unknown, step: string): void => { stack.push({ node: child, parent: item, step, depth: item.depth + 1 }); };
    switch (n.kind) {
      case 'num':
        if (typeof n.value !== 'number') bad('expected a number in field "value"');
        break;
      case 'const':
        if (typeof n.name !== 'string' || !CONSTANTS.has(n.name)) bad(`expected a constant name (${[...CONSTANTS.keys()].join(', ')}) in field "name"`);
        break;
      case 'var':
        if (typeof n.name !== 'string') bad('expected a string in field "name"');
        if (n.column !== undefined && typeof n.column !== 'number') bad('expected a number in field "column"');
        break;
      case 'neg':
        push(n.arg, '.arg');
        break;
      case 'bin':
        if (typeof n.op !== 'string' || !OPS.has(n.op)) bad('expected one of + - * / ^ in field "op"');
        push(n.right, '.right');
        push(n.left, '.left');
        break;
      case 'call': {
        const info = typeof n.name === 'string' ? FUNCTIONS.get(n.name) : undefined;
        if (!info) return bad(`expected a function name (${[...FUNCTIONS.keys()].join(', ')}) in field "name"`);
        if (!Array.isArray(n.args)) return bad('expected an array in field "args"');
        if (n.args.length < info.minArgs || n.args.length > info.maxArgs) bad(`${info.name} takes ${info.maxArgs === 1 ? '1 argument' : `${info.minArgs} or more arguments`}, got ${n.args.length}`);
        for (let i = n.args.length - 1; i >= 0; i--) push(n.args[i], `.args[${i}]`);
        break;
      }
      default:
        bad(`unknown node kind ${JSON.stringify(n.kind)} (expected num, const, var, neg, bin or call)`);
    }
  }
}
