// The fixed whitelist of functions and constants of the formula language. Lookups go through
// Map objects only, so names such as "constructor" or "__proto__" can never reach an object's
// prototype chain.
import type { ConstantName, FunctionName } from './ast.ts';

export interface FunctionInfo {
  readonly name: FunctionName;
  /** Fewest and most arguments accepted (min/max: 2..Infinity; the rest exactly 1). */
  readonly minArgs: number;
  readonly maxArgs: number;
  /** The one-argument implementation (min/max have none: they are compiled specially). */
  readonly unary?: (x: number) => number;
}

const list: FunctionInfo[] = [
  { name: 'sin', minArgs: 1, maxArgs: 1, unary: Math.sin },
  { name: 'cos', minArgs: 1, maxArgs: 1, unary: Math.cos },
  { name: 'tan', minArgs: 1, maxArgs: 1, unary: Math.tan },
  { name: 'exp', minArgs: 1, maxArgs: 1, unary: Math.exp },
  { name: 'log', minArgs: 1, maxArgs: 1, unary: Math.log },
  { name: 'sqrt', minArgs: 1, maxArgs: 1, unary: Math.sqrt },
  { name: 'abs', minArgs: 1, maxArgs: 1, unary: Math.abs },
  { name: 'tanh', minArgs: 1, maxArgs: 1, unary: Math.tanh },
  { name: 'sign', minArgs: 1, maxArgs: 1, unary: Math.sign },
  { name: 'min', minArgs: 2, maxArgs: Infinity },
  { name: 'max', minArgs: 2, maxArgs: Infinity },
];

export const FUNCTIONS: ReadonlyMap<string, FunctionInfo> = new Map(list.map((f) => [f.name, f]));

export const FUNCTION_NAMES: readonly FunctionName[] = list.map((f) => f.name);

export const CONSTANTS: ReadonlyMap<string, number> = new Map<ConstantName, number>([['pi', Math.PI]]);

/** Names a variable may not take: the functions and constants of the language. */
export function isReservedName(name: string): boolean {
  return FUNCTIONS.has(name) || CONSTANTS.has(name);
}

/** Syntax of a name: a letter or underscore, then letters, digits or underscores. */
export const NAME_PATTERN = /^[A-Za-z_][A-Za-z0-9_]*$/;
