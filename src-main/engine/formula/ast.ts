// The syntax tree of our formula language (grammar: docs/formula-language.md). Plain,
// JSON-serialisable data: no classes, no methods, so trees can be stored, sent and compared.

export type BinaryOp = '+' | '-' | '*' | '/' | '^';

export type FunctionName = 'sin' | 'cos' | 'tan' | 'exp' | 'log' | 'sqrt' | 'abs' | 'tanh' | 'sign' | 'min' | 'max';

export type ConstantName = 'pi';

/** A non-negative literal; negative values are written as a 'neg' node over a 'num'. */
export interface NumNode { kind: 'num'; value: number }
/** A named mathematical constant of the language (only pi). */
export interface ConstNode { kind: 'const'; name: ConstantName }
/** A variable (or parameter) name; column (1-based) where it appeared in the source, if parsed. */
export interface VarNode { kind: 'var'; name: string; column?: number }
/** Unary minus. */
export interface NegNode { kind: 'neg'; arg: Ast }
export interface BinNode { kind: 'bin'; op: BinaryOp; left: Ast; right: Ast }
/** A call of a whitelisted function (see functions.ts). */
export interface CallNode { kind: 'call'; name: FunctionName; args: Ast[] }

export type Ast = NumNode | ConstNode | VarNode | NegNode | BinNode | CallNode;
