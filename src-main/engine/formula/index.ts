// The formula language: our own small, safe expression syntax for plant equations and learned
// energy functions. Grammar and whitelist: docs/formula-language.md.
export type { Ast, BinaryOp, BinNode, CallNode, ConstNode, ConstantName, FunctionName, NegNode, NumNode, VarNode } from './ast.ts';
export { FormulaError } from './error.ts';
export { FUNCTION_NAMES, isReservedName } from './functions.ts';
export { parseFormula, MAX_NESTING, MAX_TREE_DEPTH } from './parse.ts';
export { MAX_FORMULA_LENGTH } from './tokenize.ts';
export { compileFormula, type CompiledFormula, type CompileOptions } from './compile.ts';
export { differentiate, dependsOn } from './differentiate.ts';
export { formatFormula } from './format.ts';
export { energyFromFormula } from './energy-function.ts';
